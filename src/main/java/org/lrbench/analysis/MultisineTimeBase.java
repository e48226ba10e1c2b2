package org.lrbench.analysis;

import java.util.Arrays;
import java.util.Comparator;

/**
 * The tones a multisine record really holds on the digitizer's time base. A generator without the
 * digitizer's reference clock plays its waveform at its sample rate times (1 + e), e a few ppm up to its
 * specification, so every tone is its design frequency times (1 + e). Over a record of duration T a
 * tone fitted at its design frequency walks 2 pi f e T radians: at 10 ppm the demo plan's 20 kHz tone
 * walks 0.06 rad, and the residual the fit counts as noise made U of the winding resistance 2.7 times
 * as large. The walk itself is common to both channels and cancels in Z = Rs V2 / V1.
 * <p>
 * e is read from the record: each tone fitted on its two halves, the phase it gained from the first
 * half's middle to the second's beyond what its design frequency gives is 2 pi f e D (D the time
 * between the middles), and e is the weighted least-squares slope of those phase gains against
 * 2 pi f D, each weighted by the inverse of its variance from the two half fits. Tones are taken from
 * the lowest up and each phase gain unwrapped to the one the slope so far predicts, so a long record
 * whose top tone walks more than half a turn is read right. Both channels are read and combined by
 * their variances (the current is lost in noise on an open fixture). No tone's frequency moves where
 * the estimate lands more than {@value #FARTHEST} from 0: no bench's time bases differ by that much.
 */
public final class MultisineTimeBase {

    /** The farthest a time-base difference may be, relative. */
    static final double FARTHEST = 1e-3;

    private MultisineTimeBase() {
    }

    /** The estimate of e and its standard uncertainty (NaN and infinite when nothing could be read). */
    public record Estimate(double error, double uncertainty) {
    }

    /** The tones as the record holds them: each design frequency times (1 + e) read from both channels. */
    public static double[] tones(double[] channel1, double[] channel2, double intervalSecond, double[] tonesHz) {
        Estimate a = estimate(channel1, intervalSecond, tonesHz);
        Estimate b = estimate(channel2, intervalSecond, tonesHz);
        double wa = weight(a);
        double wb = weight(b);
        if (!(wa + wb > 0)) {
            return tonesHz.clone();
        }
        double e = ((wa > 0 ? wa * a.error() : 0) + (wb > 0 ? wb * b.error() : 0)) / (wa + wb);
        if (!(Math.abs(e) <= FARTHEST)) {
            return tonesHz.clone();
        }
        return Arrays.stream(tonesHz).map(f -> f * (1 + e)).toArray();
    }

    private static double weight(Estimate e) {
        return Double.isFinite(e.error()) && e.uncertainty() > 0 && Double.isFinite(e.uncertainty())
                ? 1 / (e.uncertainty() * e.uncertainty()) : 0;
    }

    /** e from one channel's record. */
    public static Estimate estimate(double[] y, double intervalSecond, double[] tonesHz) {
        int n1 = y.length / 2;
        int n2 = y.length - n1;
        if (n1 <= 2 * tonesHz.length + 1 || n2 <= 2 * tonesHz.length + 1) {
            return new Estimate(Double.NaN, Double.POSITIVE_INFINITY);
        }
        SineFitResult[] first = MultisineFit.fit(Arrays.copyOfRange(y, 0, n1), intervalSecond, tonesHz);
        SineFitResult[] second = MultisineFit.fit(Arrays.copyOfRange(y, n1, y.length), intervalSecond, tonesHz);
        // between the two halves' middles
        double d = intervalSecond * (n1 + (n2 - 1) / 2.0 - (n1 - 1) / 2.0);
        Integer[] order = new Integer[tonesHz.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, Comparator.comparingDouble(i -> tonesHz[i]));
        double sxx = 0;
        double sxy = 0;
        for (int i : order) {
            double a1 = first[i].amplitude();
            double a2 = second[i].amplitude();
            if (!(a1 > 0) || !(a2 > 0)) {
                continue;
            }
            // each half's phase variance: its phasor's component variance over its amplitude squared
            double v = first[i].componentVariance() / (a1 * a1) + second[i].componentVariance() / (a2 * a2);
            if (!(v > 0) || !Double.isFinite(v)) {
                continue;
            }
            double x = 2 * Math.PI * tonesHz[i] * d;
            double gained = SineFit.phasor(second[i]).getArgument() - SineFit.phasor(first[i]).getArgument()
                    - 2 * Math.PI * tonesHz[i] * n1 * intervalSecond;
            double predicted = sxx > 0 ? x * sxy / sxx : 0;
            gained -= 2 * Math.PI * Math.rint((gained - predicted) / (2 * Math.PI));
            sxx += x * x / v;
            sxy += x * gained / v;
        }
        if (!(sxx > 0)) {
            return new Estimate(Double.NaN, Double.POSITIVE_INFINITY);
        }
        return new Estimate(sxy / sxx, 1 / Math.sqrt(sxx));
    }
}
