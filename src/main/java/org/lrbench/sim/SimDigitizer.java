package org.lrbench.sim;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.sim.scpi.Call;
import org.lrbench.sim.scpi.ScpiDevice;
import org.lrbench.sim.scpi.ScpiFault;

/**
 * A simulated two-channel digitizer behind SCPI. On {@code INITiate} it samples the exact periodic
 * steady state of its inputs at the set interval from the trigger point, adds white Gaussian noise,
 * quantizes into the channel's range with the set resolution and clips at the range limits; the
 * record is then fetched as an IEEE 488.2 definite-length block in the set {@code FORMat}.
 */
public final class SimDigitizer extends ScpiDevice {

    /**
     * Which instrument the simulated digitizer plays. {@code generic}: SCPI-1999 SENSe/TRACe
     * subsystems, any range from 10 mV to 100 V peak-to-peak, a scale query, the bench's
     * resolution. {@code plus-minus-12}: CHANnel/ACQuire/DATA subsystems, plus-minus ranges in
     * 1-2-5 steps from 5 mV to 50 V that round a request up, a sample-rate setting, 12-bit codes in
     * 16-bit words with a fixed scaling and no scale query, a trigger with a source only, and an
     * acquisition whose end is polled. {@code per-division-8}: volts per division over 10
     * divisions in 1-2-5 steps from 1 mV to 10 V per division, a request rounded to the nearest step,
     * a seven-field layout reply (or one query per field) giving the scaling, 8-bit codes, a sample interval, an edge trigger in its
     * own subtree, and an acquisition that completes with {@code *OPC?}.
     */
    public enum Personality {
        GENERIC("generic"), PLUS_MINUS_12("plus-minus-12"), PER_DIVISION_8("per-division-8");

        private final String key;

        Personality(String key) {
            this.key = key;
        }

        public String key() {
            return key;
        }

        public static Map<String, Personality> byKey() {
            Map<String, Personality> m = new LinkedHashMap<>();
            for (Personality p : values()) {
                m.put(p.key, p);
            }
            return m;
        }
    }

    public static final int CHANNELS = 2;
    public static final double MIN_RANGE = 10e-3;
    public static final double MAX_RANGE = 100.0;
    public static final double CLOCK_INTERVAL = 1e-9;
    public static final int MAX_POINTS = 16 * 1024 * 1024;

    enum Format { ASCII, INT8, INT16, REAL32, REAL64 }

    private final AnalogInputs inputs;
    private final SimSettings settings;
    private final Random random;
    final double[] range = new double[CHANNELS + 1];
    final double[] offset = new double[CHANNELS + 1];
    final boolean[] acCoupled = new boolean[CHANNELS + 1];
    double interval;
    int points;
    String triggerSource;
    double triggerLevel;
    boolean triggerRising;
    Format format;
    boolean littleEndian;
    double[][] record;
    double firstSampleAfterTrigger;
    /** Encoded replies of the current record, per channel: the instrument's transfer buffer. */
    final Object[] encoded = new Object[CHANNELS + 1];
    private final Personality personality;
    /** What each dialect resets of its own on *RST. */
    private final java.util.List<Runnable> resets = new java.util.ArrayList<>();

    public SimDigitizer(AnalogInputs inputs, SimSettings settings) {
        super(switch (settings.digitizer()) {
            case PLUS_MINUS_12 -> "LRBENCH,SIM-DIGITIZER-PM12,SIM0012,0.1";
            case PER_DIVISION_8 -> "LRBENCH,SIM-DIGITIZER-DIV8,SIM0018,0.1";
            default -> "LRBENCH,SIM-DIGITIZER-2,SIM0002,0.1";
        });
        this.inputs = inputs;
        this.settings = settings;
        this.personality = settings.digitizer();
        this.random = new Random(settings.seed());
        reset();
        switch (personality) {
            case PLUS_MINUS_12 -> PlusMinusDialect.install(this);
            case PER_DIVISION_8 -> PerDivisionDialect.install(this);
            default -> GenericDialect.install(this);
        }
    }

    /** A dialect's command or query on this digitizer's settings. */
    void on(String pattern, boolean query, Handler handler) {
        register(pattern, query, handler);
    }

    /** A dialect's own state to reset on *RST. */
    void onReset(Runnable r) {
        resets.add(r);
        r.run();
    }

    /** The channel's record in the transfer format, encoded once per record. */
    Object encoded(int ch) {
        if (encoded[ch] == null) {
            encoded[ch] = encode(ch);
        }
        return encoded[ch];
    }

    @Override
    protected void reset() {
        if (resets != null) {
            resets.forEach(Runnable::run);
        }
        for (int ch = 1; ch <= CHANNELS; ch++) {
            range[ch] = 10.0;
            offset[ch] = 0;
            acCoupled[ch] = false;
        }
        interval = 1e-6;
        points = 1000;
        triggerSource = "IMM";
        triggerLevel = 0;
        triggerRising = true;
        format = Format.INT8;
        littleEndian = false;
        record = null;
    }

