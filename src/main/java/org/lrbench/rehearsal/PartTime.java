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
 * lrbench's own processing included, with the plan's settles really waited; after an untimed part
 * of each, the least of {@link #TIMED_RUNS} alternated runs. The bench file's
 * timing profile is used, or {@code lan} where it sets none.
 */
public final class PartTime {

    private PartTime() {
    }

    /** The most a multisine's U may exceed the stepped sweep's for its speed to count. */
    public static final double EQUAL_ENOUGH = 1.5;

    /**
     * What was timed: the profile and the seconds per part stepped and as a multisine (NaN where it cannot),
     * per limit U (95 %) of each, stepped first, measured on the simulated bench calibrated for each; and the
     * advice, which is the choice {@code excitation: auto} makes on this bench ({@link ExcitationChoice}: from
     * the bench's physical times, not from these wall times, which change with the computer's load).
     */
    public record Estimate(SimTiming timing, double steppedSecond, double multisineSecond, String multisineRefused,
                           java.util.Map<String, double[]> expanded, String advice) {
    }

    /** Timed runs of each excitation, alternated; the least is kept (the run least disturbed by other work). */
    public static final int TIMED_RUNS = 3;

    public static Estimate of(Plan plan, BenchConfig bench, DriverLoader drivers, boolean multisinePossible,
                              String whyNot) throws Exception {
        String advice = ExcitationChoice.of(plan.withSweep(plan.sweep().withExcitationOpen()), bench, drivers).said();
        SimTiming timing = bench.simulation().timing().none() ? SimTiming.LAN : bench.simulation().timing();
        PartModel part = Rehearsal.nominal(plan);
        Plan stepped = plan.withSweep(plan.sweep().withMultisine(false));
        Plan multi = plan.withSweep(plan.sweep().withMultisine(true));
        // the first part in a process pays for loading and compiling: one untimed part of each first
        once(stepped, bench, drivers, part, SimTiming.NONE);
        if (multisinePossible) {
            once(multi, bench, drivers, part, SimTiming.NONE);
        }
        double a = Double.POSITIVE_INFINITY;
        double b = multisinePossible ? Double.POSITIVE_INFINITY : Double.NaN;
        for (int i = 0; i < TIMED_RUNS; i++) {
            a = Math.min(a, once(stepped, bench, drivers, part, timing));
            if (multisinePossible) {
                b = Math.min(b, once(multi, bench, drivers, part, timing));
            }
        }
        java.util.Map<String, double[]> expanded = new java.util.LinkedHashMap<>();
        if (multisinePossible) {
            // the same twins the advice was chosen on (measured once)
            ExcitationChoice.Twin[] twins = ExcitationChoice.twins(plan, bench, drivers);
            java.util.Map<String, Double> us = twins[0].expanded();
            java.util.Map<String, Double> um = twins[1].expanded();
            us.forEach((k, v) -> {
                if (um.containsKey(k)) {
                    expanded.put(k, new double[] {v, um.get(k)});
                }
            });
        }
        return new Estimate(timing, a, b, multisinePossible ? null : whyNot, expanded, advice);
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
