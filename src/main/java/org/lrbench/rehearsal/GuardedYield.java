package org.lrbench.rehearsal;

import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Limit;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * What the bench's corrections are worth at each limit, measured on the simulated bench without and
 * with them: the expanded uncertainty U of the nominal part and the test uncertainty ratio it gives,
 * and the guarded yield, the share of good parts accepted under guarded acceptance (a reading is
 * accepted only when it lies U inside the limit, ISO 14253-1, from memory) for a part whose true value
 * lies half the uncorrected U inside each bound: where U is large, most such parts are rejected.
 */
public final class GuardedYield {

    /** One bound of one limit, before (no corrections) and after (the bench's corrections). */
    public record Bound(String limit, String bound, org.lrbench.units.Dimension dimension, double uBefore, double uAfter, double turBefore, double turAfter,
                 int runs, int acceptedBefore, int acceptedAfter) {
    }

    private GuardedYield() {
    }

    static List<Bound> measure(Plan plan, BenchConfig bench, DriverLoader drivers, int seeds, PartModel nominal,
                               Calibration calibration, long firstSeed, Function<Limit, Double> halfWidth,
                               PartPlacer placer) throws org.lrbench.yaml.ProblemsException {
        List<Bound> out = new ArrayList<>();
        long seed = firstSeed;
        for (Limit l : plan.limits()) {
            double before = 0;
            double after = 0;
            for (int s = 0; s < seeds; s++) {
                before += expanded(run(plan, bench.nthDraw(++seed), drivers, nominal, Calibration.NONE), l);
                after += expanded(run(plan, bench.nthDraw(++seed), drivers, nominal, calibration), l);
            }
            double uBefore = before / seeds;
            double uAfter = after / seeds;
            if (!(uBefore > 0) || !(uAfter > 0)) {
                continue;
            }
            for (boolean upper : new boolean[] {false, true}) {
                double bound = upper ? l.upper() : l.lower();
                if (!Double.isFinite(bound)) {
                    continue;
                }
                double truth = upper ? bound - uBefore / 2 : bound + uBefore / 2;
                PartModel part = placer.place(l, nominal, truth);
                int a = 0;
                int b = 0;
                for (int s = 0; s < seeds; s++) {
                    a += accepted(run(plan, bench.nthDraw(++seed), drivers, part, Calibration.NONE), l, upper) ? 1 : 0;
                    b += accepted(run(plan, bench.nthDraw(++seed), drivers, part, calibration), l, upper) ? 1 : 0;
                }
                double hw = halfWidth.apply(l);
                out.add(new Bound(l.name(), upper ? "maximum" : "minimum", l.characteristic().dimension(), uBefore, uAfter, hw / uBefore, hw / uAfter,
                        seeds, a, b));
            }
        }
        return out;
    }

    /** Where a limit's characteristic reads a value: the nominal part moved to it. */
    interface PartPlacer {
        PartModel place(Limit l, PartModel nominal, double value);
    }

    private static PartResult run(Plan plan, BenchConfig b, DriverLoader drivers, PartModel part, Calibration c)
            throws org.lrbench.yaml.ProblemsException {
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            return PartRun.measure(new PartRun.Request(plan, "rehearsal", b, "REHEARSAL", "GUARD", true, "rehearsal", c),
                    inst, BenchClock.NONE, SweepListener.NONE);
        }
    }

    private static double expanded(PartResult r, Limit l) {
        return r.limits().stream().filter(x -> x.name().equals(l.name()) && x.expandedUncertainty() != null)
                .mapToDouble(PartResult.LimitRecord::expandedUncertainty).findFirst().orElse(Double.NaN);
    }

    /** Guarded acceptance at one bound: the reading at least its U inside it. */
    private static boolean accepted(PartResult r, Limit l, boolean upper) {
        return r.limits().stream().filter(x -> x.name().equals(l.name()) && x.value() != null
                        && x.expandedUncertainty() != null)
                .anyMatch(x -> upper ? x.value() + x.expandedUncertainty() <= l.upper()
                        : x.value() - x.expandedUncertainty() >= l.lower());
    }
}
