package org.lrbench.rehearsal;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.SimTiming;

/**
 * Which excitation rehearse advises: the one {@code excitation: auto} would run on the bench, whatever the
 * plan gives and whatever this computer's load does to the wall times rehearse prints beside it (a choice
 * must not change with the machine's load; the rule that a speed figure counts only at an equal
 * uncertainty is the project owner's, common practice, no source). The choice itself is checked in
 * {@link ExcitationChoiceTests}.
 */
class PartTimeTests {
    private static final Path HOME = TestBench.home();

    @Test
    void theAdviceIsTheChoiceAutoMakesOnThisBench() throws Exception {
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench.yaml"));
        BenchConfig bench = b.withSimulation(b.simulation().withTiming(SimTiming.LAN));
        DriverLoader drivers = new DriverLoader(HOME.resolve("drivers"));
        // the demo plan gives its excitation (stepped): the advice is still the choice auto makes
        String text = java.nio.file.Files.readString(HOME.resolve("plans/qfd-ind-1m0.yaml"))
                .replace("  settle: 20 ms\n", "  settle: 20 ms\n  excitation: stepped\n");
        Plan plan = PlanLoader.parse(text, "plan.yaml", bench.maxAmplitudeVolt());
        PartTime.Estimate t = PartTime.of(plan, bench, drivers, true, null);
        var auto = ExcitationChoice.of(plan.withSweep(plan.sweep().withExcitationOpen()), bench, drivers);
        assertThat(t.advice()).isEqualTo(auto.said());
        // on lan, the multisine (usb's choice, stepped, is in ExcitationChoiceTests)
        assertThat(t.advice()).startsWith("multisine");
        assertThat(t.steppedSecond()).isPositive();
        assertThat(t.multisineSecond()).isPositive();
    }
}
