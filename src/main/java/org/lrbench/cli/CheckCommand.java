package org.lrbench.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.InstrumentLink;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanAdvice;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import org.lrbench.yaml.ProblemsException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench check PLAN}: validates a plan against a bench, the bench's addresses and its driver files. */
@Command(name = "check", mixinStandardHelpOptions = true, description = "Validate a plan, its bench and the bench's driver files; print every problem"
        + " as file:line:column: key: message.")
final class CheckCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Override
    public Integer call() throws Exception {
        BenchConfig b = benchOptions.load();
        DriverLoader loader = benchOptions.loader();
        List<Object> problems = new ArrayList<>();
        List<String> loaded = new ArrayList<>();
        Plan p = null;
        try {
            p = Inputs.plan(plan, b);
        } catch (ProblemsException e) {
            problems.addAll(e.problems());
        }
        DriverFile source = driver(loader, "generator", b.generator(), DriverKind.SOURCE, problems, loaded);
        DriverFile digitizer = driver(loader, "digitizer", b.digitizer(), DriverKind.DIGITIZER, problems, loaded);
        if (p != null && source != null && digitizer != null) {
            problems.addAll(PlanFit.problems(p, source, digitizer));
        }
        driver(loader, "switch", b.switchUnit(), DriverKind.SWITCH, problems, loaded);
        driver(loader, "meter", b.meter(), DriverKind.METER, problems, loaded);
        if (!problems.isEmpty()) {
            problems.forEach(System.err::println);
            return ExitCodes.BAD_INPUT;
        }
        System.out.printf("%s: ok, part number %s, %d frequencies from %s to %s, %d limits, bench %s%n",
                plan, p.partNumber(), p.sweep().frequenciesHz().size(),
                Units.format(p.sweep().lowestHz(), Dimension.FREQUENCY),
                Units.format(p.sweep().highestHz(), Dimension.FREQUENCY),
                p.limits().size(), b.name());
        System.out.println("drivers: " + String.join("; ", loaded));
        System.out.println("excitation: " + org.lrbench.rehearsal.ExcitationChoice.of(p, b, loader).described());
        for (String w : PlanAdvice.warnings(p)) {
            System.out.println("warning: " + plan + ": " + w);
        }
        return ExitCodes.PASS;
    }

    private static DriverFile driver(DriverLoader loader, String role, InstrumentLink link, DriverKind kind,
                                     List<Object> problems, List<String> loaded) {
        if (link == null) {
            return null;
        }
        try {
            DriverFile d = loader.load(link.driver(), kind, link.driverAt());
            loaded.add(role + " " + d.name() + " at " + link.address());
            return d;
        } catch (ProblemsException e) {
            problems.addAll(e.problems());
            return null;
        }
    }
}
