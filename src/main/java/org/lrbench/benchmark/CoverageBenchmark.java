package org.lrbench.benchmark;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.analysis.LumpedModel;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.plan.SineSweep;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SkinEffect;
import org.lrbench.uncertainty.BenchAccuracy;

/**
 * The coverage benchmark: does the expanded uncertainty U (95.45 %, its k from each budget's output distribution) of L, R, Q and the
 * self-resonance cover the truth as often as it promises? A matrix of simulated parts, each with
 * the plan an engineer would write for it, is calibrated and measured on independent seeds; per
 * part and quantity it prints the coverage (share of runs with |value - truth| <= U) and the bias
 * in standard deviations of the readings, and marks each miss of the goals: coverage between 93 %
 * and 99 % (U is meant to cover 95.45 %, as k = 2 does for a normal distribution, JCGM 100:2008 G.3), |bias|
 * under 0.3 sigma. The bench's type-B specifications are set to what the simulator varies: its
 * sense resistor and frequency are exact, its channel mismatch is what calibration measures.
 */
public final class CoverageBenchmark {

    record Case(String name, PartModel part, String plan) {
    }

    private CoverageBenchmark() {
    }

    static List<Case> cases() {
        return List.of(
                new Case("10 uH / 5 mohm", new PartModel(10e-6, 5e-3, 2e-12),
                        plan("1 ohm", "1 kHz", "100 kHz", "Q", "30 kHz", "")),
                new Case("100 uH / 50 mohm", new PartModel(100e-6, 50e-3, 5e-12),
                        plan("10 ohm", "500 Hz", "50 kHz", "Q", "10 kHz", "")),
                new Case("1 mH / 2.3 ohm / 15 pF", new PartModel(1e-3, 2.3, 15e-12),
                        plan("100 ohm", "200 Hz", "20 kHz", "Q", "10 kHz", "")),
                new Case("4.7 mH / 3 ohm, skin effect", new PartModel(4.7e-3, 3.0, 20e-12, 1.0e-3, 0),
                        plan("100 ohm", "200 Hz", "50 kHz", "Q", "20 kHz", "skin_effect")),
                new Case("10 mH / 12 ohm, core loss", new PartModel(10e-3, 12, 25e-12, 0, 200e3),
                        plan("1 kohm", "100 Hz", "20 kHz", "Q", "5 kHz", "parallel_loss")),
                new Case("22 mH / 20 ohm / 120 pF", new PartModel(22e-3, 20, 120e-12),
                        plan("1 kohm", "50 Hz", "100 kHz", "R", "", "")),
                new Case("100 mH / 50 ohm / 60 pF, resonance in sweep", new PartModel(100e-3, 50, 60e-12),
                        plan("1 kohm", "20 Hz", "100 kHz", "R", "", "")));
    }

    /** A plan for one part: a log sweep, and Q at a frequency or the self-resonance as the third limit. */
    private static String plan(String sense, String start, String stop, String third, String qAt, String term) {
        String limit3 = third.equals("Q")
                ? "  - {name: Q, characteristic: quality_factor, at: " + qAt + ", min: 1}\n"
                : "  - {name: resonance, characteristic: self_resonance, min: 1 kHz}\n";
        return "plan_format: 1\npart_number: COVERAGE\nfixture: {sense_resistor: " + sense + "}\n"
                + "sine_sweep:\n  amplitude: 3 V\n  log_sweep: {start: " + start + ", stop: " + stop + ", points: 11}\n"
                + "  cycles: 10\n  settle: 0 s\n" + (term.isEmpty() ? "" : "  model_terms: [parallel_capacitance, " + term + "]\n")
                + "limits:\n  - {name: L, characteristic: inductance, min: 1 nH}\n"
                + "  - {name: R, characteristic: series_resistance, min: 1 uohm}\n" + limit3;
    }

    public static int run(PrintStream out, BenchConfig bench, Path drivers, int seeds) throws Exception {
        return run(out, bench, drivers, seeds, false);
    }

    /**
     * @param benchErrors false: the simulated bench's sense resistor, meter and range stages are exact and
     *                    the specifications that cover them are 0; true: each seed is another bench, its
     *                    sense resistor off nominal within its 0.1 % tolerance, each channel's gain per
     *                    range stage within +/- 0.025 % (a quarter of the 0.1 % range match) and its meter
     *                    within its 0.015 % accuracy, all drawn uniformly; calibration traces the sense
     *                    resistor with that meter and links the ranges, and the specifications are those
     */
    public static int run(PrintStream out, BenchConfig bench, Path drivers, int seeds, boolean benchErrors)
            throws Exception {
        return run(out, bench, drivers, seeds, benchErrors, null);
    }

