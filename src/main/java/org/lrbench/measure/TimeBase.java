package org.lrbench.measure;

import java.util.Locale;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Timing;

/**
 * Chooses a digitizer time base for a number of cycles at no fewer than so many samples per cycle,
 * with a sample rate that is not a whole multiple of the signal frequency.
 */
final class TimeBase {

    private TimeBase() {
    }

    /**
     * Sets the time base and the ranger's present ranges in one message where the driver can (one
     * round trip instead of two), then checks the time base granted: where it misses the cycles or
     * the samples per cycle, a second time base is asked for.
     */
    static Timing setWithRanges(Digitizer digitizer, AutoRanger ranger, double f, int cycles, int samplesPerCycle) {
        Request r = request(f, cycles, samplesPerCycle);
        return check(digitizer, ranger.askWithTiming(r.intervalSecond(), r.points()), f, cycles, samplesPerCycle, r);
    }

    /** The interval and record length asked for. */
    record Request(double intervalSecond, int points) {
    }

    static Request request(double f, int cycles, int samplesPerCycle) {
        // cycles * samplesPerCycle + 1 samples over exactly `cycles` periods: the sample count and the
        // cycle count are co-prime, so no two samples fall on the same phase and the converter's
        // quantization error does not repeat cycle after cycle (IEEE Std 1241 coherent sampling)
        int exact = cycles * samplesPerCycle + 1;
        double interval = cycles / (f * exact);
        // 1 % more samples, so an interval the digitizer rounds down by up to 1 % still captures the
        // cycles without a second round trip
        int points = exact + (int) Math.ceil(0.01 * exact) + 1;
        return new Request(interval, points);
    }

    /** Whether a time base holds the cycles at no fewer than the samples per cycle. */
    static boolean holds(Timing timing, double f, int cycles, int samplesPerCycle) {
        double captured = timing.points() * timing.sampleIntervalSecond() * f;
        return 1.0 / (f * timing.sampleIntervalSecond()) >= samplesPerCycle * (1 - 1e-9) && captured >= cycles * (1 - 1e-9);
    }

    /** Further requests for a finer interval before the digitizer's best is taken as its limit. */
    static final int FINER_TRIES = 6;

    /**
     * The time base granted, or another where it misses the cycles or the samples per cycle: first the
     * granted interval with enough points for the cycles; where that interval is too coarse, a finer one
     * asked for, scaled down by how far the last grant overshot what the plan needs, with the points for
     * the cycles (an instrument that rounds its interval up to its own steps, or that derives it from a
     * time window and a record length from its list, grants the finer step only when asked below it),
     * until the interval holds, the grants stop improving or {@value #FINER_TRIES} more requests were made.
     */
    private static Timing check(Digitizer digitizer, Timing timing, double f, int cycles, int samplesPerCycle,
                                Request asked) {
        if (holds(timing, f, cycles, samplesPerCycle)) {
            return timing;
        }
        Timing again = digitizer.setTiming(timing.sampleIntervalSecond(),
                (int) Math.ceil(cycles / (f * timing.sampleIntervalSecond())));
        if (holds(again, f, cycles, samplesPerCycle)) {
            return again;
        }
        double needed = 1.0 / (f * samplesPerCycle);
        Timing best = again;
        double ask = asked.intervalSecond();
        for (int i = 0; i < FINER_TRIES && best.sampleIntervalSecond() > needed * (1 + 1e-9); i++) {
            ask = ask * Math.min(0.999, needed / best.sampleIntervalSecond()) * 0.999;
            int points = (int) Math.min(Integer.MAX_VALUE - 1, Math.ceil(1.01 * cycles / (f * ask)) + 1);
            Timing finer = digitizer.setTiming(ask, points);
            if (holds(finer, f, cycles, samplesPerCycle)) {
                return finer;
            }
            if (!(finer.sampleIntervalSecond() < best.sampleIntervalSecond() * (1 - 1e-9))) {
                break; // asking finer gives nothing finer: this is the instrument's limit
            }
            best = finer;
        }
        throw new MeasurementException(String.format(Locale.ROOT, "at %.6g Hz the digitizer's finest interval %.3g s"
                + " gives %.1f samples per cycle; the plan asks %d", f, best.sampleIntervalSecond(),
                1.0 / (f * best.sampleIntervalSecond()), samplesPerCycle));
    }
}
