package org.lrbench.uncertainty;

/**
 * What a bench's specifications say about its inputs, as half-widths of rectangular distributions
 * (the usual reading of a maker's "within +/- a" specification): the sense resistor's relative
 * tolerance, the digitizer's relative gain accuracy per channel, the residual inter-channel time
 * skew, and the relative frequency accuracy of the generator against the digitizer's time base.
 */
public record BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy,
                            double rangeGainMatch, double channelMatchDegreesOfFreedom) {

    /** Specifications only, before any channel match. */
    public BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy) {
        this(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, 0, Double.POSITIVE_INFINITY);
    }

    /** The same specifications with the channels' gain ratio between ranges bounded by {@code a}. */
    public BenchAccuracy withRangeGainMatch(double a) {
        return new BenchAccuracy(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, a,
                channelMatchDegreesOfFreedom);
    }

    /**
     * After a channel match the gain ratio and the skew are known to the match's own standard
     * uncertainties u_g and u_tau, estimated from {@code points} readings (n - 1 degrees of
     * freedom): expressed as the half-widths that give those standard uncertainties for the
     * budget's distributions (triangular 2a for the ratio, rectangular for skew).
     */
    public BenchAccuracy afterChannelMatch(double gainUncertainty, double skewUncertainty, int points) {
        return new BenchAccuracy(senseTolerance, gainUncertainty * Math.sqrt(6) / 2, skewUncertainty * Math.sqrt(3),
                frequencyAccuracy, rangeGainMatch, Math.max(1, points - 1));
    }

    /**
     * 0.1 % resistor, 1 % gain per channel, 200 ps skew, 50 ppm, and 0.1 % for the change of the
     * two channels' gain ratio from one pair of ranges to another: common practice, no source.
     */
    public static BenchAccuracy defaults() {
        return new BenchAccuracy(0.001, 0.01, 200e-12, 50e-6, 0.001, Double.POSITIVE_INFINITY);
    }
}
