package org.lrbench.measure;

import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Trace;

/**
 * Picks each channel's vertical range so its trace fills {@value #LOW_FILL} to {@value #HIGH_FILL}
 * of full scale (peak-to-peak over range), aiming at {@value #TARGET_FILL}; a clipped trace is
 * re-acquired on a range four times larger. A channel whose signal is too small for even the
 * smallest range is accepted at that range.
 */
public final class AutoRanger {
    static final double LOW_FILL = 0.5;
    static final double HIGH_FILL = 0.9;
    static final double TARGET_FILL = 0.7;
    static final int MAX_ACQUISITIONS = 10;

    private final Digitizer digitizer;
    private final RangeLimits[] limits;
    private final double[] range;

    /** Two channels, starting from the given ranges. */
    public AutoRanger(Digitizer digitizer, double startRange1, double startRange2) {
        this.digitizer = digitizer;
        this.limits = new RangeLimits[] {null, digitizer.rangeLimits(1), digitizer.rangeLimits(2)};
        this.range = new double[] {0, clamp(1, startRange1), clamp(2, startRange2)};
    }

    /** The traces of both channels once ranged, and how many acquisitions it took. */
    public record Capture(Trace sense, Trace part, int acquisitions) {
    }

    public Capture acquire() {
        double[] actual = new double[3];
        String last = "";
        for (int attempt = 1; attempt <= MAX_ACQUISITIONS; attempt++) {
            for (int ch = 1; ch <= 2; ch++) {
                actual[ch] = digitizer.setRange(ch, range[ch]);
            }
            digitizer.acquire();
            Trace t1 = digitizer.fetch(1);
            Trace t2 = digitizer.fetch(2);
            boolean ok1 = judge(1, t1, actual[1]);
            boolean ok2 = judge(2, t2, actual[2]);
            if (ok1 && ok2) {
                return new Capture(t1, t2, attempt);
            }
            last = describe(t1, actual[1]) + "; " + describe(t2, actual[2]);
        }
        throw new MeasurementException("auto-ranging did not settle after " + MAX_ACQUISITIONS
                + " acquisitions (" + last + ")");
    }

    /** Decides whether a trace is well ranged; if not, sets the next range to try. */
    private boolean judge(int ch, Trace t, double actual) {
        RangeLimits lim = limits[ch];
        if (t.clippedSamples() > 0) {
            if (actual >= lim.maxVolt()) {
                throw new MeasurementException("channel " + ch + " clips on its largest range "
                        + actual + " V: the signal is too large for the digitizer");
            }
            range[ch] = clamp(ch, actual * 4);
            return false;
        }
        double fill = t.peakToPeak() / actual;
        if (fill >= LOW_FILL && fill <= HIGH_FILL) {
            return true;
        }
        if (fill < LOW_FILL && actual <= lim.minVolt() * (1 + 1e-9)) {
            return true; // as sensitive as the instrument goes
        }
        double next = fill < 0.01 ? actual / 50 : t.peakToPeak() / TARGET_FILL;
        range[ch] = clamp(ch, next);
        return false;
    }

    /** Starts the next capture at ranges that put these peak voltages at the target fill. */
    public void expect(double peak1, double peak2) {
        range[1] = clamp(1, 2 * peak1 / TARGET_FILL);
        range[2] = clamp(2, 2 * peak2 / TARGET_FILL);
    }

    /** The ranges the last capture used, for starting the next point near them. */
    public double range(int ch) {
        return range[ch];
    }

    private double clamp(int ch, double r) {
        return Math.max(limits[ch].minVolt(), Math.min(limits[ch].maxVolt(), r));
    }

    private static String describe(Trace t, double range) {
        return "channel " + t.channel() + ": " + String.format(java.util.Locale.ROOT, "%.1f %% of %.4g V",
                100 * t.peakToPeak() / range, range) + (t.clippedSamples() > 0 ? ", clipped" : "");
    }
}
