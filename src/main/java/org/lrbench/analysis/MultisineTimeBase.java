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
 * e is read from the record: each tone fitted on the record's first and last quarters, the phase it
 * gained from the first quarter's middle to the last's beyond what its design frequency gives is
 * 2 pi f e D (D the time between the middles), and e is the weighted least-squares slope of those
 * phase gains against 2 pi f D, each weighted by the inverse of its variance from the two fits. Tones are taken from
 * the lowest up and each phase gain unwrapped to the one the slope so far predicts, so a long record
 * whose top tone walks more than half a turn is read right. Channel 1 is read, and channel 2 too where
 * channel 1's reading is not sure to a tenth of a ppm (the current is lost in noise on an open
 * fixture); the surer one counts. No tone's frequency moves where
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

    /**
     * The tones as the record holds them: each design frequency times (1 + e), e read from channel 1 (the
     * current, clear on any part), or from channel 2 where channel 1's reading is less sure (an open fixture).
     */
    public static double[] tones(double[] channel1, double[] channel2, double intervalSecond, double[] tonesHz) {
        Estimate a = estimate(channel1, intervalSecond, tonesHz);
        Estimate best = a;
        if (!(a.uncertainty() <= CLEAR)) {
            Estimate b = estimate(channel2, intervalSecond, tonesHz);
            best = b.uncertainty() < a.uncertainty() ? b : a;
        }
        double e = best.error();
        if (!Double.isFinite(e) || !(Math.abs(e) <= FARTHEST)) {
            return tonesHz.clone();
        }
        return Arrays.stream(tonesHz).map(f -> f * (1 + e)).toArray();
    }

    /** A reading of e this sure needs no second channel's (a tenth of a ppm). */
    static final double CLEAR = 1e-7;

    /** e from one channel's record. */
    public static Estimate estimate(double[] y, double intervalSecond, double[] tonesHz) {
        // the record's first and last quarters: half the samples of its two halves and, their middles three
        // quarters of the record apart instead of one half, 9/8 of the halves' information on e
        int q = y.length / 4;
        int start = y.length - q;
        if (q <= 2 * tonesHz.length + 1) {
            return new Estimate(Double.NaN, Double.POSITIVE_INFINITY);
        }
        // the two quarters on two threads (the multisine's fit is on the whole part's critical path)
        java.util.concurrent.CompletableFuture<SineFitResult[]> later = java.util.concurrent.CompletableFuture
                .supplyAsync(() -> MultisineFit.fit(Arrays.copyOfRange(y, start, y.length), intervalSecond, tonesHz));
        SineFitResult[] first = MultisineFit.fit(Arrays.copyOfRange(y, 0, q), intervalSecond, tonesHz);
        SineFitResult[] second;
        try {
            second = later.join();
        } catch (java.util.concurrent.CompletionException e) {
            throw e.getCause() instanceof RuntimeException r ? r : e;
        }
        // between the two quarters' middles, and the last quarter's own time origin
        double d = intervalSecond * start;
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
            // each quarter's phase variance: its phasor's component variance over its amplitude squared
            double v = first[i].componentVariance() / (a1 * a1) + second[i].componentVariance() / (a2 * a2);
            if (!(v > 0) || !Double.isFinite(v)) {
                continue;
            }
            double x = 2 * Math.PI * tonesHz[i] * d;
            double gained = SineFit.phasor(second[i]).getArgument() - SineFit.phasor(first[i]).getArgument()
                    - 2 * Math.PI * tonesHz[i] * start * intervalSecond;
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
