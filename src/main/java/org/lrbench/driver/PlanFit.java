package org.lrbench.driver;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanPositions;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Whether a plan asks of the bench's instruments no more than their drivers declare: every sweep
 * and triangle frequency within the generator's range, the peak EMF within its amplitude, and the
 * sample interval and record length each frequency needs within the digitizer's; for a multisine,
 * the generator's arbitrary-waveform commands and memory and the one record it needs.
 */
public final class PlanFit {

    private PlanFit() {
    }

    /** "10.00 GHz" for one frequency, "3 of the 7 sweep frequencies (27.14 MHz to 10.00 GHz)" for several. */
    private static String count(List<Double> missing, List<Double> all) {
        if (missing.size() == 1) {
            return "the sweep frequency " + hz(missing.get(0)) + " is";
        }
        double lo = missing.stream().mapToDouble(Double::doubleValue).min().orElseThrow();
        double hi = missing.stream().mapToDouble(Double::doubleValue).max().orElseThrow();
        return missing.size() + " of the " + all.size() + " sweep frequencies (" + hz(lo) + " to " + hz(hi) + ") are";
    }

    /** The problems of a plan on the generator and digitizer these driver names load (each loaded once). */
    public static List<String> problems(Plan plan, DriverLoader drivers, String generatorDriver, String digitizerDriver)
            throws org.lrbench.yaml.ProblemsException {
        return problems(plan, drivers.load(generatorDriver, DriverKind.SOURCE),
                drivers.load(digitizerDriver, DriverKind.DIGITIZER));
    }

    /** One sentence per thing the plan asks that a driver says its instrument cannot do. */
    public static List<String> problems(Plan plan, DriverFile source, DriverFile digitizer) {
        List<String> out = new ArrayList<>();
        InstrumentLimits g = source.limits();
        List<double[]> asks = new ArrayList<>();   // {frequency, cycles, samples per cycle}
        for (double f : plan.sweep().frequenciesHz()) {
            asks.add(new double[] {f, plan.sweep().cycles(), plan.sweep().samplesPerCycle()});
        }
        if (plan.triangle() != null) {
            asks.add(new double[] {plan.triangle().frequencyHz(), plan.triangle().cycles(), plan.triangle().samplesPerCycle()});
        }
        String gen = "generator driver " + source.name() + " (" + source.source() + ")";
        String dig = "digitizer driver " + digitizer.name() + " (" + digitizer.source() + ")";
        // each limit once, at the key the frequencies came from, however many generated frequencies miss it
        List<Double> sweep = plan.sweep().frequenciesHz();
        if (g.minFrequencyHz() != null) {
            List<Double> low = sweep.stream().filter(f -> f < g.minFrequencyHz()).toList();
            if (!low.isEmpty()) {
                out.add(PlanPositions.of(plan.source(), "sine_sweep.log_sweep.start", "sine_sweep.frequencies") + ": "
                        + count(low, sweep) + " below the " + hz(g.minFrequencyHz()) + " that the " + gen + " declares");
            }
            if (plan.triangle() != null && plan.triangle().frequencyHz() < g.minFrequencyHz()) {
                out.add(PlanPositions.of(plan.source(), "triangle_check.frequency") + ": " + hz(plan.triangle().frequencyHz())
                        + " is below the " + hz(g.minFrequencyHz()) + " that the " + gen + " declares");
            }
        }
        if (g.maxFrequencyHz() != null) {
            List<Double> high = sweep.stream().filter(f -> f > g.maxFrequencyHz()).toList();
            if (!high.isEmpty()) {
                out.add(PlanPositions.of(plan.source(), "sine_sweep.log_sweep.stop", "sine_sweep.frequencies") + ": "
                        + count(high, sweep) + " above the " + hz(g.maxFrequencyHz()) + " that the " + gen + " declares");
            }
            if (plan.triangle() != null && plan.triangle().frequencyHz() > g.maxFrequencyHz()) {
                out.add(PlanPositions.of(plan.source(), "triangle_check.frequency") + ": " + hz(plan.triangle().frequencyHz())
                        + " is above the " + hz(g.maxFrequencyHz()) + " that the " + gen + " declares");
            }
        }
        double peak = plan.sweep().peakEmfVolt();
        if (plan.triangle() != null) {
            peak = Math.max(peak, plan.triangle().amplitudeVolt());
        }
        if (g.maxEmfPeakVolt() != null && peak > g.maxEmfPeakVolt() * (1 + 1e-12)) {
            out.add(plan.source() + ": a peak EMF of " + Units.format(peak, Dimension.VOLTAGE) + " is above the "
                    + Units.format(g.maxEmfPeakVolt(), Dimension.VOLTAGE) + " that the " + gen + " declares");
        }
        InstrumentLimits d = digitizer.limits();
        if (plan.sweep().multisine()) {
            asks.removeIf(a -> plan.sweep().frequenciesHz().contains(a[0]) && a[1] == plan.sweep().cycles());
            multisine(plan, source, gen, dig, d, out);
        }
        double[] fastest = null;
        int tooFast = 0;
        double[] longest = null;
        int tooLong = 0;
        for (double[] a : asks) {
            double interval = 1 / (a[0] * a[2]);
            if (d.minIntervalSecond() != null && interval < d.minIntervalSecond() * (1 - 1e-9)) {
                tooFast++;
                fastest = fastest == null || a[0] > fastest[0] ? a : fastest;
            }
            long samples = (long) a[1] * (long) a[2] + 2;
            if (d.maxRecordLength() != null && samples > d.maxRecordLength()) {
                tooLong++;
                longest = longest == null || samples > (long) longest[1] * (long) longest[2] + 2 ? a : longest;
            }
        }
        if (fastest != null) {
            out.add(String.format(Locale.ROOT, "%s: at %d frequenc%s up to %s the plan's %d samples per cycle need"
                            + " down to %s between samples; the %s declares %s at the shortest",
                    PlanPositions.of(plan.source(), "sine_sweep.samples_per_cycle", "sine_sweep.log_sweep.stop",
                            "sine_sweep.frequencies"), tooFast, tooFast == 1 ? "y" : "ies", hz(fastest[0]), (int) fastest[2],
                    Units.format(1 / (fastest[0] * fastest[2]), Dimension.TIME), dig,
                    Units.format(d.minIntervalSecond(), Dimension.TIME)));
        }
        if (longest != null) {
            out.add(String.format(Locale.ROOT, "%s: %d frequenc%s need records up to %d samples (%d cycles of %d); the %s"
                            + " declares %d at the longest", PlanPositions.of(plan.source(), "sine_sweep.cycles"), tooLong,
                    tooLong == 1 ? "y" : "ies", (long) longest[1] * (long) longest[2] + 2, (int) longest[1],
                    (int) longest[2], dig, d.maxRecordLength()));
        }
        return out;
    }

