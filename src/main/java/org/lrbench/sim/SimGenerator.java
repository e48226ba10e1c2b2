package org.lrbench.sim;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.transform.DftNormalization;
import org.apache.commons.math3.transform.FastFourierTransformer;
import org.apache.commons.math3.transform.TransformType;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.scpi.ScpiDevice;
import org.lrbench.sim.scpi.ScpiFault;

/**
 * A simulated one-channel function generator behind SCPI. Like most real ones, its amplitude
 * (peak-to-peak) and offset settings are referred to the load it is told it drives,
 * {@code OUTPut:LOAD}, 50 ohm after *RST: the open-circuit EMF is the setting times
 * (Rload + Rout) / Rload, twice the setting into a 50 ohm load, equal to it for INFinity.
 */
public final class SimGenerator extends ScpiDevice {

    /**
     * Which generator the simulation plays. {@code generic}: SCPI-1999 SOURce/OUTPut subsystems,
     * peak-to-peak amplitude and offset referred to the load set by {@code OUTPut:LOAD} (50 ohm
     * after *RST). {@code peak-emf}: a WAVe subsystem whose amplitude is the peak open-circuit EMF
     * and whose offset is the open-circuit DC level, with one output command taking ON or OFF.
     */
    public enum Personality {
        GENERIC("generic"), PEAK_EMF("peak-emf");

        private final String key;

        Personality(String key) {
            this.key = key;
        }

        public static Map<String, Personality> byKey() {
            Map<String, Personality> m = new LinkedHashMap<>();
            for (Personality p : values()) {
                m.put(p.key, p);
            }
            return m;
        }
    }
    public static final double MAX_FREQUENCY = 20e6;
    public static final double MAX_EMF_PEAK = 10.0;
    /** The arbitrary-waveform memory: points and fastest playback rate. */
    public static final int MAX_ARBITRARY_POINTS = 65536;
    public static final double MAX_ARBITRARY_RATE = 100e6;
    /**
     * Lines of an arbitrary waveform below this fraction of its largest (-100 dB) are left out: the
     * points' own rounding (16-bit words spread it over every bin near -130 dB) and spurs far below
     * any simulated digitizer's resolution and noise, each of which would cost the synthesis a line.
     */
    private static final double LINE_FLOOR = 1e-5;

    private final double outputOhm;
    private final Personality personality;
    Waveform waveform;
    double frequency;
    double amplitudeVpp;
    double offset;
    double loadOhm;
    boolean outputOn;
    /** The arbitrary waveform's lines (peak 1, cosine phasors by harmonic of its period), its points and rate. */
    List<Harmonic> arbitraryLines = List.of();
    int arbitraryPoints;
    double arbitraryRate;

    private double frequencyChangeSecond;
    private double timeBaseError;

    /**
     * How far the generator's time base is off the digitizer's (relative): every frequency it puts out is
     * the one set times (1 + e), while it reports the one set, as a generator without a shared reference
     * clock does (a few ppm is usual; common practice, no source).
     */
    public synchronized void setTimeBaseError(double e) {
        this.timeBaseError = e;
    }

    /** How long the output takes to settle after a frequency change (0: at once). */
    public void setFrequencyChangeSecond(double seconds) {
        this.frequencyChangeSecond = seconds;
    }

    /** A new frequency; the command completes once the output has settled there. */
    void changeFrequency(double f) {
        if (f != frequency) {
            SimTiming.pass(frequencyChangeSecond);
        }
        frequency = f;
    }

    public SimGenerator(double outputOhm) {
        this(outputOhm, Personality.GENERIC);
    }

    public SimGenerator(double outputOhm, Personality personality) {
        super(personality == Personality.PEAK_EMF ? "LRBENCH,SIM-SOURCE-PK,SIM0021,0.1" : "LRBENCH,SIM-SOURCE-1,SIM0001,0.1");
        this.outputOhm = outputOhm;
        this.personality = personality;
        reset();
        if (personality == Personality.PEAK_EMF) {
            PeakEmfDialect.install(this);
        } else {
            GeneratorScpiDialect.install(this);
        }
    }

    /** A dialect's command or query on this generator's settings. */
    void on(String pattern, boolean query, Handler handler) {
        register(pattern, query, handler);
    }

