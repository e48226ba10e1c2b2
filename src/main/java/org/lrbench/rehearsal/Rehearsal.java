package org.lrbench.rehearsal;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.DecisionRule;
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
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import org.lrbench.yaml.ProblemsException;

/**
 * Rehearses a plan on the simulated bench before it meets parts: the bench is calibrated as it
 * would be, then simulated parts are measured at the nominal and just inside and just outside every
 * limit (a tenth of the half tolerance from a two-sided limit, 3 % of the bound from a one-sided
 * one), each with several seeds. Per limit it reports whether every verdict came out right, the
 * test uncertainty ratio (tolerance half-width over the expanded uncertainty), and warnings a plan
 * author can act on.
 */
public final class Rehearsal {
    /** Test uncertainty ratio below which a limit is flagged (the usual 4:1, common practice, no source). */
    static final double MIN_TUR = 4.0;

    private Rehearsal() {
    }

    /** The outcome of one limit. */
    public record LimitOutcome(String limit, int runs, int right, Double tur, List<String> wrong) {
    }

    /**
     * @param guarded each bound's U, test uncertainty ratio and guarded yield without and with the bench's
     *                corrections (see {@link GuardedYield})
     */
    public record Result(List<LimitOutcome> limits, List<String> warnings, List<GuardedYield.Bound> guarded) {

        public boolean allRight() {
            return limits.stream().allMatch(l -> l.right() == l.runs());
        }
    }

