package org.lrbench.measure;

import java.util.Locale;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Timing;

/** Chooses a digitizer time base for a number of cycles at no fewer than so many samples per cycle. */
final class TimeBase {

    private TimeBase() {
    }

    static Timing set(Digitizer digitizer, double f, int cycles, int samplesPerCycle) {
        double interval = 1.0 / (f * samplesPerCycle);
        // a little more than the cycles asked for, so an interval the digitizer rounds down by up to
        // 0.1 % still captures them without a second round trip
        int points = (int) Math.ceil(cycles * samplesPerCycle * 1.001) + 1;
        Timing timing = digitizer.setTiming(interval, points);
        double captured = timing.points() * timing.sampleIntervalSecond() * f;
        if (1.0 / (f * timing.sampleIntervalSecond()) < samplesPerCycle * (1 - 1e-9) || captured < cycles * (1 - 1e-9)) {
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
