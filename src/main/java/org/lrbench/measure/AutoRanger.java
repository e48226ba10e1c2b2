package org.lrbench.measure;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.function.Predicate;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Trace;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Picks each channel's vertical range, for any range set an instrument has: continuous, or fixed
 * steps (1-2-5, say) to which it rounds a request up, down or to the nearest. A trace is judged by
 * its excursion, the farthest sample from the channel's offset, against half the range, so a
 * signal off centre or lopsided is judged against both range limits.
 * <ul>
 * <li>Clipped, or beyond {@value #HIGH_FILL} of the half range: too small; the next request is
 * larger (ten times after clipping, which tells nothing of the size; else what puts the excursion at {@value #TARGET_FILL}), and
 * a granted range already known too small is stepped past without acquiring.</li>
 * <li>Between {@value #LOW_FILL} and {@value #HIGH_FILL}: settled.</li>
 * <li>Below {@value #LOW_FILL}: the range that would put the excursion at {@value #TARGET_FILL}
 * is requested; when the instrument grants nothing smaller than the present range (or only a range
 * known too small), the present capture is kept: it is the fill the range set allows.</li>
 * </ul>
 * No request is made twice in one capture, and when ranging does not settle the error names every
 * range asked for and granted. Every request is one of the instrument's ranges where it declares them
 * (so it is granted as asked, one capture, however the instrument rounds), else a value of the
 * {@link RangeLadder}.
 */
public final class AutoRanger {
    private static final Logger LOG = LoggerFactory.getLogger(AutoRanger.class);
    static final double LOW_FILL = 0.5;
    static final double HIGH_FILL = 0.9;
    static final double TARGET_FILL = 0.75;
    static final int MAX_ACQUISITIONS = 10;
    private Trace[] probed;
    private static final double SAME = 1e-9;

    private final Digitizer digitizer;
    private final RangeLimits[] limits;
    private final double[] request;
    private final double[] tooSmall = new double[3];
    /** The smallest range known to hold the last excursion within {@value #HIGH_FILL}: asked past before acquiring. */
    private final double[] need = new double[3];
    private final double[] holds = new double[3];
    private final double[] lastAsked = {Double.NaN, Double.NaN, Double.NaN};
    private final double[] lastGranted = new double[3];
    /** The present requests went with the time base: the next capture starts on them. */
    private boolean preAsked;
    private final List<List<String>> history = List.of(new ArrayList<>(), new ArrayList<>(), new ArrayList<>());
    private final List<Set<Double>> asked = List.of(new HashSet<>(), new HashSet<>(), new HashSet<>());

    /** Two channels, starting from the given full-scale (peak-to-peak) ranges. */
    public AutoRanger(Digitizer digitizer, double startRange1, double startRange2) {
        this.digitizer = digitizer;
        this.limits = new RangeLimits[] {null, digitizer.rangeLimits(1), digitizer.rangeLimits(2)};
        this.request = new double[] {0, clamp(1, startRange1), clamp(2, startRange2)};
    }

    /** The traces of both channels once ranged, and how many acquisitions it took. */
    public record Capture(Trace sense, Trace part, int acquisitions) {
    }

    public Capture acquire() {
        begin();
        return attempts(1);
    }

    /**
     * A capture whose first acquisition goes in one message with the time base and both channels'
     * present requests ({@link Digitizer#setTimingAndRangesThenAcquire}). The time base in effect
     * goes into {@code timing}; when {@code enough} refuses it the acquisition is void and null is
     * returned (nothing fetched): the caller sets a time base that holds and captures again.
     */
    Capture acquireWithTiming(double intervalSecond, int points, Predicate<Timing> enough, Timing[] timing) {
        double[] g = new double[2];
        timing[0] = digitizer.setTimingAndRangesThenAcquire(intervalSecond, points, request[1], request[2], g);
        for (int ch = 1; ch <= 2; ch++) {
            lastAsked[ch] = request[ch];
            lastGranted[ch] = checked(ch, request[ch], g[ch - 1]);
        }
        preAsked = true;
        begin();
        if (!enough.test(timing[0])) {
            return null;
        }
        Trace[] both = digitizer.fetchBoth();
        Trace t1 = both[0];
        Trace t2 = both[1];
        boolean ok1 = judge(1, t1, lastGranted[1]);
        boolean ok2 = judge(2, t2, lastGranted[2]);
        if (ok1 && ok2) {
            return new Capture(t1, t2, 1);
        }
        return attempts(2);
    }

    /** Clears what one capture learns; the requests asked with the time base count as asked. */
    private void begin() {
        for (int ch = 1; ch <= 2; ch++) {
            tooSmall[ch] = 0;
            need[ch] = 0;
            holds[ch] = Double.POSITIVE_INFINITY;
            history.get(ch).clear();
            asked.get(ch).clear();
            if (preAsked) {
                // asked together with the time base just before this capture
                asked.get(ch).add(lastAsked[ch]);
                history.get(ch).add("asked " + volts(lastAsked[ch]) + " got " + volts(lastGranted[ch]));
            }
        }
        preAsked = false;
    }

    /** Acquisitions from attempt {@code first} on, until both channels are judged settled. */
    private Capture attempts(int first) {
        double[] granted = new double[3];
        for (int attempt = first; attempt <= MAX_ACQUISITIONS; attempt++) {
            askBoth();
            for (int ch = 1; ch <= 2; ch++) {
                granted[ch] = set(ch);
            }
            digitizer.acquire();
            Trace[] both = digitizer.fetchBoth();
            Trace t1 = both[0];
            Trace t2 = both[1];
            // both channels are judged on every acquisition, so the capture returned is one whole acquisition
            boolean ok1 = judge(1, t1, granted[1]);
            boolean ok2 = judge(2, t2, granted[2]);
            if (ok1 && ok2) {
                if (LOG.isDebugEnabled()) {
                    LOG.debug("ranged in {} acquisition(s): channel 1 {}; channel 2 {}", attempt,
                            String.join(", ", history.get(1)), String.join(", ", history.get(2)));
                }
                return new Capture(t1, t2, attempt);
            }
        }
        throw new MeasurementException("auto-ranging did not settle after " + MAX_ACQUISITIONS + " acquisitions: "
                + "channel 1 " + String.join(", ", history.get(1)) + "; channel 2 " + String.join(", ", history.get(2)));
    }

    /**
     * Asks for the time base and both channels' present requests in one message where the driver
     * can; the capture that follows then starts on ranges already asked for.
     */
    Timing askWithTiming(double intervalSecond, int points) {
        double[] g = new double[2];
        Timing t = digitizer.setTimingAndRanges(intervalSecond, points, request[1], request[2], g);
        for (int ch = 1; ch <= 2; ch++) {
            lastAsked[ch] = request[ch];
            lastGranted[ch] = checked(ch, request[ch], g[ch - 1]);
        }
        preAsked = true;
        return t;
    }

    /**
     * Sets the channel's requested range, stepping past any granted range known to be too small before
     * acquiring: one seen to clip or overfill, or one below what the last excursion needs (an instrument
     * that rounds a request down or to the nearest of its ranges can grant less than was asked: a round
     * trip more, not a capture more).
     */
    private double set(int ch) {
        double g = ask(ch, request[ch]);
        for (int step = 0; step < 40 && (g <= tooSmall[ch] * (1 + SAME) || g < need[ch] * (1 - SAME))
                && g < limits[ch].maxVolt() * (1 - SAME); step++) {
            request[ch] = clamp(ch, Math.max(request[ch], g) * 1.5);
            g = ask(ch, request[ch]);
        }
        return g;
    }

    /** When both channels' requests changed, asks for them together (one message where the driver can). */
    private void askBoth() {
        if (request[1] == lastAsked[1] || request[2] == lastAsked[2]) {
            return;
        }
        double[] g = digitizer.setRanges(request[1], request[2]);
        for (int ch = 1; ch <= 2; ch++) {
            asked.get(ch).add(request[ch]);
            history.get(ch).add("asked " + volts(request[ch]) + " got " + volts(g[ch - 1]));
            lastAsked[ch] = request[ch];
            lastGranted[ch] = checked(ch, request[ch], g[ch - 1]);
        }
    }

    /**
     * A granted range, refused where it contradicts what the driver declares: a range from its list asked
     * exactly and another granted, or a grant on the wrong side of the request for its declared rounding.
     * Left unchecked, the ranger would plan on ranges the instrument does not give.
     */
    private double checked(int ch, double asked, double granted) {
        RangeLimits lim = limits[ch];
        boolean listed = lim.steps().stream().anyMatch(s -> Math.abs(s - asked) <= 1e-6 * s);
        if (listed && Math.abs(granted - asked) > 1e-6 * asked) {
            throw new org.lrbench.instrument.InstrumentException("the digitizer granted channel " + ch + " a range of "
                    + volts(granted) + " when asked for " + volts(asked) + ", one of the ranges its driver lists"
                    + " (vertical.ranges): the list, or the vertical setting's unit, is not the instrument's");
        }
        if (!listed && lim.rounding() != null && !lim.rounding().allows(asked, granted)) {
            throw new org.lrbench.instrument.InstrumentException("the digitizer granted channel " + ch + " a range of "
                    + volts(granted) + " when asked for " + volts(asked) + ", but its driver declares vertical.rounding: "
                    + lim.rounding().name().toLowerCase(Locale.ROOT) + ": the declaration is not the instrument's");
        }
        return granted;
    }

    private double ask(int ch, double r) {
        if (r == lastAsked[ch]) {
            return lastGranted[ch]; // the instrument is on it already
        }
        asked.get(ch).add(r);
        double g = checked(ch, r, digitizer.setRange(ch, r));
        history.get(ch).add("asked " + volts(r) + " got " + volts(g));
        lastAsked[ch] = r;
        lastGranted[ch] = g;
        return g;
    }

    /** Whether the channel's trace on range {@code g} is settled; if not, sets the next request. */
    private boolean judge(int ch, Trace t, double g) {
        RangeLimits lim = limits[ch];
        double half = g / 2;
        double e = t.excursion();
        boolean clipped = t.clippedSamples() > 0 || e >= half * (1 - SAME);
        double fill = e / half;
        note(ch, clipped ? "clipped" : String.format(Locale.ROOT, "%.0f %% filled", 100 * fill));
        if (clipped || fill > HIGH_FILL) {
            if (g >= lim.maxVolt() * (1 - SAME)) {
                if (clipped) {
                    throw new MeasurementException("channel " + ch + " clips on its largest range " + g
                            + " V: the signal is too large for the digitizer (" + String.join(", ", history.get(ch)) + ")");
                }
                return true; // held by the largest range, with less margin than wished
            }
            tooSmall[ch] = Math.max(tooSmall[ch], g);
            if (!clipped) {
                need[ch] = Math.max(need[ch], 2 * e / HIGH_FILL);
            }
            // clipping tells nothing of the size: ten times larger, but no larger than a range seen to hold it
            double next = clipped ? Math.min(g * 10, holds[ch]) : 2 * e / TARGET_FILL;
            request[ch] = fresh(ch, clamp(ch, Math.max(next, g * 1.25)));
            return false;
        }
        holds[ch] = Math.min(holds[ch], g);
        if (fill >= LOW_FILL || g <= lim.minVolt() * (1 + SAME)) {
            return true;
        }
        if (!lim.steps().isEmpty()) {
            // the instrument's ranges are known: the one that holds the excursion at the target fill is
            // asked for only when it is smaller than the present one (no round trip to learn otherwise)
            double r = clamp(ch, 2 * e / TARGET_FILL);
            if (r >= g * (1 - SAME) || r <= tooSmall[ch] * (1 + SAME)) {
                return true;
            }
            request[ch] = r;
            return false;
        }
        // ask for the range that would put the excursion at the target fill, stepping up past any
        // range the instrument grants that could not hold what was just measured (a round trip each,
        // no acquisition); the instrument's answer tells whether its range set has anything between
        double r = fresh(ch, clamp(ch, 2 * e / TARGET_FILL));
        double got = ask(ch, r);
        for (int step = 0; step < 40 && (got * HIGH_FILL / 2 < e || got <= tooSmall[ch] * (1 + SAME))
                && got < g * (1 - SAME); step++) {
            r = fresh(ch, clamp(ch, r * 1.25));
            got = ask(ch, r);
        }
        if (got >= g * (1 - SAME)) {
            // nothing between: this capture has the fill the range set allows; the channel goes back
            // to its range if the other channel needs another acquisition
            return true;
        }
        request[ch] = r;
        return false;
    }

    /** A request not yet made in this capture: grown a little until it is new. */
    private double fresh(int ch, double r) {
        double x = r;
        for (int i = 0; i < 20 && asked.get(ch).contains(x) && x < limits[ch].maxVolt(); i++) {
            x = clamp(ch, x * 1.1);
        }
        return x;
    }

    private static String volts(double v) {
        return new BigDecimal(String.format(Locale.ROOT, "%.4g", v)).stripTrailingZeros().toPlainString() + " V";
    }

    private void note(int ch, String outcome) {
        List<String> h = history.get(ch);
        if (!h.isEmpty()) {
            h.set(h.size() - 1, h.get(h.size() - 1) + " (" + outcome + ")");
        }
    }

    /**
     * One acquisition on the current requests, not judged: the next capture starts at ranges that put
     * what it saw at the target fill (ten times up where it clipped). For a long record, ranged on a
     * short one first, so that the long one is usually taken once.
     *
     * @return 1, the acquisitions it took
     */
    public int probe() {
        askBoth();
        double[] granted = {0, set(1), set(2)};
        digitizer.acquire();
        Trace[] both = digitizer.fetchBoth();
        probed = both;
        for (int ch = 1; ch <= 2; ch++) {
            Trace t = both[ch - 1];
            boolean clipped = t.clippedSamples() > 0 || t.excursion() >= granted[ch] / 2 * (1 - SAME);
            request[ch] = clamp(ch, clipped ? granted[ch] * 10 : 2 * t.excursion() / TARGET_FILL);
        }
        return 1;
    }

    /** Both channels' traces of the last {@link #probe}, or null before one. */
    Trace[] probed() {
        return probed;
    }

    /** The channel's smallest range, peak-to-peak volts. */
    double minRange(int ch) {
        return limits[ch].minVolt();
    }

    /** Starts the next capture at ranges that put these peak voltages at the target fill. */
    public void expect(double peak1, double peak2) {
        request[1] = clamp(1, 2 * peak1 / TARGET_FILL);
        request[2] = clamp(2, 2 * peak2 / TARGET_FILL);
    }

    /** The range the next capture starts from, for starting the next point near it. */
    public double range(int ch) {
        return request[ch];
    }

    /**
     * A request within the channel's limits: the instrument's own range that holds it where its ranges
     * are known (asked exactly, it is granted as asked however the instrument rounds), else a value of
     * the range ladder.
     */
    private double clamp(int ch, double r) {
        if (!limits[ch].steps().isEmpty()) {
            return limits[ch].stepAtLeast(Math.max(limits[ch].minVolt(), r));
        }
        return Math.max(limits[ch].minVolt(), Math.min(limits[ch].maxVolt(), RangeLadder.up(r)));
    }
}
