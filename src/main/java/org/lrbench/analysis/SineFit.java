package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.DecompositionSolver;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;

/**
 * The three-parameter least-squares sine fit of IEEE Std 1057 (4.1.3.1): with the frequency known,
 * find A, B, C minimising the squared error of {@code y[n] - (A cos(w t[n]) + B sin(w t[n]) + C)},
 * with {@code t[n] = n * dt} from the first sample. The normal equations need sums of the design
 * alone (closed forms, geometric series) and sums of the data against it, taken in a single pass
 * by four interleaved Goertzel recurrences restarted every {@value #ANCHOR} samples and turned to
 * their place with exact cosines: a few multiply-adds per sample, with the rounding bounded.
 */
public final class SineFit {
    static final int ANCHOR = 256;

    private SineFit() {
    }

    /**
     * Fits samples taken every {@code intervalSecond} at a known {@code frequencyHz}.
     *
     * @throws IllegalArgumentException for fewer than 4 samples or a record too short to tell the
     *         sine from the offset
     */
    public static SineFitResult fit(double[] y, double intervalSecond, double frequencyHz) {
        int n = y.length;
        if (n < 4) {
            throw new IllegalArgumentException("a sine fit needs at least 4 samples, got " + n);
        }
        double omegaDt = 2 * Math.PI * frequencyHz * intervalSecond;
        // the sums that involve only the design (cos, sin, 1) have closed forms as geometric series;
        // the loop accumulates only what involves the data
        double[] design = designSums(n, omegaDt);
        double scc = design[0];
        double scs = design[1];
        double sc = design[2];
        double ss = design[3];
        // the data sums sum y cos(n p), sum y sin(n p) by the Goertzel recurrence (Goertzel, 1958):
        // s_m = x_m + 2 cos(q) s_(m-1) - s_(m-2) gives sum_m x_m exp(-j q m) =
        // exp(-j q (M-1)) (s_(M-1) - exp(-j q) s_(M-2)). Four lanes take every fourth sample
        // (q = 4 p), so their recurrences run side by side; each block of ANCHOR samples starts afresh
        // and is turned to its place with exact cosines and sines, which bounds the rounding.
        double q = 4 * omegaDt;
        double k = 2 * Math.cos(q);
        double cq = Math.cos(q);
        double sq = Math.sin(q);
        double syc = 0;
        double sys = 0;
        double sy0 = 0, sy1 = 0, sy2 = 0, sy3 = 0;
        double syy0 = 0, syy1 = 0, syy2 = 0, syy3 = 0;
        // the turns every full block shares: back by q (M - 1), and each lane's own start
        int full = ANCHOR / 4;
        double cBack = Math.cos(-q * (full - 1));
        double sBack = Math.sin(-q * (full - 1));
        double[] cLane = new double[4];
        double[] sLane = new double[4];
        for (int lane = 0; lane < 4; lane++) {
            cLane[lane] = Math.cos(omegaDt * lane);
            sLane[lane] = Math.sin(omegaDt * lane);
        }
        double[] la = new double[4];
        double[] lb = new double[4];
        for (int block = 0; block < n; block += ANCHOR) {
            int end = Math.min(n, block + ANCHOR);
            int m = (end - block) / 4;
            double a0 = 0, b0 = 0, a1 = 0, b1 = 0, a2 = 0, b2 = 0, a3 = 0, b3 = 0;
            int i = block;
            for (int j = 0; j < m; j++, i += 4) {
                double v0 = y[i], v1 = y[i + 1], v2 = y[i + 2], v3 = y[i + 3];
                double t0 = v0 + k * a0 - b0;
                double t1 = v1 + k * a1 - b1;
                double t2 = v2 + k * a2 - b2;
                double t3 = v3 + k * a3 - b3;
                b0 = a0; a0 = t0;
                b1 = a1; a1 = t1;
                b2 = a2; a2 = t2;
                b3 = a3; a3 = t3;
                sy0 += v0; sy1 += v1; sy2 += v2; sy3 += v3;
                syy0 += v0 * v0; syy1 += v1 * v1; syy2 += v2 * v2; syy3 += v3 * v3;
            }
            if (m > 0) {
                la[0] = a0; la[1] = a1; la[2] = a2; la[3] = a3;
                lb[0] = b0; lb[1] = b1; lb[2] = b2; lb[3] = b3;
                double cb = m == full ? cBack : Math.cos(-q * (m - 1));
                double sb = m == full ? sBack : Math.sin(-q * (m - 1));
                double cBlock = Math.cos(omegaDt * block);
                double sBlock = Math.sin(omegaDt * block);
                for (int lane = 0; lane < 4; lane++) {
                    // sum_j x_j exp(-j q j) for this lane, then exp(+j p (block + lane)) for its place;
                    // the sums wanted are of exp(+j p n), the conjugate for real data
                    double re = la[lane] - cq * lb[lane];
                    double im = sq * lb[lane];
                    double xr = re * cb - im * sb;
                    double xi = re * sb + im * cb;
                    double cs = cBlock * cLane[lane] - sBlock * sLane[lane];
                    double sn = sBlock * cLane[lane] + cBlock * sLane[lane];
                    syc += xr * cs + xi * sn;
                    sys += xr * sn - xi * cs;
                }
            }
            for (; i < end; i++) {
                double v = y[i];
                syc += v * Math.cos(omegaDt * i);
                sys += v * Math.sin(omegaDt * i);
                sy0 += v;
                syy0 += v * v;
            }
        }
        double sy = (sy0 + sy1) + (sy2 + sy3);
        double syy = (syy0 + syy1) + (syy2 + syy3);
        // cos^2 + sin^2 = 1 per sample, so the sum of sin^2 follows from the sum of cos^2
        double sss = n - scc;
        RealMatrix normal = new Array2DRowRealMatrix(new double[][] {
            {scc, scs, sc},
            {scs, sss, ss},
            {sc, ss, n}});
        DecompositionSolver solver = new LUDecomposition(normal, 1e-14).getSolver();
        if (!solver.isNonSingular()) {
            throw new IllegalArgumentException("sine fit is singular: the record (" + n + " samples of "
                    + intervalSecond + " s at " + frequencyHz + " Hz) cannot separate sine, cosine and offset");
        }
        RealVector p = solver.solve(new ArrayRealVector(new double[] {syc, sys, sy}));
        double a = p.getEntry(0);
        double b = p.getEntry(1);
        double offset = p.getEntry(2);
        // one pass: at the least-squares solution the residual sum of squares is
        // sum(y^2) - p . (X'y); its rounding floor is about 1e-16 of sum(y^2), far below any
        // digitizer's noise
        double rss = Math.max(0.0, syy - (a * syc + b * sys + offset * sy));
        double variance = n > 3 ? rss / (n - 3) : 0;
        RealMatrix inverse = solver.getInverse();
        return new SineFitResult(frequencyHz, a, b, offset, Math.sqrt(rss / n),
                variance * inverse.getEntry(0, 0), variance * inverse.getEntry(1, 1), variance * inverse.getEntry(0, 1), n);
    }