    int channelParameter(Call c) throws ScpiFault {
        c.expect(1, 1);
        int ch = c.word(0, "CH1", "CH2").equals("CH1") ? 1 : 2;
        if (record == null) {
            throw ScpiFault.stale("no acquisition since the last setting change");
        }
        return ch;
    }

    void acquire() {
        // arming and trigger latency, then the record itself takes its time (instruments that
        // answer at once, the default for tests and the coverage benchmark, take neither); the
        // simulator's computing of the record is hidden inside that time
        long started = System.nanoTime();
        double f = inputs.fundamentalHz();
        double bandLimit = 0.5 / interval;
        List<List<Harmonic>> lines = new ArrayList<>();
        lines.add(List.of()); // channels count from 1
        for (int ch = 1; ch <= CHANNELS; ch++) {
            lines.add(inputs.channel(ch, bandLimit));
            if (acCoupled[ch]) {
                lines.set(ch, lines.get(ch).stream().filter(h -> h.k() != 0).toList());
            }
        }
        Arrays.fill(encoded, null);
        double trigger = triggerTime(lines, f);
        // the sample clock runs free: the first sample after the trigger falls at a random fraction of
        // an interval, reported as the record's x origin, as a real digitizer's trigger interpolator does
        firstSampleAfterTrigger = random.nextDouble() * interval;
        double t0 = trigger + firstSampleAfterTrigger;
        record = new double[CHANNELS + 1][];
        for (int ch = 1; ch <= CHANNELS; ch++) {
            record[ch] = sample(lines.get(ch), f, t0, ch);
        }
        SimTiming timing = settings.timing();
        if (!timing.none()) {
            SimTiming.passSince(started, timing.armSecond() + points * interval);
        }
    }

    /** The trigger instant: the record starts there (no pre-trigger). */
    private double triggerTime(List<List<Harmonic>> lines, double f) {
        double period = 1.0 / f;
        double start = random.nextDouble() * period;
        if (triggerSource.equals("IMM")) {
            return start;
        }
        if (triggerSource.equals("EXT")) {
            return Math.ceil(start / period) * period;
        }
        List<Harmonic> signal = lines.get(triggerSource.equals("CH1") ? 1 : 2);
        int maxK = signal.stream().mapToInt(Harmonic::k).max().orElse(1);
        int grid = 64 * Math.max(1, maxK);
        double step = period / grid;
        double previous = value(signal, f, start) - triggerLevel;
        for (int i = 1; i <= grid; i++) {
            double t = start + i * step;
            double current = value(signal, f, t) - triggerLevel;
            boolean crossed = triggerRising ? previous < 0 && current >= 0 : previous > 0 && current <= 0;
            if (crossed) {
                return bisect(signal, f, t - step, t);
            }
            previous = current;
        }
        return start; // no edge at that level: the trigger times out and fires on its own (auto)
    }

    private double bisect(List<Harmonic> signal, double f, double lo, double hi) {
        double a = lo;
        double b = hi;
        double fa = value(signal, f, a) - triggerLevel;
        for (int i = 0; i < 80; i++) {
            double m = 0.5 * (a + b);
            double fm = value(signal, f, m) - triggerLevel;
            if ((fa < 0) == (fm < 0)) {
                a = m;
                fa = fm;
            } else {
                b = m;
            }
        }
        return 0.5 * (a + b);
    }

    static double value(List<Harmonic> lines, double f, double t) {
        double v = 0;
        for (Harmonic h : lines) {
            double theta = 2 * Math.PI * h.k() * f * t;
            Complex a = h.amplitude();
            v += a.getReal() * Math.cos(theta) - a.getImaginary() * Math.sin(theta);
        }
        return v;
    }

    /** Samples of block length between exact anchors of each line's phase in {@link #waveform}. */
    private static final int ANCHOR = 256;

    /**
     * The noiseless signal at t0 + n dt, n = 0 .. count - 1: each line's phasor turned sample by
     * sample (one complex multiplication instead of a sine and a cosine), its phase computed exactly
     * every {@value #ANCHOR} samples so rounding cannot accumulate (it stays near 1e-14 of the line).
     */
    static double[] waveform(List<Harmonic> lines, double f, double t0, double dt, int count) {
        double[] out = new double[count];
        for (Harmonic h : lines) {
            double w = 2 * Math.PI * h.k() * f;
            double ar = h.amplitude().getReal();
            double ai = h.amplitude().getImaginary();
            double cd = Math.cos(w * dt);
            double sd = Math.sin(w * dt);
            for (int start = 0; start < count; start += ANCHOR) {
                double theta = w * (t0 + start * dt);
                double c = Math.cos(theta);
                double sn = Math.sin(theta);
                int end = Math.min(count, start + ANCHOR);
                for (int i = start; i < end; i++) {
                    out[i] += ar * c - ai * sn;
                    double next = c * cd - sn * sd;
                    sn = sn * cd + c * sd;
                    c = next;
                }
            }
        }
        return out;
    }