    /** Whether any part of the matrix is named by {@code parts}. */
    public static boolean names(List<String> parts) {
        return !cases(parts).isEmpty();
    }

    /** The matrix's parts whose name contains one of {@code parts} (all for null). */
    static List<Case> cases(List<String> parts) {
        return parts == null ? cases() : cases().stream()
                .filter(c -> parts.stream().anyMatch(p -> c.name().contains(p.trim()))).toList();
    }

    /** As above, on the parts {@code parts} names (null: the whole matrix). */
    public static int run(PrintStream out, BenchConfig bench, Path drivers, int seeds, boolean benchErrors,
                          List<String> parts) throws Exception {
        return run(out, bench, drivers, seeds, benchErrors, parts, false);
    }

    /** As above, every plan swept as one multisine when {@code multisine} (a part whose sweep cannot be one is named). */
    public static int run(PrintStream out, BenchConfig bench, Path drivers, int seeds, boolean benchErrors,
                          List<String> parts, boolean multisine) throws Exception {
        return run(out, bench, drivers, seeds, benchErrors, parts, multisine, FIRST_SEED);
    }

    /** Seed of the first run's calibration: each run takes two, {@code first + 2 s} and the next. */
    public static final long FIRST_SEED = 1000;

    /**
     * As above from another set of seeds ({@code firstSeed}, +2, +4, ...): every part draws the same noise
     * from a given set, so one set's luck shows in every part at once; another set tells luck from the budget.
     */
    public static int run(PrintStream out, BenchConfig bench, Path drivers, int seeds, boolean benchErrors,
                          List<String> parts, boolean multisine, long firstSeed) throws Exception {
        BenchAccuracy accuracy = benchErrors
                ? new BenchAccuracy(SENSE_TOLERANCE, 0, 0, 0, RANGE_MATCH, Double.POSITIVE_INFINITY, null, null,
                        METER_ACCURACY, 0)
                : new BenchAccuracy(0, 0, 0, 0);
        // with bench errors off, none of the bench file's drawn errors stays (the specifications that would
        // cover them are 0 here): its sense resistor, range stages and meter are exact
        var sim = benchErrors ? bench.simulation()
                : bench.simulation().withSenseError(0).withRangeGainSpread(0).withMeterError(0);
        BenchConfig b = new BenchConfig(bench.source(), bench.name(), bench.maxAmplitudeVolt(), bench.generator(),
                bench.digitizer(), null, benchErrors ? bench.meter() : null, sim, accuracy);
        if (benchErrors && b.meter() == null) {
            throw new IllegalArgumentException("the bench file declares no meter: the sense resistor cannot be traced");
        }
        DriverLoader loader = new DriverLoader(drivers);
        out.printf(Locale.ROOT, "coverage of U (95.45 %%, k from each budget's distribution) over %d seeds per part (goals: 93 %% to 99 %%, |bias| < 0.3 sigma);"
                + " calibration and measurement on independent seeds; %s%n", seeds, benchErrors
                ? "each seed another bench: sense resistor (0.1 %), range stages (0.025 % per channel), meter (0.015 %)"
                + " drawn within their specifications"
                : "bench errors off (sense resistor, range stages and meter exact)");
        out.printf(Locale.ROOT, "excitation: %s; seeds %d, %d, ... (the same for every part)%n",
                multisine ? "one multisine (every plan's sweep at once)" : "stepped", firstSeed, firstSeed + 2);
        out.printf(Locale.ROOT, "%-44s %-10s %9s %15s %9s %6s %5s %8s%n", "part", "quantity", "coverage", "95 % interval",
                "bias/sd", "sd/u", "k", "errors");
        int misses = 0;
        // per quantity over every part: runs covered, runs (a pooled figure far tighter than one pair's)
        Map<String, long[]> pooled = new LinkedHashMap<>();
        int pairs = 0;
        for (Case c : cases(parts)) {
            Plan stepped = PlanLoader.parse(c.plan(), "coverage.yaml", b.maxAmplitudeVolt());
            // a multisine that needs more waveform samples than the generator holds: its tolerance widened
            Plan plan = multisine ? ThroughputBenchmark.fitted(stepped.withSweep(stepped.sweep().withMultisine(true)))
                    : stepped;
            double[] truth = {c.part().seriesResistanceOhm(), c.part().inductanceHenry(), c.part().parallelCapacitanceFarad(),
                c.part().wireDiameterMetre() > 0 ? SkinEffect.coefficient(c.part().wireDiameterMetre()) : 0,
                c.part().parallelResistanceOhm() > 0 ? 1 / c.part().parallelResistanceOhm() : 0};
            Map<String, List<double[]>> readings = new LinkedHashMap<>();
            int errors = 0;
            String impossible = null;
            for (int s = 0; s < seeds && impossible == null; s++) {
                PartResult r;
                try {
                    r = once(b, plan, c.part(), loader, firstSeed + 2L * s);
                } catch (IllegalArgumentException e) {
                    impossible = e.getMessage(); // a sweep no multisine of this generator holds
                    break;
                }
                if (r.error() != null) {
                    errors++;
                    continue;
                }
                for (Map.Entry<String, PartResult.BudgetRecord> e : r.budgets().entrySet()) {
                    if (e.getKey().equals("inductance") || e.getKey().equals("series_resistance_dc")) {
                        continue;
                    }
                    readings.computeIfAbsent(e.getKey(), k -> new ArrayList<>())
                            .add(new double[] {e.getValue().value(), e.getValue().expandedUncertainty(),
                                    e.getValue().standardUncertainty(), e.getValue().coverageFactor()});
                }
            }
            for (Map.Entry<String, List<double[]>> e : readings.entrySet()) {
                double t = truth(e.getKey(), plan, truth);
                List<double[]> v = e.getValue();
                long covered = v.stream().filter(x -> Math.abs(x[0] - t) <= x[1]).count();
                double mean = v.stream().mapToDouble(x -> x[0]).average().orElse(Double.NaN);
                double sd = Math.sqrt(v.stream().mapToDouble(x -> (x[0] - mean) * (x[0] - mean)).sum() / Math.max(1, v.size() - 1));
                double coverage = 100.0 * covered / v.size();
                double bias = sd > 0 ? (mean - t) / sd : Double.NaN;
                // the readings' scatter over the budget's own u (root mean square): near 1 when the budget
                // claims what the bench does; the bench errors drawn per seed are part of the scatter
                double rmsU = Math.sqrt(v.stream().mapToDouble(x -> x[2] * x[2]).average().orElse(Double.NaN));
                boolean miss = coverage < 93 || coverage > 99 || !(Math.abs(bias) < 0.3);
                misses += miss ? 1 : 0;
                pairs++;
                long[] pool = pooled.computeIfAbsent(e.getKey(), k -> new long[2]);
                pool[0] += covered;
                pool[1] += v.size();
                double[] wilson = wilson(covered, v.size());
                double k = v.stream().mapToDouble(x -> x[3]).average().orElse(Double.NaN);
                out.printf(Locale.ROOT, "%-44s %-10s %8.1f%% %6.1f-%5.1f %% %+9.2f %6.2f %5.2f %8d%s%n", c.name(),
                        e.getKey(), coverage, wilson[0], wilson[1], bias, sd / rmsU, k, errors, miss ? "   MISS" : "");
            }
            if (multisine && plan.sweep().multisineTolerance() != SineSweep.DEFAULT_MULTISINE_TOLERANCE) {
                out.printf(Locale.ROOT, "%-44s (multisine_tolerance widened to %.0f %% to fit the generator)%n", c.name(),
                        100 * plan.sweep().multisineTolerance());
            }
            if (impossible != null) {
                misses++;
                out.printf(Locale.ROOT, "%-44s not measurable this way: %s   MISS%n", c.name(), impossible);
            } else if (readings.isEmpty()) {
                misses++;
                out.printf(Locale.ROOT, "%-44s every run ended in error   MISS%n", c.name());
            }
        }
        for (Map.Entry<String, long[]> e : pooled.entrySet()) {
            double[] w = wilson(e.getValue()[0], (int) e.getValue()[1]);
            double share = 100.0 * e.getValue()[0] / e.getValue()[1];
            // the pooled share is held to the same band (a goal of its own, on far more runs than one pair)
            boolean miss = share < 93 || share > 99;
            misses += miss ? 1 : 0;
            out.printf(Locale.ROOT, "pooled over the parts: %-10s %6.1f%% of %d runs (95 %% interval %.1f-%.1f %%)%s%n",
                    e.getKey(), share, e.getValue()[1], w[0], w[1], miss ? "   MISS" : "");
        }
        out.printf(Locale.ROOT, "were every pair's true coverage 95.45 %%, all %d pairs would land in 93-99 %% with %d seeds"
                + " with probability %.2f (binomial): one pair outside the band alone does not show U wrong%n", pairs, seeds,
                Math.pow(inBand(0.9545, seeds), pairs));
        out.printf(Locale.ROOT, "the interval is where the true coverage lies (Wilson score, 95 %%); the bias is known to"
                + " +/- %.2f sigma (one standard error over %d seeds); sd/u is the readings' scatter over their root-mean-square"
                + " standard uncertainty; k the mean coverage factor%n", 1 / Math.sqrt(seeds), seeds);
        out.println(misses == 0 ? "every goal met" : misses + " figure(s) miss a goal (marked MISS)");
        return misses;
    }

