package org.lrbench.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import org.lrbench.units.Units;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.plan.Plan;
import org.lrbench.rehearsal.ExcitationChoice;
import org.lrbench.rehearsal.PartTime;
import org.lrbench.rehearsal.Rehearsal;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench rehearse PLAN}: proves on the simulated bench that a plan decides its limits right. */
@Command(name = "rehearse", mixinStandardHelpOptions = true, description = {"Prove on the simulated bench that a plan decides its limits right.",
        "Parts at the nominal and just inside and outside every limit, several seeds each;",
        "then one nominal part timed stepped and as a multisine, with instruments that take time.",
        "Exit 0 only when every verdict is right."})
final class RehearseCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Option(names = "--seeds", paramLabel = "N", defaultValue = "3", description = "seeds per part (default: ${DEFAULT-VALUE})")
    int seeds;

    /** One nominal part timed stepped and as a multisine on the simulated bench with instruments that take time. */
    private void timePerPart(Plan p, BenchConfig b) throws Exception {
        DriverLoader loader = benchOptions.loader();
        List<String> refused = PlanFit.problems(p.withSweep(p.sweep().withMultisine(true)),
                loader.load(b.generator().driver(), DriverKind.SOURCE), loader.load(b.digitizer().driver(), DriverKind.DIGITIZER));
        PartTime.Estimate t = PartTime.of(p, b, loader, refused.isEmpty(), String.join("; ", refused));
        // what this plan runs on this bench: its own excitation, or the one auto chooses
        boolean multisine = ExcitationChoice.of(p, b, loader).plan().sweep().multisine();
        System.out.printf(Locale.ROOT, "time per part, one nominal part on the simulated bench with '%s' timing%s"
                        + " (lrbench's processing and the plan's settles included; the least of %d runs on this"
                        + " computer):%n", t.timing().name(),
                b.simulation().timing().none() ? " (the bench file sets none)" : "", PartTime.TIMED_RUNS);
        System.out.printf(Locale.ROOT, "  stepped sweep    %6.0f ms  (%.0f parts per hour)%s%n", 1e3 * t.steppedSecond(),
                3600 / t.steppedSecond(), multisine ? "" : "  <- this plan");
        if (t.multisineRefused() == null) {
            System.out.printf(Locale.ROOT, "  one multisine    %6.0f ms  (%.0f parts per hour)%s%n", 1e3 * t.multisineSecond(),
                    3600 / t.multisineSecond(), multisine ? "  <- this plan" : "");
        } else {
            System.out.println("  one multisine    not on this bench: " + t.multisineRefused());
        }
        if (!t.expanded().isEmpty()) {
            System.out.println("U (95 %) of the nominal part, each excitation on the simulated bench calibrated for it:");
            t.expanded().forEach((limit, u) -> System.out.printf(Locale.ROOT, "  %-24s stepped %.4g, multisine %.4g (%.2fx)%n",
                    limit, u[0], u[1], u[1] / u[0]));
        }
        System.out.println("advice, as excitation: auto would choose on this bench: " + t.advice());
    }

    @Override
    public Integer call() throws Exception {
        if (seeds < 1 || seeds > 100) {
            throw new BadInputException("--seeds " + seeds + ": use 1 to 100");
        }
        BenchConfig b = benchOptions.load();
        Plan p = Inputs.plan(plan, b);
        Rehearsal.Result r;
        try {
            r = Rehearsal.rehearse(p, b, benchOptions.loader(), seeds);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        System.out.printf("rehearsal of %s on the simulated bench %s, %d %s per part%n", plan, b.name(), seeds,
                seeds == 1 ? "seed" : "seeds");
        System.out.printf("%-24s %8s %8s  %s%n", "limit", "right", "TUR", "wrong verdicts");
        for (Rehearsal.LimitOutcome o : r.limits()) {
            System.out.printf(Locale.ROOT, "%-24s %4d/%-3d %8s  %s%n", o.limit(), o.right(), o.runs(),
                    o.tur() == null ? "-" : String.format(Locale.ROOT, "%.1f", o.tur()), String.join("; ", o.wrong()));
        }
        r.warnings().forEach(w -> System.out.println("warning: " + w));
        if (!r.guarded().isEmpty()) {
            System.out.println("the bench's corrections at each bound (U of the nominal part; guarded yield: parts whose"
                    + " true value lies half the uncorrected U inside the bound, accepted only when read U inside it):");
            System.out.printf("%-24s %-8s %23s %15s %21s%n", "limit", "bound", "U without / with", "TUR", "guarded yield");
            for (var g : r.guarded()) {
                System.out.printf(Locale.ROOT, "%-24s %-8s %11s / %-9s %6.1f / %-6.1f %8d/%d -> %d/%d%n", g.limit(),
                        g.bound(), Units.format(g.uBefore(), g.dimension()), Units.format(g.uAfter(), g.dimension()),
                        g.turBefore(), g.turAfter(), g.acceptedBefore(), g.runs(), g.acceptedAfter(), g.runs());
            }
        }
        timePerPart(p, b);
        System.out.println(r.allRight() ? "every limit was decided right" : "some limits were decided wrong");
        return r.allRight() ? ExitCodes.PASS : ExitCodes.FAIL;
    }
}