    private double[] sample(List<Harmonic> lines, double f, double t0, int ch) {
        double[] out = new double[points];
        double lo = offset[ch] - range[ch] / 2;
        double hi = offset[ch] + range[ch] / 2;
        int bits = personality == Personality.PLUS_MINUS_12 ? 12 : settings.resolutionBits();
        double lsb = bits > 0 ? range[ch] / Math.pow(2, bits) : 0;
        double minCode = bits > 0 ? -Math.pow(2, bits - 1) : 0;
        double maxCode = bits > 0 ? Math.pow(2, bits - 1) - 1 : 0;
        double noise = settings.noiseVoltRms();
        double[] clean = waveform(lines, f, t0, interval, points);
        double gain = stageGain(ch, range[ch]);
        for (int n = 0; n < points; n++) {
            double v = clean[n] * gain;
            if (noise > 0) {
                v += noise * random.nextGaussian();
            }
            if (bits > 0) {
                double code = Math.rint((v - offset[ch]) / lsb);
                v = offset[ch] + Math.max(minCode, Math.min(maxCode, code)) * lsb;
            } else {
                v = Math.max(lo, Math.min(hi, v));
            }
            out[n] = v;
        }
        return out;
    }

    /**
     * The channel's gain on the front-end stage that serves this full-scale range: the stages are the
     * 1-2-5 steps (the smallest one holding the range), and each channel's gain on each stage is off by
     * an error drawn once from the bench's seed, uniformly within +/- the settings' spread.
     */
    public double stageGain(int ch, double fullScaleVolt) {
        double spread = settings.rangeGainSpread();
        if (spread == 0) {
            return 1;
        }
        int stage = stage(fullScaleVolt);
        long key = settings.errorSeed() * 1_000_003L + ch * 10_007L + stage;
        return 1 + spread * (2 * new Random(key).nextDouble() - 1);
    }

    /** The index of the smallest 1-2-5 step holding a full-scale range (1 V is 0, 2 V is 1, 0.5 V is -1). */
    static int stage(double fullScaleVolt) {
        double decade = Math.floor(Math.log10(fullScaleVolt) + 1e-9);
        double m = fullScaleVolt / Math.pow(10, decade);
        int step = m <= 1 + 1e-9 ? 0 : m <= 2 + 1e-9 ? 1 : m <= 5 + 1e-9 ? 2 : 3;
        return 3 * (int) decade + step;
    }

    private Object encode(int ch) {
        double[] v = record[ch];
        if (format == Format.ASCII) {
            StringBuilder sb = new StringBuilder(v.length * 16);
            for (int i = 0; i < v.length; i++) {
                if (i > 0) {
                    sb.append(',');
                }
                sb.append(nr3(v[i]));
            }
            return sb.toString();
        }
        int size = switch (format) {
            case INT8 -> 1;
            case INT16 -> 2;
            case REAL32 -> 4;
            default -> 8;
        };
        ByteBuffer data = ByteBuffer.allocate(v.length * size)
                .order(littleEndian ? ByteOrder.LITTLE_ENDIAN : ByteOrder.BIG_ENDIAN);
        double half = range[ch] / 2;
        for (double x : v) {
            double rel = x - offset[ch];
            switch (format) {
                case INT8 -> data.put((byte) clampCode(rel / (range[ch] / 256), 127));
                case INT16 -> data.putShort(personality == Personality.PLUS_MINUS_12
                        ? (short) clampCode(rel / (range[ch] / 4096), 2047)
                        : (short) clampCode(rel / (range[ch] / 65536), 32767));
                case REAL32 -> data.putFloat((float) x);
                default -> data.putDouble(Math.max(offset[ch] - half, Math.min(offset[ch] + half, x)));
            }
        }
        return block(data.array());
    }

    private static long clampCode(double code, int max) {
        return Math.max(-max - 1, Math.min(max, Math.round(code)));
    }

    /** An IEEE 488.2 definite-length arbitrary block: #, digit count, length, bytes. */
    static byte[] block(byte[] data) {
        String length = Integer.toString(data.length);
        byte[] header = ("#" + length.length() + length).getBytes(StandardCharsets.US_ASCII);
        byte[] out = new byte[header.length + data.length];
        System.arraycopy(header, 0, out, 0, header.length);
        System.arraycopy(data, 0, out, header.length, data.length);
        return out;
    }

    static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
