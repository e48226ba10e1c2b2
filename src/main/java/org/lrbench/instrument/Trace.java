package org.lrbench.instrument;

/**
 * One captured channel: samples in volts at {@code startSecond + i * intervalSecond}, the
 * full-scale range and offset it was captured with, and how many samples sat at the converter's
 * limits (a clipped trace is never analysed).
 */
public record Trace(int channel, double intervalSecond, double startSecond, double[] volts,
                    double rangeVolt, double offsetVolt, int clippedSamples) {

    public int length() {
        return volts.length;
    }

    /**
     * The largest distance of any sample from the channel's offset, the centre of its range: a
     * signal off centre or lopsided (spikes on one side) is judged by its extremes against both
     * range limits.
     */
    public double excursion() {
        double e = 0;
        for (double v : volts) {
            e = Math.max(e, Math.abs(v - offsetVolt));
        }
        return e;
    }

    /** Peak-to-peak of the samples. */
    public double peakToPeak() {
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (double v : volts) {
            min = Math.min(min, v);
            max = Math.max(max, v);
        }
        return max - min;
    }
}
