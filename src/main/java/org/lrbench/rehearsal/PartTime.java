package org.lrbench.rehearsal;

import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimTiming;

/**
 * The time a plan takes per part: one nominal part measured on the simulated bench whose
 * instruments take time ({@link SimTiming}), wall time from the first command to the verdict,
 * lrbench's own processing included, with the plan's settles really waited. The bench file's
 * timing profile is used, or {@code lan} where it sets none.
 */
public final class PartTime {

    private PartTime() {
    }

    /** What was timed: the profile and the seconds per part stepped and as a multisine (NaN where it cannot). */
    public record Estimate(SimTiming timing, double steppedSecond, double multisineSecond, String multisineRefused) {
    }

    public static Estimate of(Plan plan, BenchConfig bench, DriverLoader drivers, boolean multisinePossible,
                              String whyNot) throws Exception {
        SimTiming timing = bench.simulation().timing().none() ? SimTiming.LAN : bench.simulation().timing();
        PartModel part = Rehearsal.nominal(plan);
        Plan stepped = plan.withSweep(plan.sweep().withMultisine(false));
        Plan multi = plan.withSweep(plan.sweep().withMultisine(true));
        // the first part in a process pays for loading and compiling: one untimed part of each first
        once(stepped, bench, drivers, part, SimTiming.NONE);
        if (multisinePossible) {
            once(multi, bench, drivers, part, SimTiming.NONE);
        }
        double a = once(stepped, bench, drivers, part, timing);
        double b = multisinePossible ? once(multi, bench, drivers, part, timing) : Double.NaN;
        return new Estimate(timing, a, b, multisinePossible ? null : whyNot);
    }

    /** Seconds for one part of {@code plan} on the simulated bench with {@code timing}. */
    static double once(Plan plan, BenchConfig bench, DriverLoader drivers, PartModel part, SimTiming timing)
            throws Exception {
        BenchConfig b = bench.withSimulation(bench.simulation().withTiming(timing));
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            long t0 = System.nanoTime();
            PartRun.measure(new PartRun.Request(plan, "rehearsal", b, "REHEARSAL", "TIMING", true, "rehearsal"), inst,
                    BenchClock.REAL, SweepListener.NONE);
            return (System.nanoTime() - t0) / 1e9;
        }
    }
}