    /** The probability that a binomial share of {@code n} runs with true coverage {@code p} lies in 93 % to 99 %. */
    static double inBand(double p, int n) {
        double sum = 0;
        for (int k = 0; k <= n; k++) {
            double share = (double) k / n;
            if (share >= 0.93 - 1e-12 && share <= 0.99 + 1e-12) {
                sum += Math.exp(logChoose(n, k) + k * Math.log(p) + (n - k) * Math.log1p(-p));
            }
        }
        return sum;
    }

    private static double logChoose(int n, int k) {
        double s = 0;
        for (int i = 1; i <= k; i++) {
            s += Math.log(n - k + i) - Math.log(i);
        }
        return s;
    }

    /** The Wilson score interval for a proportion, 95 % (Wilson, JASA 22, 1927), in percent. */
    static double[] wilson(long hits, int n) {
        double z = 1.959964;
        double p = (double) hits / n;
        double centre = (p + z * z / (2 * n)) / (1 + z * z / n);
        double half = z / (1 + z * z / n) * Math.sqrt(p * (1 - p) / n + z * z / (4.0 * n * n));
        return new double[] {100 * (centre - half), 100 * (centre + half)};
    }

    private static double truth(String quantity, Plan plan, double[] p) {
        for (var l : plan.limits()) {
            if (l.name().equals(quantity)) {
                return switch (l.characteristic()) {
                    case INDUCTANCE -> l.atFrequencyHz() == null ? LumpedParameter.L.in(p) : LumpedModel.apparentInductance(p, l.atFrequencyHz());
                    case SERIES_RESISTANCE -> LumpedParameter.R_DC.in(p);
                    case QUALITY_FACTOR -> {
                        var z = LumpedModel.impedance(p, l.atFrequencyHz());
                        yield z.getImaginary() / z.getReal();
                    }
                    case SELF_RESONANCE -> LumpedModel.selfResonanceHz(LumpedParameter.L.in(p), LumpedParameter.C_P.in(p));
                };
            }
        }
        throw new IllegalArgumentException(quantity);
    }

