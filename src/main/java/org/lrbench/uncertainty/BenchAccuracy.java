package org.lrbench.uncertainty;

/**
 * What a bench's specifications say about its inputs, as half-widths of rectangular distributions
 * (the usual reading of a maker's "within +/- a" specification): the sense resistor's relative
 * tolerance, the digitizer's relative gain accuracy per channel, the residual inter-channel time
 * skew, and the relative frequency accuracy of the generator against the digitizer's time base.
 */
public record BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy,
                            double rangeGainMatch, double channelMatchDegreesOfFreedom, FixtureBounds fixture,
                            TracedSense tracedSense, double meterAccuracy, double senseAcDc) {

    /**
     * A 6.5-digit multimeter's 4-wire resistance accuracy at 100 ohm, one year: about 0.010 % of the
     * reading plus 0.004 % of the range (from memory of makers' data sheets): 0.015 % as a half-width.
     */
    public static final double METER_ACCURACY = 0.00015;
    /**
     * A metal-film or foil resistor of 100 ohm or less changes by under 0.01 % from DC to 100 kHz
     * (common practice, no source).
     */
    public static final double SENSE_AC_DC = 0.0001;

    public BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy,
                         double rangeGainMatch, double channelMatchDegreesOfFreedom, FixtureBounds fixture,
                         TracedSense tracedSense) {
        this(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch, channelMatchDegreesOfFreedom,
                fixture, tracedSense, METER_ACCURACY, SENSE_AC_DC);
    }

    /**
     * The sense resistor as traced by the bench's meter: the meter's specification (rectangular
     * half-width, relative), the relative standard uncertainty of the readings' scatter, and the bound on
     * its AC/DC difference over the plan's frequencies (rectangular half-width, relative). Null: only the
     * nominal and its tolerance.
     */
    public record TracedSense(double meterHalfWidth, double scatter, double acDcBound) {
    }

    /** The same specifications with the sense resistor traced (its line replaces the tolerance's). */
    public BenchAccuracy withTracedSense(TracedSense t) {
        return new BenchAccuracy(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch,
                channelMatchDegreesOfFreedom, fixture, t, meterAccuracy, senseAcDc);
    }

    public BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy,
                         double rangeGainMatch, double channelMatchDegreesOfFreedom, FixtureBounds fixture) {
        this(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch, channelMatchDegreesOfFreedom,
                fixture, null);
    }

    /**
     * What the fixture may add to a reading while no open/short compensation is in force: leads in
     * series (resistance, inductance) and a stray capacitance across the part's terminals, each at
     * most this much (half-widths of rectangular distributions). Null: the compensation is in force.
     */
    public record FixtureBounds(double leadOhm, double leadHenry, double strayFarad) {
        /**
         * 50 mohm and 200 nH of leads and clips, 10 pF across the terminals: a bench fixture with
         * short leads (common practice, no source).
         */
        public static FixtureBounds defaults() {
            return new FixtureBounds(0.05, 200e-9, 10e-12);
        }
    }

    public BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy,
                         double rangeGainMatch, double channelMatchDegreesOfFreedom) {
        this(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch, channelMatchDegreesOfFreedom,
                null);
    }

    /** The same specifications with the meter's accuracy and the sense resistor's AC/DC bound as given. */
    public BenchAccuracy withTraceSpecs(double meter, double acDc) {
        return new BenchAccuracy(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch,
                channelMatchDegreesOfFreedom, fixture, tracedSense, meter, acDc);
    }

    /** The same specifications with the fixture's bounds (null once a compensation is in force). */
    public BenchAccuracy withFixture(FixtureBounds f) {
        return new BenchAccuracy(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, rangeGainMatch,
                channelMatchDegreesOfFreedom, f, tracedSense, meterAccuracy, senseAcDc);
    }

    /** Specifications only, before any channel match, with nothing said of the fixture. */
    public BenchAccuracy(double senseTolerance, double gainAccuracy, double skewSecond, double frequencyAccuracy) {
        this(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, 0, Double.POSITIVE_INFINITY, null);
    }

    /** The same specifications with the channels' gain ratio between ranges bounded by {@code a}. */
    public BenchAccuracy withRangeGainMatch(double a) {
        return new BenchAccuracy(senseTolerance, gainAccuracy, skewSecond, frequencyAccuracy, a,
                channelMatchDegreesOfFreedom, fixture, tracedSense, meterAccuracy, senseAcDc);
    }

    /**
     * After a channel match the gain ratio and the skew are known to the match's own standard
     * uncertainties u_g and u_tau, estimated from {@code points} readings (n - 1 degrees of
     * freedom): expressed as the half-widths that give those standard uncertainties for the
     * budget's distributions (triangular 2a for the ratio, rectangular for skew).
     */
    public BenchAccuracy afterChannelMatch(double gainUncertainty, double skewUncertainty, int points) {
        return new BenchAccuracy(senseTolerance, gainUncertainty * Math.sqrt(6) / 2, skewUncertainty * Math.sqrt(3),
                frequencyAccuracy, rangeGainMatch, Math.max(1, points - 1), fixture, tracedSense, meterAccuracy,
                senseAcDc);
    }

    /**
     * 0.1 % resistor, 1 % gain per channel, 200 ps skew, 50 ppm, 0.1 % for the change of the two
     * channels' gain ratio from one pair of ranges to another, and the fixture's default bounds:
     * common practice, no source.
     */
    public static BenchAccuracy defaults() {
        return new BenchAccuracy(0.001, 0.01, 200e-12, 50e-6, 0.001, Double.POSITIVE_INFINITY, FixtureBounds.defaults());
    }
}