    public static Result rehearse(Plan plan, BenchConfig bench, DriverLoader drivers, int seeds) throws ProblemsException {
        PartModel nominal = nominal(plan);
        // calibrate the simulated bench as an operator would before a lot
        SimBench calBench = new SimBench(bench.simulation(), plan.wiring(), nominal);
        Calibration calibration;
        try (BenchInstruments inst = BenchInstruments.open(bench, drivers, calBench)) {
            calibration = CalibrationRun.calibrate(plan, inst, calBench::setPosition, BenchClock.NONE, bench.accuracy());
        }
        List<RehearsalCase> cases = cases(plan, nominal);
        Map<String, List<double[]>> uncertainty = new LinkedHashMap<>();
        Map<String, int[]> counts = new LinkedHashMap<>();
        Map<String, List<String>> wrong = new LinkedHashMap<>();
        List<String> warnings = new ArrayList<>();
        plan.limits().forEach(l -> {
            counts.put(l.name(), new int[2]);
            wrong.put(l.name(), new ArrayList<>());
            uncertainty.put(l.name(), new ArrayList<>());
        });
        double lowestPartVoltage = Double.POSITIVE_INFINITY;
        double lowestPartImpedance = Double.NaN;
        boolean resonanceInside = false;
        int seed = 0;
        for (RehearsalCase c : cases) {
            for (int s = 0; s < seeds; s++) {
                BenchConfig b = bench.nthDraw(++seed);
                SimBench sim = new SimBench(b.simulation(), plan.wiring(), c.part());
                PartResult r;
                try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
                    r = PartRun.measure(new PartRun.Request(plan, "rehearsal", b, "REHEARSAL", c.where().replace(' ', '-'),
                            true, "rehearsal", calibration), inst, BenchClock.NONE, SweepListener.NONE);
                }
                int[] n = counts.get(c.limit());
                n[0]++;
                var rec = r.limits().stream().filter(l -> l.name().equals(c.limit())).findFirst();
                boolean right = rec.isPresent() && rec.get().pass() == c.shouldPass();
                if (right) {
                    n[1]++;
                } else {
                    wrong.get(c.limit()).add(c.where() + " (" + (rec.isPresent() ? rec.get().reason() : r.error()) + ")");
                }
                rec.ifPresent(l -> {
                    if (l.expandedUncertainty() != null && l.expandedUncertainty() > 0) {
                        uncertainty.get(c.limit()).add(new double[] {l.expandedUncertainty()});
                    }
                });
                if (!r.points().isEmpty()) {
                    var low = r.points().get(0);
                    double v = low.currentPeakA() * Math.hypot(low.resistanceOhm(), low.reactanceOhm());
                    if (v < lowestPartVoltage) {
                        lowestPartVoltage = v;
                        lowestPartImpedance = Math.hypot(low.resistanceOhm(), low.reactanceOhm());
                    }
                }
                resonanceInside |= r.selfResonanceHz() != null;
            }
        }
        List<LimitOutcome> outcomes = new ArrayList<>();
        for (Limit l : plan.limits()) {
            double meanU = uncertainty.get(l.name()).stream().mapToDouble(a -> a[0]).average().orElse(Double.NaN);
            Double tur = Double.isFinite(meanU) ? halfWidth(l, nominal, plan) / meanU : null;
            outcomes.add(new LimitOutcome(l.name(), counts.get(l.name())[0], counts.get(l.name())[1], tur,
                    wrong.get(l.name())));
            if (tur != null && tur < MIN_TUR) {
                warnings.add(String.format(Locale.ROOT, "%s: the test uncertainty ratio is %.1f, under %.0f:1; the"
                        + " measurement is too uncertain for this tolerance (more cycles, a better sense resistor, or a"
                        + " calibrated bench)", l.name(), tur, MIN_TUR));
            }
            if (l.rule() == DecisionRule.GUARDED && tur != null && tur < 2) {
                warnings.add(l.name() + ": the guard band takes more than half the tolerance; guarded acceptance will"
                        + " reject most good parts");
            }
        }
        double noise = bench.simulation().noiseVoltRms();
        if (noise > 0 && lowestPartVoltage / noise < 20) {
            double ratio = lowestPartVoltage / noise;
            warnings.add(String.format(Locale.ROOT, "at the lowest frequency the part's voltage is %s peak, %s the"
                    + " digitizer noise: %s", Units.format(lowestPartVoltage, Dimension.VOLTAGE),
                    ratio < 1 ? "below" : String.format(Locale.ROOT, "only %.0f times", ratio),
                    limitingElement(plan, bench, lowestPartImpedance)));
        }
        if (resonanceInside) {
            warnings.add("the self-resonance lies inside the sweep: readings near it are not an inductor's");
        }
        List<GuardedYield.Bound> guarded = GuardedYield.measure(plan, bench, drivers, seeds, nominal, calibration, seed,
                l -> halfWidth(l, nominal, plan), (l, n, v) -> with(l, n, v, plan));
        return new Result(outcomes, warnings, guarded);
    }

    /**
     * What limits the part's voltage, named so the advice helps: the loop is the generator's EMF
     * behind its output impedance, the sense resistor and the part in series (circuit theory), so
     * the part's voltage is E |Z_part| / |R_source + R_sense + Z_part|. A smaller sense resistor helps
     * only when it is the largest of the three; otherwise the source impedance or the amplitude is
     * what to change.
     */
    static String limitingElement(Plan plan, BenchConfig bench, double partOhm) {
        double source = bench.simulation().sourceImpedanceOhm();
        double sense = plan.senseResistanceOhm();
        double amplitude = plan.sweep().amplitudeVolt();
        boolean atCeiling = plan.sweep().peakEmfVolt() >= bench.maxAmplitudeVolt() * 0.999;
        String raise = atCeiling ? "the amplitude is already at the bench's ceiling ("
                + Units.format(bench.maxAmplitudeVolt(), Dimension.VOLTAGE) + ")"
                : "raise the amplitude (the bench allows up to " + Units.format(bench.maxAmplitudeVolt(), Dimension.VOLTAGE) + ")";
        if (sense >= source && sense >= partOhm) {
            return "the sense resistor (" + Units.format(sense, Dimension.RESISTANCE) + ") is the largest impedance in the"
                    + " loop and limits the current: a smaller one raises the part's voltage; or " + raise;
        }
        if (source >= partOhm) {
            return "the generator's output impedance (" + Units.format(source, Dimension.RESISTANCE) + ") limits the"
                    + " current, so a smaller sense resistor changes little; " + raise + ", or drive the fixture"
                    + " from a lower-impedance source (a power amplifier)";
        }
        return "the part's own impedance (" + Units.format(partOhm, Dimension.RESISTANCE) + ") takes most of the drive"
                + " already; " + raise + ", or use a digitizer with more resolution or less noise";
    }

    /** The part the cases start from: every limit at its centre (one-sided: 15 % inside the bound). */
    static PartModel nominal(Plan plan) {
        double l = Double.NaN;
        double r = Double.NaN;
        for (Limit lim : plan.limits()) {
            if (lim.characteristic() == Characteristic.INDUCTANCE) {
                l = centre(lim);
            } else if (lim.characteristic() == Characteristic.SERIES_RESISTANCE) {
                r = centre(lim);
            }
        }
        if (Double.isNaN(l)) {
            throw new IllegalArgumentException(plan.source() + ": rehearsal needs an inductance limit to place parts");
        }
        if (Double.isNaN(r)) {
            r = 2 * Math.PI * plan.sweep().lowestHz() * l; // Q of 1 at the lowest frequency
        }
        return new PartModel(l, r, 0);
    }

    private static double centre(Limit l) {
        if (Double.isFinite(l.lower()) && Double.isFinite(l.upper())) {
            return 0.5 * (l.lower() + l.upper());
        }
        return Double.isFinite(l.upper()) ? 0.85 * l.upper() : 1.15 * l.lower();
    }

    private static double halfWidth(Limit l, PartModel nominal, Plan plan) {
        if (Double.isFinite(l.lower()) && Double.isFinite(l.upper())) {
            return 0.5 * (l.upper() - l.lower());
        }
        double bound = Double.isFinite(l.upper()) ? l.upper() : l.lower();
        return 0.15 * Math.abs(bound);
    }

    /** Parts at the nominal and just inside and outside every bound of every limit. */
    static List<RehearsalCase> cases(Plan plan, PartModel n) {
        List<RehearsalCase> out = new ArrayList<>();
        for (Limit l : plan.limits()) {
            out.add(new RehearsalCase(l.name(), "nominal", n, true));
            for (boolean upper : new boolean[] {false, true}) {
                double bound = upper ? l.upper() : l.lower();
                if (!Double.isFinite(bound)) {
                    continue;
                }
                double margin = Double.isFinite(l.lower()) && Double.isFinite(l.upper())
                        ? 0.1 * 0.5 * (l.upper() - l.lower()) : 0.03 * Math.abs(bound);
                double inside = upper ? bound - margin : bound + margin;
                double outside = upper ? bound + margin : bound - margin;
                String side = upper ? "above" : "below";
                out.add(new RehearsalCase(l.name(), "just inside, " + side.replace("above", "under the maximum")
                        .replace("below", "over the minimum"), with(l, n, inside, plan), true));
                out.add(new RehearsalCase(l.name(), "just outside, " + side, with(l, n, outside, plan), false));
            }
        }
        return out;
    }

    /** The nominal part moved so that this limit's characteristic reads {@code value}. */
    private static PartModel with(Limit l, PartModel n, double value, Plan plan) {
        return switch (l.characteristic()) {
            case INDUCTANCE -> new PartModel(value, n.seriesResistanceOhm(), 0);
            case SERIES_RESISTANCE -> new PartModel(n.inductanceHenry(), value, 0);
            case QUALITY_FACTOR -> new PartModel(n.inductanceHenry(),
                    2 * Math.PI * l.atFrequencyHz() * n.inductanceHenry() / value, 0);
            case SELF_RESONANCE -> new PartModel(n.inductanceHenry(), n.seriesResistanceOhm(),
                    1 / (Math.pow(2 * Math.PI * value, 2) * n.inductanceHenry()));
        };
    }
}
