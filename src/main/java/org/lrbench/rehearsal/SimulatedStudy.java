package org.lrbench.rehearsal;

import java.util.List;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.Limit;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.study.GaugeStudy;
import org.lrbench.study.TypeOneStudy;

/**
 * Measurement system studies on the simulated bench: the crossed study with simulated parts,
 * benches as the appraisers (each calibrated once, as an operator would before the study) and
 * trials on fresh seeds; the type-1 study of one simulated reference part. The characteristic is
 * the plan's first inductance limit, its tolerance that limit's width.
 */
public final class SimulatedStudy {
    /**
     * The crossed study's readings draw their noise this many seeds apart (1009, a prime, so that
     * the part x trial grid never folds onto itself), each reading its own, as on a real bench.
     */
    static final long CROSSED_SEED_STEP = 1009L;
    /** The type-1 study's repeated readings of one reference: seeds 7 apart, each reading its own noise. */
    static final long TYPE_ONE_SEED_STEP = 7L;

    private SimulatedStudy() {
    }

    /** The crossed study's readings and analysis; which limit was studied and its tolerance. */
    public record Crossed(String limit, double[][][] readings, GaugeStudy.Result result) {
    }

    public static Crossed crossed(Plan plan, List<BenchConfig> benches, DriverLoader drivers, List<PartModel> parts,
                                  int trials) throws Exception {
        Limit limit = inductanceLimit(plan);
        double[][][] y = new double[parts.size()][benches.size()][trials];
        for (int j = 0; j < benches.size(); j++) {
            BenchConfig bench = benches.get(j);
            Calibration cal = calibrate(plan, bench, drivers, parts.get(0));
            for (int i = 0; i < parts.size(); i++) {
                for (int k = 0; k < trials; k++) {
                    long seed = bench.simulation().seed() + CROSSED_SEED_STEP * (i * trials + k + 1);
                    y[i][j][k] = reading(plan, bench.withSimulation(bench.simulation().withSeed(seed)), drivers,
                            parts.get(i), cal, limit);
                }
            }
        }
        return new Crossed(limit.name(), y, GaugeStudy.analyse(y, tolerance(limit)));
    }

    /** The type-1 study's readings in measuring order and its analysis. */
    public record TypeOne(double[] readings, TypeOneStudy.Result result) {
    }

    /** The type-1 study: {@code n} readings of {@code reference} on one bench, against its true value. */
    public static TypeOne typeOne(Plan plan, BenchConfig bench, DriverLoader drivers, PartModel reference,
                                  double trueValue, int n) throws Exception {
        Limit limit = inductanceLimit(plan);
        Calibration cal = calibrate(plan, bench, drivers, reference);
        double[] v = new double[n];
        for (int k = 0; k < n; k++) {
            v[k] = reading(plan, bench.withSimulation(bench.simulation().withSeed(bench.simulation().seed() + TYPE_ONE_SEED_STEP * (k + 1))),
                    drivers, reference, cal, limit);
        }
        return new TypeOne(v, TypeOneStudy.analyse(v, trueValue, tolerance(limit)));
    }

    static Limit inductanceLimit(Plan plan) {
        return plan.firstLimit(Characteristic.INDUCTANCE).orElseThrow(() -> new IllegalArgumentException(plan.source() + ": a study needs an inductance limit"));
    }

    /** The limit's width, or 0 for a one-sided limit (no %tolerance then). */
    static double tolerance(Limit l) {
        return Double.isFinite(l.lower()) && Double.isFinite(l.upper()) ? l.upper() - l.lower() : 0;
    }

    private static Calibration calibrate(Plan plan, BenchConfig bench, DriverLoader drivers, PartModel part)
            throws Exception {
        SimBench sim = new SimBench(bench.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(bench, drivers, sim)) {
            return CalibrationRun.calibrate(plan, inst, sim::setPosition, BenchClock.NONE);
        }
    }

    private static double reading(Plan plan, BenchConfig bench, DriverLoader drivers, PartModel part, Calibration cal,
                                  Limit limit) throws Exception {
        SimBench sim = new SimBench(bench.simulation(), plan.wiring(), part);
        PartResult r;
        try (BenchInstruments inst = BenchInstruments.open(bench, drivers, sim)) {
            r = PartRun.measure(new PartRun.Request(plan, "study", bench, "STUDY", "P", true, "study", cal), inst,
                    BenchClock.NONE, SweepListener.NONE);
        }
        if (r.error() != null) {
            throw new IllegalStateException("a study measurement ended in error: " + r.error());
        }
        return r.limits().stream().filter(l -> l.name().equals(limit.name())).findFirst().orElseThrow().value();
    }
}
