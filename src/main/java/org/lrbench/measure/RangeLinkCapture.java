package org.lrbench.measure;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.TreeSet;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.plan.Plan;

/**
 * The two channels' gain ratio on many pairs of ranges, both channels across the same node (the
 * channel-match position), at one frequency: each channel's ranges are the ones the digitizer grants
 * for the {@link RangeLadder}, and each range of channel 1 is read against the range of channel 2
 * nearest it and the ranges on either side of that one. The signal for a pair puts three quarters of
 * the smaller range's full scale on it, made by lowering the generator from the plan's amplitude (never
 * raising it). A pair whose signal the plan's amplitude cannot reach, or that clips, is listed, not
 * read. The readings link every range of both channels through shared ranges, so that a least-squares
 * solution gives the ratio on every pair, also on pairs never read together.
 * <p>
 * The caller owns the output's safety: this class switches it on and leaves it on.
 */
public final class RangeLinkCapture {

    /** Cycles per record: about 20 000 samples, so a small signal on a large range still reads to a few 1e-5. */
    static final int CYCLES = 40;
    static final int SAMPLES_PER_CYCLE = 500;
    /** The signal's peak-to-peak as a share of the smaller range of the pair. */
    static final double FILL = 0.75;

    /**
     * One reading: channel {@code channelB}'s gain on range {@code rangeB} over channel {@code channelA}'s on
     * {@code rangeA} (full scale at the fixture, peak-to-peak volts), with its relative standard
     * uncertainty: |V2 / V1| of one record (channels 1 and 2), or one channel's amplitude on one range over
     * the same signal's on another, two records in a row.
     */
    public record Reading(int channelA, double rangeA, int channelB, double rangeB, double gainRatio,
                          double relativeUncertainty) {
    }

    /** What was read at which frequency, and the pairs that could not be read, in words. */
    public record Result(double frequencyHz, List<Reading> readings, List<String> unread) {
    }

    private RangeLinkCapture() {
    }

    /**
     * @param frequencyHz      the frequency of the readings (one where the sense resistor's voltage is large)
     * @param senseAtPlanVolt  the peak voltage across the sense resistor at the plan's amplitude at that frequency
     */
    public static Result measure(Plan plan, Generator generator, Digitizer digitizer, BenchClock clock,
                                 double frequencyHz, double senseAtPlanVolt) {
        // no sweep signal needs a range above the one a sweep starts on
        double topVolt = RangeLadder.up(SweepRunner.START_RANGE_PER_PEAK * plan.sweep().peakEmfVolt());
        double att1 = SweepRunner.attenuation(plan, 1);
        double att2 = SweepRunner.attenuation(plan, 2);
        SweepRunner.prepareInputs(digitizer, TriggerSource.CHANNEL1);
        List<Double> rungs1 = granted(digitizer, 1, topVolt / att1);
        List<Double> rungs2 = granted(digitizer, 2, topVolt / att2);
        TimeBase.Request request = TimeBase.request(frequencyHz, CYCLES, SAMPLES_PER_CYCLE);
        digitizer.setTiming(request.intervalSecond(), request.points());
        List<double[]> pairs = pairs(rungs1, att1, rungs2, att2);
        reachTop(pairs, rungs1, att1, rungs2, att2, 2 * senseAtPlanVolt / FILL);
        double amplitude = plan.sweep().amplitudeVolt();
        double settle = plan.sweep().settleSecond();
        generator.batch(() -> {
            generator.prepare();
            generator.setWaveform(Waveform.SINE);
            generator.setFrequency(frequencyHz);
            generator.setAmplitude(amplitude * Math.min(1, FILL * pairs.get(0)[2] / 2 / senseAtPlanVolt));
            generator.setOffset(0.0);
            generator.outputOn();
        });
        List<Reading> readings = new ArrayList<>();
        List<String> unread = new ArrayList<>();
        double level = Double.NaN;
        for (double[] p : pairs) {
            double peak = FILL * p[2] / 2;
            if (peak > senseAtPlanVolt * (1 + 1e-9)) {
                unread.add(String.format(Locale.ROOT, "%s / %s (needs %.3g V peak; the plan's amplitude gives %.3g V)",
                        volts(p[0] * att1), volts(p[1] * att2), peak, senseAtPlanVolt));
                continue;
            }
            if (peak != level) {
                generator.setAmplitude(amplitude * peak / senseAtPlanVolt);
                clock.sleep(settle);
                level = peak;
            }
            double[] granted = digitizer.setRanges(p[0], p[1]);
            digitizer.acquire();
            Trace t1 = digitizer.fetch(1);
            Trace t2 = digitizer.fetch(2);
            if (t1.clippedSamples() > 0 || t2.clippedSamples() > 0) {
                unread.add(volts(granted[0] * att1) + " / " + volts(granted[1] * att2) + " (clipped)");
                continue;
            }
            FixturePhasors.Result f = FixturePhasors.of(t1.volts(), t2.volts(), t1.intervalSecond(), frequencyHz,
                    att1, att2, false);
            double a1 = f.sense().amplitude();
            double a2 = f.part().amplitude();
            double q1 = f.senseCorrection().gainUncertainty() / f.senseCorrection().gain();
            double q2 = f.partCorrection().gainUncertainty() / f.partCorrection().gain();
            double u = Math.sqrt(f.sense().componentVariance() / (a1 * a1) + f.part().componentVariance() / (a2 * a2)
                    + q1 * q1 + q2 * q2);
            readings.add(new Reading(1, granted[0] * att1, 2, granted[1] * att2, a2 / a1, u));
        }
        return new Result(frequencyHz, List.copyOf(readings), List.copyOf(unread));
    }

