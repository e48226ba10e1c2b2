package org.lrbench.sim;

/**
 * The {@code per-division-8} dialect of the simulated digitizer, a command tree of our own: volts
 * per division over {@value #DIVISIONS} divisions in 1-2-5 steps from 1 mV to 10 V per division (a
 * request rounded to the nearest step, the step in force read back) under {@code LANE<n>}; the
 * sample spacing (or the time per division, the instrument then choosing the spacing) and a record
 * length from a list (a request rounded up) under {@code TIMing}; an edge trigger under
 * {@code STARt}; a single capture that completes with {@code *OPC?} (or is polled with
 * {@code CAPTure:STATe?}: BUSY, then READY); the scaling as a seven-field
 * reply (or one query per field) and signed 8-bit codes under {@code TRANsfer}.
 */
final class PerDivisionDialect {
    /** Volts per division: 1-2-5 from 1 mV to 10 V. */
    static final double[] PER_DIVISION = {0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10};
    static final int DIVISIONS = 10;
    /** The record lengths; a request is rounded up (or to the longest). */
    static final int[] RECORD_LENGTHS = {1000, 2000, 5000, 10_000, 20_000, 50_000, 100_000, 200_000, 500_000, 1_000_000};

    private final SimDigitizer d;
    /** The time per division last set (0: the spacing was set instead). */
    private double timePerDivision;
    /** Set by a capture: the first state query after it still finds it busy. */
    private boolean busy;

    private PerDivisionDialect(SimDigitizer d) {
        this.d = d;
    }

    static void install(SimDigitizer d) {
        new PerDivisionDialect(d).register();
    }

    /** The spacing the instrument chooses to fill ten divisions with its record. */
    private double chosenInterval() {
        double clock = SimDigitizer.CLOCK_INTERVAL;
        return Math.max(1, Math.floor(DIVISIONS * timePerDivision / d.points / clock + 1e-9)) * clock;
    }

    private void register() {
        d.onReset(() -> {
            timePerDivision = 0;
            busy = false;
        });
        d.on("LANE#:DIVision", false, c -> {
            c.expect(1, 1);
            double perDiv = c.number(0, 1e-6, 1e3, 1);
            double best = PER_DIVISION[0];
            for (double x : PER_DIVISION) {
                if (Math.abs(Math.log(x / perDiv)) < Math.abs(Math.log(best / perDiv))) {
                    best = x;
                }
            }
            d.range[c.suffixUpTo(SimDigitizer.CHANNELS)] = DIVISIONS * best;
            d.record = null;
            return null;
        });
        d.on("LANE#:DIVision", true, c -> SimDigitizer.nr3(d.range[c.suffixUpTo(SimDigitizer.CHANNELS)] / DIVISIONS));
        d.on("LANE#:SHIFt", false, c -> {
            c.expect(1, 1);
            d.offset[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.number(0, -SimDigitizer.MAX_RANGE, SimDigitizer.MAX_RANGE, 0);
            d.record = null;
            return null;
        });
        d.on("LANE#:COUPling", false, c -> {
            c.expect(1, 1);
            d.acCoupled[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.word(0, "AC", "DC").equals("AC");
            d.record = null;
            return null;
        });
        d.on("TIMing:SPACing", false, c -> {
            c.expect(1, 1);
            double requested = c.number(0, SimDigitizer.CLOCK_INTERVAL, 1.0, 1e-6);
            d.interval = Math.max(1, Math.floor(requested / SimDigitizer.CLOCK_INTERVAL + 1e-9)) * SimDigitizer.CLOCK_INTERVAL;
            timePerDivision = 0;
            d.record = null;
            return null;
        });
        d.on("TIMing:SPACing", true, c -> SimDigitizer.nr3(d.interval));
        // or the time per division of a ten-division screen: the instrument then chooses the spacing
        d.on("TIMing:DIVision", false, c -> {
            c.expect(1, 1);
            timePerDivision = c.number(0, 1e-9, 100, 1e-3);
            d.interval = chosenInterval();
            d.record = null;
            return null;
        });
        d.on("TIMing:LENGth", false, c -> {
            c.expect(1, 1);
            double wanted = c.number(0, 16, SimDigitizer.MAX_POINTS, 1000);
            d.points = RECORD_LENGTHS[RECORD_LENGTHS.length - 1];
            for (int n : RECORD_LENGTHS) {
                if (n >= wanted) {
                    d.points = n;
                    break;
                }
            }
            if (timePerDivision > 0) {
                d.interval = chosenInterval();
            }
            d.record = null;
            return null;
        });
        d.on("TIMing:LENGth", true, c -> Integer.toString(d.points));
        d.on("STARt:SOURce", false, c -> {
            c.expect(1, 1);
            d.triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            return null;
        });
        d.on("STARt:THReshold", false, c -> {
            c.expect(1, 1);
            d.triggerLevel = c.number(0, -SimDigitizer.MAX_RANGE, SimDigitizer.MAX_RANGE, 0);
            return null;
        });
        d.on("STARt:DIRection", false, c -> {
            c.expect(1, 1);
            d.triggerRising = c.word(0, "RISing", "FALLing").equals("RIS");
            return null;
        });
        d.on("CAPTure:SINGle", false, c -> {
            c.expect(0, 0);
            d.acquire();
            busy = true;
            return null;
        });
        // the first state query after a capture still finds it busy
        d.on("CAPTure:STATe", true, c -> {
            c.expect(0, 0);
            if (busy) {
                busy = false;
                return "BUSY";
            }
            return "READY";
        });
        d.on("TRANsfer:XSTep", true, c -> SimDigitizer.nr3(d.interval));
        d.on("TRANsfer:YSTep", true, c -> SimDigitizer.nr3(d.range[d.channelParameter(c)] / 256));
        d.on("TRANsfer:YZERo", true, c -> SimDigitizer.nr3(d.offset[d.channelParameter(c)]));
        // the seven-field reply: points, x step, x zero, y step, y zero, y reference code, bits
        d.on("TRANsfer:FIELDs", true, c -> {
            int ch = d.channelParameter(c);
            return d.points + "," + SimDigitizer.nr3(d.interval) + "," + SimDigitizer.nr3(d.firstSampleAfterTrigger) + ","
                    + SimDigitizer.nr3(d.range[ch] / 256) + "," + SimDigitizer.nr3(d.offset[ch]) + ",0,8";
        });
        d.on("TRANsfer:BLOCk", true, c -> d.encoded(d.channelParameter(c)));
    }
}
