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

    /** The most a multisine's U may exceed the stepped sweep's for its speed to count. */
    public static final double EQUAL_ENOUGH = 1.5;

    /**
     * What was timed: the profile and the seconds per part stepped and as a multisine (NaN where it cannot),
     * and per limit U (95 %) of each, stepped first, measured on the simulated bench calibrated for each.
     */
    public record Estimate(SimTiming timing, double steppedSecond, double multisineSecond, String multisineRefused,
                           java.util.Map<String, double[]> expanded) {

        /** The limit whose U the multisine worsens most, with the factor (null without a multisine). */
        public java.util.Map.Entry<String, Double> worstRatio() {
            java.util.Map.Entry<String, Double> worst = null;
            for (var e : expanded.entrySet()) {
                double r = e.getValue()[1] / e.getValue()[0];
                if (worst == null || !(r <= worst.getValue())) {
                    worst = java.util.Map.entry(e.getKey(), r);
                }
            }
            return worst;
        }

        /** Which excitation to use, in words: the multisine only where it is faster at about the same U. */
        public String advice() {
            if (multisineRefused != null) {
                return "stepped (this bench cannot play the multisine)";
            }
            var worst = worstRatio();
            if (worst == null || !(worst.getValue() <= EQUAL_ENOUGH)) {
                return String.format(java.util.Locale.ROOT, "stepped: the multisine's U(%s) is %.1fx the stepped"
                        + " sweep's (its speed counts only within %.1fx)", worst == null ? "-" : worst.getKey(),
                        worst == null ? Double.NaN : worst.getValue(), EQUAL_ENOUGH);
            }
            return multisineSecond < steppedSecond ? String.format(java.util.Locale.ROOT, "multisine: %.1fx faster with"
                    + " every U within %.1fx of the stepped sweep's", steppedSecond / multisineSecond, EQUAL_ENOUGH)
                    : "stepped: the multisine is not faster on this bench";
        }
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
        java.util.Map<String, double[]> expanded = new java.util.LinkedHashMap<>();
        if (multisinePossible) {
            java.util.Map<String, Double> us = uncertainties(stepped, bench, drivers, part);
            java.util.Map<String, Double> um = uncertainties(multi, bench, drivers, part);
            us.forEach((k, v) -> {
                if (um.containsKey(k)) {
                    expanded.put(k, new double[] {v, um.get(k)});
                }
            });
        }
        return new Estimate(timing, a, b, multisinePossible ? null : whyNot, expanded);
    }

    /** U (95 %) per limit of one nominal part, on the simulated bench calibrated for this plan first. */
    static java.util.Map<String, Double> uncertainties(Plan plan, BenchConfig bench, DriverLoader drivers, PartModel part)
            throws Exception {
        return ExcitationChoice.Twin.measure(plan, bench, drivers, part).expanded();
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