    /**
     * Channel 2's ranges above {@code fromVolt} (at the fixture) linked to each other where both channels
     * cannot see one signal large enough: channel 2 alone on a node the generator drives (the open fixture's
     * terminals), each pair of neighbouring ranges read in two records in a row at one generator setting,
     * so that the ratio of the two amplitudes is the ratio of the ranges' gains. It assumes the generator's
     * amplitude steady between two records (a function generator's holds to about 1e-5 over seconds:
     * common practice, no source). The digitizer runs free (nothing to trigger on in channel 1).
     *
     * @param nodeAtPlanVolt the node's peak voltage at the plan's amplitude at {@code frequencyHz}
     */
    public static Result channel2Alone(Plan plan, Generator generator, Digitizer digitizer, BenchClock clock,
                                       double frequencyHz, double nodeAtPlanVolt, double fromVolt) {
        double topVolt = RangeLadder.up(SweepRunner.START_RANGE_PER_PEAK * plan.sweep().peakEmfVolt());
        double att2 = SweepRunner.attenuation(plan, 2);
        List<Double> all = granted(digitizer, 2, topVolt / att2);
        List<Double> rungs = all.stream().filter(r -> r * att2 >= fromVolt * (1 - 1e-9)).toList();
        List<Reading> readings = new ArrayList<>();
        List<String> unread = new ArrayList<>();
        if (rungs.size() < 2) {
            return new Result(frequencyHz, List.of(), List.of());
        }
        SweepRunner.prepareInputs(digitizer, TriggerSource.IMMEDIATE);
        TimeBase.Request request = TimeBase.request(frequencyHz, CYCLES, SAMPLES_PER_CYCLE);
        digitizer.setTiming(request.intervalSecond(), request.points());
        double amplitude = plan.sweep().amplitudeVolt();
        double low = RangeLadder.up(digitizer.rangeLimits(1).minVolt());
        generator.batch(() -> {
            generator.prepare();
            generator.setWaveform(Waveform.SINE);
            generator.setFrequency(frequencyHz);
            generator.setAmplitude(amplitude * Math.min(1, FILL * rungs.get(0) * att2 / 2 / nodeAtPlanVolt));
            generator.setOffset(0.0);
            generator.outputOn();
        });
        for (int i = 0; i + 1 < rungs.size(); i++) {
            double peak = FILL * rungs.get(i) * att2 / 2;
            if (peak > nodeAtPlanVolt * (1 + 1e-9)) {
                unread.add(String.format(Locale.ROOT, "channel 2 alone %s / %s (needs %.3g V peak; the plan's amplitude"
                        + " gives %.3g V)", volts(rungs.get(i) * att2), volts(rungs.get(i + 1) * att2), peak,
                        nodeAtPlanVolt));
                continue;
            }
            generator.setAmplitude(amplitude * peak / nodeAtPlanVolt);
            clock.sleep(plan.sweep().settleSecond());
            double[] a = new double[2];
            double[] v = new double[2];
            boolean clipped = false;
            for (int k = 0; k < 2; k++) {
                digitizer.setRanges(low, rungs.get(i + k));
                digitizer.acquire();
                Trace t = digitizer.fetch(2);
                clipped |= t.clippedSamples() > 0;
                FixturePhasors.Result f = FixturePhasors.of(t.volts(), t.volts(), t.intervalSecond(), frequencyHz,
                        att2, att2, false);
                a[k] = f.part().amplitude();
                double q = f.partCorrection().gainUncertainty() / f.partCorrection().gain();
                v[k] = f.part().componentVariance() / (a[k] * a[k]) + q * q;
            }
            if (clipped) {
                unread.add("channel 2 alone " + volts(rungs.get(i) * att2) + " / " + volts(rungs.get(i + 1) * att2)
                        + " (clipped)");
                continue;
            }
            readings.add(new Reading(2, rungs.get(i) * att2, 2, rungs.get(i + 1) * att2, a[1] / a[0],
                    Math.sqrt(v[0] + v[1])));
        }
        return new Result(frequencyHz, List.copyOf(readings), List.copyOf(unread));
    }

