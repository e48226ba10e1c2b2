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
        return check(digitizer, ranger.askWithTiming(r.intervalSecond(), r.points()), f, cycles, samplesPerCycle);
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

    /** The time base granted, or a second one where it misses the cycles or the samples per cycle. */
    private static Timing check(Digitizer digitizer, Timing timing, double f, int cycles, int samplesPerCycle) {
        if (!holds(timing, f, cycles, samplesPerCycle)) {
            Timing again = digitizer.setTiming(timing.sampleIntervalSecond(),
                    (int) Math.ceil(cycles / (f * timing.sampleIntervalSecond())));
            if (1.0 / (f * again.sampleIntervalSecond()) < samplesPerCycle * 0.999) {
                throw new MeasurementException(String.format(Locale.ROOT,
                        "at %.6g Hz the digitizer's fastest interval %.3g s gives %.1f samples per cycle; the plan asks %d",
                        f, again.sampleIntervalSecond(), 1.0 / (f * again.sampleIntervalSecond()), samplesPerCycle));
            }
            timing = again;
        }
        return timing;
    }
}
