package org.lrbench.driver;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.Locale;
import java.util.Map;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Waveform;
import org.lrbench.scpi.DefiniteBlock;
import org.lrbench.scpi.ScpiNumbers;
import org.lrbench.scpi.ScpiSession;

/** A generator that speaks SCPI through a source driver file. */
public final class ScpiGenerator extends DrivenInstrument implements Generator {

    /** The session's message count just after a confirmed output-off; -1 before the first. */
    private volatile long offAfter = -1;

    public ScpiGenerator(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public double frequencySettleSecond() {
        return driver.frequencySettleSecond();
    }

    @Override
    public void prepare() {
        super.prepare();
        outputOff();
    }

    @Override
    public void setWaveform(Waveform waveform) {
        if (waveform == Waveform.ARBITRARY) {
            if (!playsArbitrary()) {
                Generator.super.loadArbitrary(new double[0], 0);
            }
            configure("arbitrary_select", Map.of());
            return;
        }
        configure("waveform", Map.of("shape", driver.word("shapes", waveform.name().toLowerCase(Locale.ROOT))));
    }

    @Override
    public boolean playsArbitrary() {
        return driver.has("arbitrary_data");
    }

    @Override
    public int maxArbitrarySamples() {
        Integer declared = driver.limits().maxArbitrarySamples();
        return declared == null ? Generator.super.maxArbitrarySamples() : declared;
    }

    /**
     * Sends the samples as the driver says: an ASCII list (six decimals: steps of 1e-6 of the peak,
     * finer than a 16-bit waveform memory's), or an IEEE 488.2 definite block of 16-bit two's
     * complement words, full scale +/-32767, in either byte order (a fifth of the bytes); then the
     * playback rate; then selects the waveform.
     */
    @Override
    public void loadArbitrary(double[] samples, double sampleRateHz) {
        if (!playsArbitrary()) {
            Generator.super.loadArbitrary(samples, sampleRateHz);
        }
        for (int i = 0; i < samples.length; i++) {
            if (!(Math.abs(samples[i]) <= 1)) {
                throw new IllegalArgumentException("arbitrary sample " + i + " is " + samples[i] + "; allowed -1 to 1");
            }
        }
        String points = driver.arbitraryEncoding().equals("ascii") ? asciiList(samples)
                : DefiniteBlock.of(words(samples, driver.arbitraryEncoding().equals("int16-big")));
        configure("arbitrary_data", Map.of("points", points, "count", Integer.toString(samples.length)));
        configure("arbitrary_rate", Map.of("rate", ScpiNumbers.nr3(sampleRateHz),
                "frequency", ScpiNumbers.nr3(sampleRateHz / samples.length)));
        configure("arbitrary_select", Map.of());
    }

    private static String asciiList(double[] samples) {
        StringBuilder list = new StringBuilder(samples.length * 10);
        for (int i = 0; i < samples.length; i++) {
            if (i > 0) {
                list.append(',');
            }
            appendMicro(list, samples[i]);
        }
        return list.toString();
    }

    /** The samples as 16-bit words, -1 to 1 as -32767 to 32767. */
    static byte[] words(double[] samples, boolean bigEndian) {
        ByteBuffer b = ByteBuffer.allocate(2 * samples.length).order(bigEndian ? ByteOrder.BIG_ENDIAN : ByteOrder.LITTLE_ENDIAN);
        for (double v : samples) {
            b.putShort((short) Math.round(v * 32767));
        }
        return b.array();
    }

    /** {@code v} with six decimals, as %.6f would give it, without a formatter per sample. */
    static void appendMicro(StringBuilder out, double v) {
        long micro = Math.round(Math.abs(v) * 1e6);
        if (v < 0 && micro != 0) {
            out.append('-');
        }
        out.append(micro / 1_000_000).append('.');
        String frac = Long.toString(micro % 1_000_000);
        out.append("000000", 0, 6 - frac.length()).append(frac);
    }

    @Override
    public void setFrequency(double hertz) {
        configure("frequency", Map.of("frequency", ScpiNumbers.nr3(hertz)));
    }

    @Override
    public void setAmplitude(double peakVolt) {
        double setting = peakVolt * driver.levelPerEmf();
        configure("amplitude", Map.of("amplitude_vpk", ScpiNumbers.nr3(setting),
                "amplitude_vpp", ScpiNumbers.nr3(2 * setting)));
    }

    @Override
    public void setOffset(double volt) {
        configure("offset", Map.of("offset", ScpiNumbers.nr3(volt * driver.levelPerEmf())));
    }

    @Override
    public void outputOn() {
        configure("output_on", Map.of());
    }

    /**
     * Switches the output off, unless the last message this session sent was an output-off the
     * instrument confirmed without error: then it is off already (any message since, whatever it
     * was, makes the next call send it again).
     */
    @Override
    public void outputOff() {
        if (!batching() && offAfter == session.messages()) {
            return;
        }
        configure("output_off", Map.of());
        if (!batching()) {
            offAfter = session.messages();
        }
    }
}
