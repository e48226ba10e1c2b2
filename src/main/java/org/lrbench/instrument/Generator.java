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

    /** Puts the instrument in a known state with its output off. */
    void prepare();

    void setWaveform(Waveform waveform);

    void setFrequency(double hertz);

    void setAmplitude(double peakVolt);

    void setOffset(double volt);

    void outputOn();

    void outputOff();
}
