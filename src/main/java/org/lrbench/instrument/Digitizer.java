package org.lrbench.instrument;

/**
 * A two-or-more channel digitizer (oscilloscope) by its logical operations. Ranges are full-scale
 * peak-to-peak values centred on the channel offset. Setters return what the instrument actually
 * set, since instruments coerce requests to what their hardware can do.
 */
public interface Digitizer {

    /**
     * Makes the settings {@code settings} sends go to the instrument together where it can (one
     * message, one round trip); by default one after another. Only settings, no queries, inside.
     */
    default void batch(Runnable settings) {
        settings.run();
    }


    Identity identity();

    /** Puts the instrument in a known state. */
    void prepare();

    RangeLimits rangeLimits(int channel);

    /** Sets the full-scale range; returns the range in effect. */
    double setRange(int channel, double peakToPeakVolt);

    /** Both channels' ranges at once; a driver may send them in one message. Returns the granted ranges. */
    default double[] setRanges(double peakToPeak1, double peakToPeak2) {
        return new double[] {setRange(1, peakToPeak1), setRange(2, peakToPeak2)};
    }

    void setOffset(int channel, double volt);

    void setCoupling(int channel, Coupling coupling);

    /**
     * The longest record this digitizer takes, samples per channel; where its driver declares none,
     * 100000, a record most bench digitizers offer (common practice, no source).
     */
    default int maxRecordLength() {
        return 100_000;
    }

    /** The shortest sample interval, seconds; where its driver declares none, 1 us (common practice, no source). */
    default double minIntervalSecond() {
        return 1e-6;
    }

    /** The input noise, RMS volts, as the instrument's manual states it; NaN where it is not declared. */
    default double inputNoiseVolt() {
        return Double.NaN;
    }

    /** Sets sample interval and record length; returns the time base in effect. */
    Timing setTiming(double sampleIntervalSecond, int points);

    /**
     * The time base and both channels' ranges at once (a driver may send them in one message):
     * returns the time base in effect and puts the ranges in effect in {@code granted} (channel 1,
     * channel 2). By default one after the other.
     */
    default Timing setTimingAndRanges(double sampleIntervalSecond, int points, double peakToPeak1, double peakToPeak2,
                                      double[] granted) {
        Timing t = setTiming(sampleIntervalSecond, points);
        double[] g = setRanges(peakToPeak1, peakToPeak2);
        granted[0] = g[0];
        granted[1] = g[1];
        return t;
    }

    /**
     * The time base and both channels' ranges, then one acquisition, at once (a driver may send them
     * in one message, the record starting once the settings are in effect): returns the time base in
     * effect and puts the ranges in {@code granted}, as {@link #setTimingAndRanges} does. By
     * default the settings, then {@link #acquire}.
     */
    default Timing setTimingAndRangesThenAcquire(double sampleIntervalSecond, int points, double peakToPeak1,
                                                 double peakToPeak2, double[] granted) {
        Timing t = setTimingAndRanges(sampleIntervalSecond, points, peakToPeak1, peakToPeak2, granted);
        acquire();
        return t;
    }

    void setTrigger(TriggerSource source, double levelVolt, boolean rising);

    /** Arms, waits for the trigger and the end of the record. */
    void acquire();

    /** Transfers one channel of the last record. */
    Trace fetch(int channel);

    /** Both channels' traces of the last acquisition; a driver may ask for them in one message. */
    default Trace[] fetchBoth() {
        return new Trace[] {fetch(1), fetch(2)};
    }
}
