package org.lrbench.measure;

import org.lrbench.instrument.Timing;

/**
 * One record with its time base, ranges and settle: the time base a digitizer granted as asked
 * before (on instruments kept open) goes in the acquisition's own message when what is left of the
 * settle would hide less than half of a message of its own (as long as the last one took); while
 * more of the settle is left, a message of its own is hidden behind it and the acquisition's stays
 * short. Any other time base is set first, in one message with the ranges, checked, and
 * remembered when it was granted as asked.
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
        if (memory != null && memory.grantedAsAsked(r)
                && b.remaining(settleSecond, since) < memory.timeBaseSecond() / 2) {
            b.clock().sleep(b.remaining(settleSecond, since));
            Timing[] granted = new Timing[1];
            AutoRanger.Capture c = ranger.acquireWithTiming(r.intervalSecond(), r.points(),
                    t -> TimeBase.holds(t, f, cycles, samplesPerCycle), granted);
            if (c != null) {
                return new Captured(f, c, granted[0]);
            }
            // the digitizer granted another time base this time: set one that holds, and capture again
        }
        long sent = b.clock().nanoTime();
        Timing timing = TimeBase.setWithRanges(b.digitizer(), ranger, f, cycles, samplesPerCycle);
        if (memory != null) {
            memory.rememberTimeBaseSecond((b.clock().nanoTime() - sent) / 1e9);
            if (TimeBase.holds(timing, f, cycles, samplesPerCycle)) {
                memory.rememberGranted(r);
            }
        }
        b.clock().sleep(b.remaining(settleSecond, since));
        return new Captured(f, ranger.acquire(), timing);
    }
}
