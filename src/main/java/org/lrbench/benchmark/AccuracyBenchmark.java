package org.lrbench.benchmark;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.InstrumentLink;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.run.BenchInstruments;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;

/**
 * Accuracy against the physical limit: the same part measured with many seeds on the simulated
 * bench (known truth, noise and 8-bit quantization on), bias and standard deviation of each point's
 * R and L, beside the Cramer-Rao lower bound.
 *
 * <p>The bound (derived; the standard result for a sine of known frequency in white Gaussian noise):
 * a channel of amplitude A sampled N times with noise variance s^2 has var(A)/A^2 = var(phi) =
 * 2 s^2 / (N A^2) at best. Z = Rs V2 / V1 moves by dZ/Z = dV2/V2 - dV1/V1, so each of Re and Im of
 * dZ/Z has variance e^2 = 2/N (s1^2/A1^2 + s2^2/A2^2), and var(R) = var(X) = |Z|^2 e^2,
 * var(L) = var(X) / w^2, with s the simulator's Gaussian noise. Quantization is not Gaussian white
 * noise: for a large sine most of its error power falls on harmonics the fit ignores, so it is
 * shown as a second, looser figure treating it as white noise of variance q^2 / 12 (q the step).
 */
public final class AccuracyBenchmark {

    private AccuracyBenchmark() {
    }

    /** The bench's converter, then an ideal one (Gaussian noise only, where the bound is the true limit). */
    public static void run(PrintStream out, BenchConfig bench, Path drivers, int repeats) throws Exception {
        SimSettings s = bench.simulation();
        int[] tally = new int[2];
        run(out, bench, drivers, repeats, new SimSettings(s.sourceImpedanceOhm(), s.noiseVoltRms(), s.resolutionBits(), 1),
                tally);
        // an ideal converter needs traces that are not re-quantized in transfer: the float driver
        BenchConfig floating = new BenchConfig(bench.source(), bench.name(), bench.maxAmplitudeVolt(), bench.generator(),
                new InstrumentLink("generic-digitizer-float", bench.digitizer().address()),
                bench.simulation(), bench.accuracy());
        run(out, floating, drivers, repeats, new SimSettings(s.sourceImpedanceOhm(), s.noiseVoltRms(), 0, 1), tally);
        out.println("  goal: efficiency CRLB/variance >= 0.8 and |bias| < 0.2 sigma");
        out.printf(Locale.ROOT, "goals met on %d of %d lines%s%n", tally[0], tally[1],
                tally[0] == tally[1] ? "" : " (the misses are marked MISS; with a quantizing converter the bound assumes white"
                        + " noise only, see above)");
    }


    /** One converter's figures; {@code tally} counts {goals met, lines}. */
    private static void run(PrintStream out, BenchConfig bench, Path drivers, int repeats, SimSettings base, int[] tally)
            throws Exception {
        double l = 1e-3;
        double r = 2.3;
        double rs = 100;
        Plan plan = PlanLoader.parse("""
                plan_format: 1
                part_number: ACCURACY
                fixture: {sense_resistor: 100 ohm}
                sine_sweep: {amplitude: 3 V, frequencies: [1 kHz, 10 kHz], cycles: 10, samples_per_cycle: 100,
                             settle: 0 s, model_terms: []}
                limits: [{characteristic: series_resistance, max: 10 ohm}]
                """, "accuracy-benchmark", bench.maxAmplitudeVolt());
        int nf = plan.sweep().frequenciesHz().size();
        double[][] sr = new double[nf][2];
        double[][] sl = new double[nf][2];
        double[] crlbR = new double[nf];
        double[] crlbL = new double[nf];
        double[] whiteR = new double[nf];
        DriverLoader loader = new DriverLoader(drivers);
        BenchConfig b = bench.withSimulation(base);
        for (int k = 0; k < repeats; k++) {
            SimBench sim = new SimBench(base.withSeed(1000 + k), rs, new PartModel(l, r, 0));
            List<PointResult> points;
            try (BenchInstruments inst = BenchInstruments.open(b, loader, sim)) {
                points = new SweepRunner(inst.generator(), inst.digitizer(), BenchClock.NONE).run(plan, SweepListener.NONE)
                        .points();
            }
            for (int i = 0; i < nf; i++) {
                PointResult p = points.get(i);
                double vr = p.impedance().resistanceOhm();
                double vl = p.impedance().inductanceHenry();
                sr[i][0] += vr;
                sr[i][1] += vr * vr;
                sl[i][0] += vl;
                sl[i][1] += vl * vl;
                double bound = crlbResistanceVariance(p, base, false);
                crlbR[i] += bound / repeats;
                crlbL[i] += bound / Math.pow(2 * Math.PI * p.impedance().frequencyHz(), 2) / repeats;
                whiteR[i] += crlbResistanceVariance(p, base, true) / bound / repeats;
            }
        }
        out.printf(Locale.ROOT, "accuracy on the simulated bench: 1 mH, 2.3 ohm behind 100 ohm, 3 V, %d seeds,"
                + " noise %.2g V, %s%n", repeats, base.noiseVoltRms(),
                base.resolutionBits() == 0 ? "ideal converter" : base.resolutionBits() + " bits");
        for (int i = 0; i < nf; i++) {
            double f = plan.sweep().frequenciesHz().get(i);
            for (boolean ok : new boolean[] {report(out, f, "R", r, sr[i], repeats, crlbR[i], "ohm"),
                report(out, f, "L", l, sl[i], repeats, crlbL[i], "H")}) {
                tally[0] += ok ? 1 : 0;
                tally[1]++;
            }
            if (base.resolutionBits() > 0) {
                out.printf(Locale.ROOT, "  %8.0f Hz: counting quantization as white noise would raise the bound's"
                        + " variance %.1fx%n", f, whiteR[i]);
            }
        }
    }

    private static boolean report(PrintStream out, double f, String name, double truth, double[] sums, int n, double crlb,
                                  String unit) {
        double mean = sums[0] / n;
        double var = (sums[1] - n * mean * mean) / (n - 1);
        double sd = Math.sqrt(var);
        double bias = mean - truth;
        boolean ok = crlb / var >= 0.8 && Math.abs(bias / sd) < 0.2;
        out.printf(Locale.ROOT, "  %8.0f Hz %s: bias %+.3e %s (%.2f sigma, +/- %.2f from the sample size), sd %.3e %s,"
                        + " CRLB sd %.3e, efficiency %.2f%s%n", f, name, bias, unit, bias / sd, 1 / Math.sqrt(n), sd, unit,
                Math.sqrt(crlb), crlb / var, ok ? "" : "   MISS");
        return ok;
    }

    static double crlbResistanceVariance(PointResult p, SimSettings s, boolean quantizationAsNoise) {
        int n = p.samples();
        double bits = quantizationAsNoise && s.resolutionBits() > 0 ? Math.pow(2, s.resolutionBits()) : Double.POSITIVE_INFINITY;
        double q1 = p.senseRangeVolt() / bits;
        double q2 = p.partRangeVolt() / bits;
        double s1 = s.noiseVoltRms() * s.noiseVoltRms() + q1 * q1 / 12;
        double s2 = s.noiseVoltRms() * s.noiseVoltRms() + q2 * q2 / 12;
        double a1 = p.senseFit().amplitude();
        double a2 = p.partFit().amplitude();
        double e2 = 2.0 / n * (s1 / (a1 * a1) + s2 / (a2 * a2));
        double z = p.impedance().impedanceOhm().abs();
        return z * z * e2;
    }
}