    /**
     * The waveform memory takes one period of samples; its lines follow from their discrete
     * Fourier transform, the output being the band-limited periodic signal through those samples
     * (an ideal reconstruction filter), lines at rounding level left out.
     */
    void loadArbitrary(double[] points) {
        int n = points.length;
        Complex[] x;
        if (Integer.bitCount(n) == 1) {
            x = new FastFourierTransformer(DftNormalization.STANDARD).transform(points, TransformType.FORWARD);
        } else {
            x = new Complex[n / 2 + 1];
            for (int k = 0; k <= n / 2; k++) {
                double re = 0;
                double im = 0;
                for (int i = 0; i < n; i++) {
                    double a = -2 * Math.PI * ((long) k * i % n) / n;
                    re += points[i] * Math.cos(a);
                    im += points[i] * Math.sin(a);
                }
                x[k] = new Complex(re, im);
            }
        }
        double largest = 0;
        for (int k = 0; k <= n / 2; k++) {
            largest = Math.max(largest, x[k].abs());
        }
        List<Harmonic> lines = new ArrayList<>();
        for (int k = 0; k <= n / 2; k++) {
            if (x[k].abs() > LINE_FLOOR * largest) {
                // x[i] = sum_k c_k exp(j 2 pi k i / n) / n: a line's cosine phasor is 2 c_k / n
                // (c_0 / n for the mean and, for even n, the line at half the rate)
                double scale = k == 0 || 2 * k == n ? 1.0 / n : 2.0 / n;
                lines.add(new Harmonic(k, x[k].multiply(scale)));
            }
        }
        arbitraryLines = List.copyOf(lines);
        arbitraryPoints = n;
    }

    /** The open-circuit EMF's lines up to {@code bandLimit} Hz, as harmonics of {@link #frequency()}. */
    public synchronized List<Harmonic> emfLines(double bandLimit) {
        if (waveform != Waveform.ARBITRARY) {
            return WaveformSpectrum.of(waveform, emfPeak(), emfOffset(), frequency, bandLimit);
        }
        List<Harmonic> out = new ArrayList<>();
        if (!outputOn) {
            return out;
        }
        double peak = emfPeak();
        double f = frequency();
        boolean dc = false;
        for (Harmonic h : arbitraryLines) {
            if (h.k() * f > bandLimit) {
                continue;
            }
            Complex a = h.amplitude().multiply(peak);
            if (h.k() == 0) {
                a = a.add(emfOffset());
                dc = true;
            }
            out.add(new Harmonic(h.k(), a));
        }
        if (!dc && emfOffset() != 0) {
            out.add(0, new Harmonic(0, new Complex(emfOffset(), 0)));
        }
        return out;
    }

    @Override
    protected void reset() {
        waveform = Waveform.SINE;
        frequency = 1e3;
        amplitudeVpp = 0.1;
        offset = 0;
        loadOhm = 50;
        outputOn = false;
        arbitraryRate = 1e6; // the waveform memory keeps its points, as on most generators
    }

    double emfFactor() {
        if (personality == Personality.PEAK_EMF) {
            return 1.0; // its levels are the open-circuit EMF
        }
        return Double.isInfinite(loadOhm) ? 1.0 : (loadOhm + outputOhm) / loadOhm;
    }

    public synchronized boolean isOutputOn() {
        return outputOn;
    }

    public synchronized Waveform waveform() {
        return waveform;
    }

    /** The signal's repetition frequency: the set frequency, or an arbitrary waveform's rate over its points. */
    public synchronized double frequency() {
        return waveform == Waveform.ARBITRARY ? arbitraryRate / arbitraryPoints : frequency;
    }

    /** The repetition frequency the output really has, on the digitizer's time base. */
    public synchronized double outputFrequency() {
        return frequency() * (1 + timeBaseError);
    }

    /** Open-circuit peak EMF; zero while the output is off. */
    public synchronized double emfPeak() {
        return outputOn ? amplitudeVpp / 2 * emfFactor() : 0.0;
    }

    /** Open-circuit DC EMF; zero while the output is off. */
    public synchronized double emfOffset() {
        return outputOn ? offset * emfFactor() : 0.0;
    }

    public double outputOhm() {
        return outputOhm;
    }

    static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
