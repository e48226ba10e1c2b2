package org.lrbench.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.rehearsal.ExcitationChoice;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transports;
import org.lrbench.yaml.ProblemsException;

/** Loading what commands share: the bench, the plan, and checks on names that become file names. */
final class Inputs {
    private static final String NAME = "[A-Za-z0-9][A-Za-z0-9._-]{0,63}";

    private Inputs() {
    }

    static BenchConfig bench(Path file) throws ProblemsException {
        requireFile(file, "bench file");
        return BenchLoader.load(file);
    }

    static Plan plan(Path file, BenchConfig bench) throws ProblemsException {
        requireFile(file, "plan");
        return PlanLoader.load(file, bench.maxAmplitudeVolt());
    }

    /**
     * The plan as it runs on this bench: where it leaves its excitation open, the one chosen for the
     * bench ({@link ExcitationChoice}), the choice and its reason printed.
     */
    static Plan excitation(Plan plan, BenchConfig bench, DriverLoader drivers) throws ProblemsException {
        return excitation(plan, bench, drivers, null);
    }

    /** As above, held to the corrections in force (see {@link ExcitationChoice#of(Plan, BenchConfig, DriverLoader,
     * org.lrbench.calibration.Calibration)}). */
    static Plan excitation(Plan plan, BenchConfig bench, DriverLoader drivers,
                           org.lrbench.calibration.Calibration corrections) throws ProblemsException {
        ExcitationChoice.Choice c = ExcitationChoice.of(plan, bench, drivers, corrections);
        if (c.said() != null) {
            System.out.println("excitation: " + c.said());
        }
        return c.plan();
    }

    /**
     * Refuses, before any instrument is touched, a plan that asks of the bench's generator or
     * digitizer more than their driver files declare.
     */
    static void requireFit(Plan plan, BenchConfig bench, DriverLoader drivers) throws ProblemsException {
        var problems = PlanFit.problems(plan, drivers, bench.generator().driver(), bench.digitizer().driver());
        if (!problems.isEmpty()) {
            throw new BadInputException(String.join("\n", problems));
        }
    }

    static void requireFile(Path file, String what) {
        if (!Files.isRegularFile(file)) {
            throw new BadInputException(what + " " + file + ": no such file");
        }
    }

    /** Lot numbers and serials name folders and files: letters, digits, '.', '_', '-' only. */
    static String name(String option, String value) {
        if (value == null || !value.matches(NAME)) {
            throw new BadInputException(option + " '" + value + "': use 1 to 64 letters, digits, '.', '_' or '-',"
                    + " starting with a letter or digit");
        }
        return value;
    }

    /** Parses an address option; null stays null. */
    static Address address(String option, String text) {
        if (text == null) {
            return null;
        }
        try {
            Address a = Address.parse(text);
            Transports.check(a);
            return a;
        } catch (AddressException e) {
            throw new BadInputException(option + ": " + e.getMessage());
        }
    }
}