    /**
     * A multisine sweep needs arbitrary-waveform commands, a waveform within the generator's memory
     * and one record of its whole periods at the plan's samples per cycle of the highest tone.
     */
    private static void multisine(Plan plan, DriverFile source, String gen, String dig, InstrumentLimits d,
                                  List<String> out) {
        if (!source.has("arbitrary_data")) {
            out.add(plan.source() + ": excitation multisine needs arbitrary-waveform commands (arbitrary_data,"
                    + " arbitrary_rate, arbitrary_select), which the " + gen + " does not give");
            return;
        }
        Integer memory = source.limits().maxArbitrarySamples();
        MultisineDesign.Design design;
        try {
            design = MultisineDesign.of(plan.sweep().frequenciesHz(), plan.sweep().multisineTolerance(),
                    memory == null ? Integer.MAX_VALUE : memory);
        } catch (IllegalArgumentException e) {
            out.add(plan.source() + ": " + e.getMessage() + " (" + gen + ")");
            return;
        }
        int top = Arrays.stream(design.bins()).max().orElseThrow();
        long periods = MultisineDesign.periods(design, plan.sweep().cycles());
        int perPeriod = MultisineDesign.captureSamplesPerPeriod(design, plan.sweep().samplesPerCycle());
        long samples = periods * perPeriod + 2;
        double interval = 1 / (design.baseHz() * perPeriod);
        if (d.minIntervalSecond() != null && interval < d.minIntervalSecond() * (1 - 1e-9)) {
            out.add(String.format(Locale.ROOT, "%s: the multisine up to %s needs %s between samples; the %s declares %s"
                            + " at the shortest", plan.source(), hz(top * design.baseHz()),
                    Units.format(interval, Dimension.TIME), dig, Units.format(d.minIntervalSecond(), Dimension.TIME)));
        }
        if (d.maxRecordLength() != null && samples > d.maxRecordLength()) {
            out.add(String.format(Locale.ROOT, "%s: the multisine's record (%d periods of %s, %d samples each)"
                    + " needs %d samples; the %s declares %d at the longest", plan.source(), periods,
                    Units.format(1 / design.baseHz(), Dimension.TIME), perPeriod, samples, dig, d.maxRecordLength()));
        }
    }

    private static String hz(double f) {
        return Units.format(f, Dimension.FREQUENCY);
    }
}
