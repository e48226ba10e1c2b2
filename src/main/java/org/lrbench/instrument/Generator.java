package org.lrbench.instrument;

/**
 * A signal generator by its logical operations. Amplitude and offset are open-circuit values (the
 * source EMF behind its output impedance), amplitude as a peak value. Implementations must make
 * {@link #outputOff()} safe to call at any time, repeatedly.
 */
public interface Generator {

    Identity identity();

    /** How long the output takes to settle after a frequency change, as the instrument declares (0: at once). */
    default double frequencySettleSecond() {
        return 0;
    }

    /**
     * Makes the settings {@code settings} sends go to the instrument together where it can (one
     * message, one round trip); by default one after another. Only settings, no queries, inside.
     */
    default void batch(Runnable settings) {
        settings.run();
    }

    /** Puts the instrument in a known state with its output off. */
    void prepare();

    void setWaveform(Waveform waveform);

    /** Whether this generator can play an arbitrary waveform ({@link #loadArbitrary}). */
    default boolean playsArbitrary() {
        return false;
    }

    /** The longest arbitrary waveform it takes; 16384 points where nothing is declared (common practice, no source). */
    default int maxArbitrarySamples() {
        return 16384;
    }

    /**
     * Loads one period of an arbitrary waveform, samples between -1 and 1 (the amplitude setting is
     * the peak), played at {@code sampleRateHz} samples per second, and selects it as the waveform.
     *
     * @throws InstrumentException when the generator or its driver cannot
     */
    default void loadArbitrary(double[] samples, double sampleRateHz) {
        throw new InstrumentException("this generator's driver has no arbitrary-waveform commands (arbitrary_data, arbitrary_rate, arbitrary_select)");
    }

    void setFrequency(double hertz);

    void setAmplitude(double peakVolt);

    void setOffset(double volt);

    void outputOn();

    void outputOff();
}