    /**
     * Sums over n = 0 .. N-1 of cos^2(n p), cos(n p) sin(n p), cos(n p), sin(n p), from the geometric
     * series sum exp(j n p) = exp(j (N-1) p / 2) sin(N p / 2) / sin(p / 2); summed directly where
     * sin(p / 2) or sin(p) is too small for the closed form to keep its precision (p near a multiple of pi).
     */
    static double[] designSums(int n, double p) {
        double[] one = geometric(n, p);
        double[] two = geometric(n, 2 * p);
        if (one == null || two == null) {
            double scc = 0, scs = 0, sc = 0, ss = 0;
            for (int i = 0; i < n; i++) {
                double c = Math.cos(p * i);
                double s = Math.sin(p * i);
                scc += c * c;
                scs += c * s;
                sc += c;
                ss += s;
            }
            return new double[] {scc, scs, sc, ss};
        }
        // cos^2 = (1 + cos 2x) / 2, cos sin = sin 2x / 2
        return new double[] {0.5 * (n + two[0]), 0.5 * two[1], one[0], one[1]};
    }

    /** {sum cos(n p), sum sin(n p)} for n = 0 .. N-1, or null where the closed form loses precision. */
    private static double[] geometric(int n, double p) {
        double half = Math.sin(p / 2);
        if (Math.abs(half) < 1e-3) {
            return null;
        }
        double ratio = Math.sin(n * p / 2) / half;
        double phase = (n - 1) * p / 2;
        return new double[] {ratio * Math.cos(phase), ratio * Math.sin(phase)};
    }

    /** The cosine phasor of a fit: A cos + B sin = Re((A - jB) exp(j w t)). */
    public static Complex phasor(SineFitResult r) {
        return new Complex(r.cosineCoefficient(), -r.sineCoefficient());
    }
}
