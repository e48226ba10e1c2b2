package org.lrbench.measure;

import org.lrbench.instrument.Timing;

/**
 * One record with its time base, ranges and settle: a time base the digitizer granted as asked
 * before (on instruments kept open) goes in the acquisition's own message, with the ranges, after
 * the settle (one round trip, not two; the grant is read back in the same reply and a capture on
 * any other time base is taken again). Any other time base is set first, in one message with the
 * ranges, checked, and remembered when it was granted as asked.
 */
final class TimedCapture {

    /** One capture, before its analysis: the frequency, both channels' records and the timing granted. */
    record Captured(double f, AutoRanger.Capture capture, Timing timing) {
    }

    private TimedCapture() {
    }

    /** The record at {@code f}, the settle (counted from {@code since}) waited before it. */
    static Captured capture(SweepBench b, AutoRanger ranger, double f, int cycles, int samplesPerCycle,
                            double settleSecond, long since) {
        RangeMemory memory = b.memory();
        TimeBase.Request r = TimeBase.request(f, cycles, samplesPerCycle);
        if (memory != null && memory.grantedAsAsked(r)) {
            b.clock().sleep(b.remaining(settleSecond, since));
            Timing[] granted = new Timing[1];
            AutoRanger.Capture c = ranger.acquireWithTiming(r.intervalSecond(), r.points(),
                    t -> TimeBase.holds(t, f, cycles, samplesPerCycle), granted);
            if (c != null) {
                return new Captured(f, c, granted[0]);
            }
            // the digitizer granted another time base this time: set one that holds, and capture again
        }
        Timing timing = TimeBase.setWithRanges(b.digitizer(), ranger, f, cycles, samplesPerCycle);
        if (memory != null && TimeBase.holds(timing, f, cycles, samplesPerCycle)) {
            memory.rememberGranted(r);
        }
        b.clock().sleep(b.remaining(settleSecond, since));
        return new Captured(f, ranger.acquire(), timing);
    }
}
