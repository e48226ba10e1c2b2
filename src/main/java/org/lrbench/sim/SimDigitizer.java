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

    /** The volts per division of the {@code per-division-8} personality: 1-2-5 from 1 mV to 10 V. */
    static final double[] PER_DIVISION = {0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10};
    static final int DIVISIONS = 10;

    /** The plus-minus ranges of the {@code plus-minus-12} personality: 1-2-5 from 5 mV to 50 V. */
    static final double[] PLUS_MINUS_RANGES = {0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50};
    public static final int CHANNELS = 2;
    public static final double MIN_RANGE = 10e-3;
    public static final double MAX_RANGE = 100.0;
    public static final double CLOCK_INTERVAL = 1e-9;
    public static final int MAX_POINTS = 16 * 1024 * 1024;

    private enum Format { ASCII, INT8, INT16, REAL32, REAL64 }

    private final AnalogInputs inputs;
    private final SimSettings settings;
    private final Random random;
    private final double[] range = new double[CHANNELS + 1];
    private final double[] offset = new double[CHANNELS + 1];
    private final boolean[] acCoupled = new boolean[CHANNELS + 1];
    private double interval;
    private int points;
    private String triggerSource;
    private double triggerLevel;
    private boolean triggerRising;
    private Format format;
    private boolean littleEndian;
    private double[][] record;
    private double firstSampleAfterTrigger;
    /** Encoded replies of the current record, per channel: the instrument's transfer buffer. */
    private final Object[] encoded = new Object[CHANNELS + 1];
    private final Personality personality;
    private boolean acquiring;

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
            case PLUS_MINUS_12 -> registerPlusMinus();
            case PER_DIVISION_8 -> registerPerDivision();
            default -> registerGeneric();
        }
    }

    /** The record lengths of the {@code per-division-8} personality; a request is rounded up (or to the longest). */
    static final int[] RECORD_LENGTHS = {1000, 2000, 5000, 10_000, 20_000, 50_000, 100_000, 200_000, 500_000, 1_000_000};

    private double timePerDivision;

    /** The interval the per-division personality chooses to fill ten divisions with its record. */
    private double chosenInterval() {
        return Math.max(1, Math.floor(DIVISIONS * timePerDivision / points / CLOCK_INTERVAL + 1e-9)) * CLOCK_INTERVAL;
    }

    /** The {@code per-division-8} dialect. */
    private void registerPerDivision() {
        register("CHANnel#:SCALe", false, c -> {
            c.expect(1, 1);
            double perDiv = c.number(0, 1e-6, 1e3, 1);
            double best = PER_DIVISION[0];
            for (double d : PER_DIVISION) {
                if (Math.abs(Math.log(d / perDiv)) < Math.abs(Math.log(best / perDiv))) {
                    best = d;
                }
            }
            range[c.suffixUpTo(CHANNELS)] = DIVISIONS * best;
            record = null;
            return null;
        });
        register("CHANnel#:SCALe", true, c -> nr3(range[c.suffixUpTo(CHANNELS)] / DIVISIONS));
        registerChannelOffsetAndCoupling();
        register("ACQuire:SINTerval", false, c -> {
            c.expect(1, 1);
            double requested = c.number(0, CLOCK_INTERVAL, 1.0, 1e-6);
            interval = Math.max(1, Math.floor(requested / CLOCK_INTERVAL + 1e-9)) * CLOCK_INTERVAL;
            record = null;
            return null;
        });
        register("ACQuire:SINTerval", true, c -> nr3(interval));
        // or the time per division of a ten-division screen: the instrument then chooses the interval
        register("TIMebase:SCALe", false, c -> {
            c.expect(1, 1);
            timePerDivision = c.number(0, 1e-9, 100, 1e-3);
            interval = chosenInterval();
            record = null;
            return null;
        });
        register("ACQuire:POINts", false, c -> {
            c.expect(1, 1);
            double wanted = c.number(0, 16, MAX_POINTS, 1000);
            points = RECORD_LENGTHS[RECORD_LENGTHS.length - 1];
            for (int n : RECORD_LENGTHS) {
                if (n >= wanted) {
                    points = n;
                    break;
                }
            }
            if (timePerDivision > 0) {
                interval = chosenInterval();
            }
            record = null;
            return null;
        });
        register("DATA:XSTep", true, c -> nr3(interval));
        register("DATA:YSTep", true, c -> nr3(range[channelParameter(c)] / 256));
        register("DATA:YZERo", true, c -> nr3(offset[channelParameter(c)]));
        register("ACQuire:POINts", true, c -> Integer.toString(points));
        register("TRIGger:EDGE:SOURce", false, c -> {
            c.expect(1, 1);
            triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            return null;
        });
        register("TRIGger:EDGE:LEVel", false, c -> {
            c.expect(1, 1);
            triggerLevel = c.number(0, -MAX_RANGE, MAX_RANGE, 0);
            return null;
        });
        register("TRIGger:EDGE:SLOPe", false, c -> {
            c.expect(1, 1);
            triggerRising = c.word(0, "POSitive", "NEGative").equals("POS");
            return null;
        });
        register("ACQuire:ONCE", false, c -> {
            c.expect(0, 0);
            acquire();
            return null;
        });
        // our own layout reply: points, x step, x zero, y step, y zero, y reference code, bits
        register("DATA:LAYout", true, c -> {
            int ch = channelParameter(c);
            return points + "," + nr3(interval) + "," + nr3(firstSampleAfterTrigger) + "," + nr3(range[ch] / 256) + ","
                    + nr3(offset[ch]) + ",0,8";
        });
        register("DATA:FETCh", true, c -> {
            int ch = channelParameter(c);
            if (encoded[ch] == null) {
                encoded[ch] = encode(ch);
            }
            return encoded[ch];
        });
    }

    /** CHANnel subsystem offset and coupling, shared by the personalities with that subsystem. */
    private void registerChannelOffsetAndCoupling() {
        register("CHANnel#:OFFSet", false, c -> {
            c.expect(1, 1);
            offset[c.suffixUpTo(CHANNELS)] = c.number(0, -MAX_RANGE, MAX_RANGE, 0);
            record = null;
            return null;
        });
        register("CHANnel#:COUPling", false, c -> {
            c.expect(1, 1);
            acCoupled[c.suffixUpTo(CHANNELS)] = c.word(0, "AC", "DC").equals("AC");
            record = null;
            return null;
        });
    }

    /** The {@code plus-minus-12} dialect. */
    private void registerPlusMinus() {
        register("CHANnel#:RANGe", false, c -> {
            c.expect(1, 1);
            double pm = c.number(0, 1e-6, 1e3, 1);
            double granted = PLUS_MINUS_RANGES[PLUS_MINUS_RANGES.length - 1];
            for (double r : PLUS_MINUS_RANGES) {
                if (r >= pm * (1 - 1e-9)) {
                    granted = r;
                    break;
                }
            }
            range[c.suffixUpTo(CHANNELS)] = 2 * granted;
            record = null;
            return null;
        });
        register("CHANnel#:RANGe", true, c -> nr3(range[c.suffixUpTo(CHANNELS)] / 2));
        register("CHANnel#:RANGe:LIST", true, c -> {
            c.suffixUpTo(CHANNELS);
            StringBuilder sb = new StringBuilder();
            for (double r : PLUS_MINUS_RANGES) {
                sb.append(sb.length() == 0 ? "" : ",").append(nr3(r));
            }
            return sb.toString();
        });
        registerChannelOffsetAndCoupling();
        register("ACQuire:SRATe", false, c -> {
            c.expect(1, 1);
            double rate = c.number(0, 1, 1 / CLOCK_INTERVAL, 1e6);
            interval = Math.max(1, Math.floor(1 / rate / CLOCK_INTERVAL + 1e-9)) * CLOCK_INTERVAL;
            record = null;
            return null;
        });
        register("ACQuire:SRATe", true, c -> nr3(1 / interval));
        register("ACQuire:POINts", false, c -> {
            c.expect(1, 1);
            points = (int) Math.round(c.number(0, 16, MAX_POINTS, 1000));
            record = null;
            return null;
        });
        register("ACQuire:POINts", true, c -> Integer.toString(points));
        register("TRIGger:SOURce", false, c -> {
            c.expect(1, 1);
            triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            triggerLevel = 0;
            triggerRising = true;
            return null;
        });
        register("ACQuire:ARM", false, c -> {
            c.expect(0, 0);
            acquire();
            acquiring = true;
            return null;
        });
        // the first status query after ACQuire:ARM still finds the acquisition running
        register("ACQuire:STATe", true, c -> {
            if (acquiring) {
                acquiring = false;
                return "RUN";
            }
            return "STOP";
        });
        register("DATA:ENCoding", false, c -> {
            c.expect(1, 1);
            format = c.word(0, "WORD", "ASCii").equals("WORD") ? Format.INT16 : Format.ASCII;
            littleEndian = false;
            Arrays.fill(encoded, null);
            return null;
        });
        register("DATA:FETCh", true, c -> {
            int ch = channelParameter(c);
            if (encoded[ch] == null) {
                encoded[ch] = encode(ch);
            }
            return encoded[ch];
        });
    }

    /** The generic SCPI-1999 dialect. */
    private void registerGeneric() {
        register("SENSe#:VOLTage[:DC]:RANGe[:UPPer]", false, c -> {
            c.expect(1, 1);
            range[c.suffixUpTo(CHANNELS)] = c.number(0, MIN_RANGE, MAX_RANGE, 10.0);
            record = null;
            return null;
        });
        register("SENSe#:VOLTage[:DC]:RANGe[:UPPer]", true, c -> {
            c.expect(0, 1);
            int ch = c.suffixUpTo(CHANNELS);
            return nr3(c.count() == 0 ? range[ch] : c.number(0, MIN_RANGE, MAX_RANGE, 10.0));
        });
        register("SENSe#:VOLTage[:DC]:OFFSet", false, c -> {
            c.expect(1, 1);
            offset[c.suffixUpTo(CHANNELS)] = c.number(0, -MAX_RANGE, MAX_RANGE, 0);
            record = null;
            return null;
        });
        register("SENSe#:VOLTage[:DC]:OFFSet", true, c -> nr3(offset[c.suffixUpTo(CHANNELS)]));
        register("INPut#:COUPling", false, c -> {
            c.expect(1, 1);
            acCoupled[c.suffixUpTo(CHANNELS)] = c.word(0, "AC", "DC").equals("AC");
            record = null;
            return null;
        });
        register("INPut#:COUPling", true, c -> acCoupled[c.suffixUpTo(CHANNELS)] ? "AC" : "DC");
        register("[SENSe#]:SWEep:TINTerval", false, c -> {
            c.expect(1, 1);
            double requested = c.number(0, CLOCK_INTERVAL, 1.0, 1e-6);
            // the clock divides down by whole numbers: the interval is rounded down to a multiple of it
            interval = Math.max(1, Math.floor(requested / CLOCK_INTERVAL + 1e-9)) * CLOCK_INTERVAL;
            record = null;
            return null;
        });
        register("[SENSe#]:SWEep:TINTerval", true, c -> nr3(interval));
        register("[SENSe#]:SWEep:POINts", false, c -> {
            c.expect(1, 1);
            points = (int) Math.round(c.number(0, 16, MAX_POINTS, 1000));
            record = null;
            return null;
        });
        register("[SENSe#]:SWEep:POINts", true, c -> Integer.toString(points));
        register("TRIGger[:SEQuence]:SOURce", false, c -> {
            c.expect(1, 1);
            triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            return null;
        });
        register("TRIGger[:SEQuence]:SOURce", true, c -> triggerSource);
        register("TRIGger[:SEQuence]:LEVel", false, c -> {
            c.expect(1, 1);
            triggerLevel = c.number(0, -MAX_RANGE, MAX_RANGE, 0);
            return null;
        });
        register("TRIGger[:SEQuence]:LEVel", true, c -> nr3(triggerLevel));
        register("TRIGger[:SEQuence]:SLOPe", false, c -> {
            c.expect(1, 1);
            triggerRising = c.word(0, "POSitive", "NEGative").equals("POS");
            return null;
        });
        register("TRIGger[:SEQuence]:SLOPe", true, c -> triggerRising ? "POS" : "NEG");
        register("FORMat[:DATA]", false, c -> {
            c.expect(1, 2);
            String type = c.word(0, "ASCii", "INTeger", "REAL");
            int length = c.count() > 1 ? (int) c.number(1, 8, 64, 8) : (type.equals("REAL") ? 32 : 8);
            Arrays.fill(encoded, null);
            format = switch (type + length) {
                case "ASC8" -> Format.ASCII;
                case "INT8" -> Format.INT8;
                case "INT16" -> Format.INT16;
                case "REAL32" -> Format.REAL32;
                case "REAL64" -> Format.REAL64;
                default -> throw ScpiFault.illegalValue("FORMat " + type + "," + length);
            };
            return null;
        });
        register("FORMat:BORDer", false, c -> {
            c.expect(1, 1);
            littleEndian = c.word(0, "NORMal", "SWAPped").equals("SWAP");
            Arrays.fill(encoded, null);
            return null;
        });
        register("INITiate[:IMMediate]", false, c -> {
            c.expect(0, 0);
            acquire();
            return null;
        });
        register("TRACe:SCALe", true, c -> {
            int ch = channelParameter(c);
            double yIncrement = switch (format) {
                case INT8 -> range[ch] / 256;
                case INT16 -> range[ch] / 65536;
                default -> 1.0;
            };
            double yOrigin = format == Format.INT8 || format == Format.INT16 ? offset[ch] : 0.0;
            return nr3(interval) + "," + nr3(firstSampleAfterTrigger) + "," + nr3(yIncrement) + "," + nr3(yOrigin);
        });
        register("TRACe[:DATA]", true, c -> {
            int ch = channelParameter(c);
            if (encoded[ch] == null) {
                encoded[ch] = encode(ch);
            }
            return encoded[ch];
        });
    }

    @Override
    protected void reset() {
        acquiring = false;
        timePerDivision = 0;
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

    private int channelParameter(Call c) throws ScpiFault {
        c.expect(1, 1);
        int ch = c.word(0, "CH1", "CH2").equals("CH1") ? 1 : 2;
        if (record == null) {
            throw ScpiFault.stale("no acquisition since the last setting change");
        }
        return ch;
    }

    private void acquire() {
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
        for (int n = 0; n < points; n++) {
            double v = clean[n];
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

    private static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