    static final double SENSE_TOLERANCE = 0.001;
    static final double RANGE_MATCH = 0.001;
    static final double METER_ACCURACY = 0.00015;

    /** The bench of one seed: with bench errors, its own, drawn uniformly within the specifications. */
    static BenchConfig benchOf(BenchConfig b, long seed) {
        if (b.meter() == null) {
            return b;
        }
        java.util.Random r = new java.util.Random(seed * 7919L + 17);
        return b.withSimulation(b.simulation().withSenseError(SENSE_TOLERANCE * (2 * r.nextDouble() - 1))
                .withMeterError(METER_ACCURACY * (2 * r.nextDouble() - 1)).withRangeGainSpread(RANGE_MATCH / 4)
                .withErrorSeed(seed));
    }

    static PartResult once(BenchConfig bench, Plan plan, PartModel part, DriverLoader loader, long seed)
            throws Exception {
        BenchConfig b = benchOf(bench, seed);
        BenchConfig cal = b.withSimulation(b.simulation().withSeed(seed));
        SimBench calBench = new SimBench(cal.simulation(), plan.wiring(), part);
        Calibration corrections;
        try (BenchInstruments inst = BenchInstruments.open(cal, loader, calBench)) {
            corrections = CalibrationRun.calibrate(plan, inst, calBench::setPosition, BenchClock.NONE, cal.accuracy());
        }
        BenchConfig meas = b.withSimulation(b.simulation().withSeed(seed + 1));
        SimBench sim = new SimBench(meas.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(meas, loader, sim)) {
            return PartRun.measure(new PartRun.Request(plan, "0", meas, "COV", "S" + seed, true, "benchmark", corrections),
                    inst, BenchClock.NONE, SweepListener.NONE);
        }
    }
}
