package org.lrbench.uncertainty;

/**
 * What a bench's specifications say about its inputs, as half-widths of rectangular distributions
 * (the usual reading of a maker's "within +/- a" specification): the sense resistor's relative
 * tolerance, the digitizer's relative gain accuracy per channel, the residual inter-channel time
 * skew, and the relative frequency accuracy of the generator against the digitizer's time base.
 */
public record BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy) {

    /**
     * After a channel match the gain ratio and the skew are known to the match's own standard
     * uncertainties u_g and u_tau: expressed as the half-widths that give those standard
     * uncertainties for the budget's distributions (triangular 2a for the ratio, rectangular for skew).
     */
    public BenchAccuracy afterChannelMatch(double gainUncertainty, double skewUncertainty) {
        return new BenchAccuracy(senseTolerance, gainUncertainty * Math.sqrt(6) / 2, skewUncertainty * Math.sqrt(3),
                frequencyAccuracy);
    }

    /** 0.1 % resistor, 1 % gain per channel, 200 ps skew, 50 ppm: common practice, no source. */
    public static BenchAccuracy defaults() {
        return new BenchAccuracy(0.001, 0.01, 200e-12, 50e-6);
    }
}