    /** The distinct ranges the digitizer grants for the ladder's values up to {@code top} (instrument volts). */
    static List<Double> granted(Digitizer digitizer, int channel, double top) {
        RangeLimits lim = digitizer.rangeLimits(channel);
        TreeSet<Double> out = new TreeSet<>();
        if (!lim.steps().isEmpty()) {
            // the instrument's own ranges: those the ranger asks for
            double upTo = lim.stepAtLeast(top);
            lim.steps().stream().filter(r -> r <= upTo * (1 + 1e-9)).forEach(out::add);
            return new ArrayList<>(out);
        }
        double last = Double.NaN;
        double upTo = Math.min(lim.maxVolt(), RangeLadder.up(top));
        for (double r = RangeLadder.up(lim.minVolt()); r <= upTo * (1 + 1e-9); r = RangeLadder.next(r)) {
            double g = digitizer.setRange(channel, r);
            if (!(Math.abs(g - last) <= 1e-9 * g)) {
                out.add(g);
                last = g;
            }
        }
        return new ArrayList<>(out);
    }

    /**
     * The pairs read, {range 1, range 2, smaller of the two at the fixture} in instrument volts, the
     * smallest signal first: each range of channel 1 with channel 2's nearest at the fixture and the
     * ones either side of it; each range of channel 2 likewise, so neither channel's ends are left out.
     */
    static List<double[]> pairs(List<Double> rungs1, double att1, List<Double> rungs2, double att2) {
        List<double[]> out = new ArrayList<>();
        addNear(out, rungs1, att1, rungs2, att2, false);
        addNear(out, rungs2, att2, rungs1, att1, true);
        out.sort(Comparator.comparingDouble((double[] p) -> p[2]).thenComparingDouble(p -> p[0]));
        return out;
    }

    /**
     * Each range whose pairs all need more signal than there is ({@code fillable}: the largest range a
     * signal can fill to {@value #FILL}, at the fixture) read against the other channel's largest range that
     * can be filled, where that fills it to at least 40 %: so the channels' top ranges get linked too.
     */
    static void reachTop(List<double[]> pairs, List<Double> rungs1, double att1, List<Double> rungs2, double att2,
                         double fillable) {
        for (int ch = 1; ch <= 2; ch++) {
            List<Double> own = ch == 1 ? rungs1 : rungs2;
            List<Double> other = ch == 1 ? rungs2 : rungs1;
            double attOwn = ch == 1 ? att1 : att2;
            double attOther = ch == 1 ? att2 : att1;
            Double best = null;
            for (double b : other) {
                if (b * attOther <= fillable * (1 + 1e-9)) {
                    best = b;
                }
            }
            if (best == null) {
                continue;
            }
            for (double a : own) {
                int c = ch;
                boolean readable = pairs.stream().anyMatch(p -> p[c - 1] == a && p[2] <= fillable * (1 + 1e-9));
                if (readable || a * attOwn > best * attOther / 0.4 * FILL || a * attOwn <= best * attOther) {
                    continue;
                }
                double r1 = ch == 1 ? a : best;
                double r2 = ch == 1 ? best : a;
                pairs.add(new double[] {r1, r2, Math.min(r1 * att1, r2 * att2)});
            }
        }
        pairs.sort(Comparator.comparingDouble((double[] p) -> p[2]).thenComparingDouble(p -> p[0]));
    }

    private static void addNear(List<double[]> out, List<Double> from, double attFrom, List<Double> to, double attTo,
                                boolean swapped) {
        for (double a : from) {
            int nearest = 0;
            for (int j = 1; j < to.size(); j++) {
                if (Math.abs(Math.log(to.get(j) * attTo / (a * attFrom)))
                        < Math.abs(Math.log(to.get(nearest) * attTo / (a * attFrom)))) {
                    nearest = j;
                }
            }
            for (int j = Math.max(0, nearest - 1); j <= Math.min(to.size() - 1, nearest + 1); j++) {
                double b = to.get(j);
                double r1 = swapped ? b : a;
                double r2 = swapped ? a : b;
                boolean known = out.stream().anyMatch(p -> p[0] == r1 && p[1] == r2);
                if (!known) {
                    out.add(new double[] {r1, r2, Math.min(r1 * (swapped ? attTo : attFrom),
                            r2 * (swapped ? attFrom : attTo))});
                }
            }
        }
    }

    private static String volts(double v) {
        return String.format(Locale.ROOT, "%.4g V", v);
    }
}
