package org.lrbench.sim;

import java.util.Arrays;

/**
 * The {@code plus-minus-12} dialect of the simulated digitizer, a command tree of our own:
 * plus-minus spans in 1-2-5 steps from 5 mV to 50 V that round a request up, with their list, under
 * {@code INLet<n>}; a sample rate and a record count under {@code RECord}; a trigger with a source
 * only under {@code ARMing}; a capture started by {@code RECord:GO} whose end is polled with
 * {@code RECord:CONDition?} (RUN, then IDLE); 12-bit codes in big-endian 16-bit words with a fixed
 * scaling and no scale query under {@code TRANsfer}.
 */
final class PlusMinusDialect {
    /** The plus-minus spans: 1-2-5 from 5 mV to 50 V. */
    static final double[] PLUS_MINUS_RANGES = {0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50};

    private final SimDigitizer d;
    /** Set by a capture: the first condition query after it still finds it running. */
    private boolean running;

    private PlusMinusDialect(SimDigitizer d) {
        this.d = d;
    }

    static void install(SimDigitizer d) {
        new PlusMinusDialect(d).register();
    }

    private void register() {
        d.onReset(() -> running = false);
        d.on("INLet#:SPAN", false, c -> {
            c.expect(1, 1);
            double pm = c.number(0, 1e-6, 1e3, 1);
            double granted = PLUS_MINUS_RANGES[PLUS_MINUS_RANGES.length - 1];
            for (double r : PLUS_MINUS_RANGES) {
                if (r >= pm * (1 - 1e-9)) {
                    granted = r;
                    break;
                }
            }
            d.range[c.suffixUpTo(SimDigitizer.CHANNELS)] = 2 * granted;
            d.record = null;
            return null;
        });
        d.on("INLet#:SPAN", true, c -> SimDigitizer.nr3(d.range[c.suffixUpTo(SimDigitizer.CHANNELS)] / 2));
        d.on("INLet#:SPAN:STEPs", true, c -> {
            c.suffixUpTo(SimDigitizer.CHANNELS);
            StringBuilder sb = new StringBuilder();
            for (double r : PLUS_MINUS_RANGES) {
                sb.append(sb.length() == 0 ? "" : ",").append(SimDigitizer.nr3(r));
            }
            return sb.toString();
        });
        d.on("INLet#:SHIFt", false, c -> {
            c.expect(1, 1);
            d.offset[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.number(0, -SimDigitizer.MAX_RANGE, SimDigitizer.MAX_RANGE, 0);
            d.record = null;
            return null;
        });
        d.on("INLet#:COUPling", false, c -> {
            c.expect(1, 1);
            d.acCoupled[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.word(0, "AC", "DC").equals("AC");
            d.record = null;
            return null;
        });
        d.on("RECord:RATE", false, c -> {
            c.expect(1, 1);
            double rate = c.number(0, 1, 1 / SimDigitizer.CLOCK_INTERVAL, 1e6);
            d.interval = Math.max(1, Math.floor(1 / rate / SimDigitizer.CLOCK_INTERVAL + 1e-9)) * SimDigitizer.CLOCK_INTERVAL;
            d.record = null;
            return null;
        });
        d.on("RECord:RATE", true, c -> SimDigitizer.nr3(1 / d.interval));
        d.on("RECord:COUNt", false, c -> {
            c.expect(1, 1);
            d.points = (int) Math.round(c.number(0, 16, SimDigitizer.MAX_POINTS, 1000));
            d.record = null;
            return null;
        });
        d.on("RECord:COUNt", true, c -> Integer.toString(d.points));
        d.on("ARMing:SOURce", false, c -> {
            c.expect(1, 1);
            d.triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            d.triggerLevel = 0;
            d.triggerRising = true;
            return null;
        });
        d.on("RECord:GO", false, c -> {
            c.expect(0, 0);
            d.acquire();
            running = true;
            return null;
        });
        // the first condition query after RECord:GO still finds the capture running
        d.on("RECord:CONDition", true, c -> {
            if (running) {
                running = false;
                return "RUN";
            }
            return "IDLE";
        });
        d.on("TRANsfer:FORM", false, c -> {
            c.expect(1, 1);
            d.format = c.word(0, "WORDs", "TEXT").equals("WORD") ? SimDigitizer.Format.INT16 : SimDigitizer.Format.ASCII;
            d.littleEndian = false;
            Arrays.fill(d.encoded, null);
            return null;
        });
        d.on("TRANsfer:BLOCk", true, c -> d.encoded(d.channelParameter(c)));
    }
}
