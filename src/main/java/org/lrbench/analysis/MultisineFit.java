package org.lrbench.analysis;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.DecompositionSolver;
import org.apache.commons.math3.linear.NonPositiveDefiniteMatrixException;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;

/**
 * The multi-frequency least-squares sine fit: with the frequencies known, find the cosine and sine
 * coefficients of every one and a common offset minimising the squared error of
 * {@code y[n] - (C + sum_i A_i cos(w_i t[n]) + B_i sin(w_i t[n]))}, {@code t[n] = n dt} (the
 * three-parameter fit of IEEE Std 1057 4.1.3.1 extended to several known frequencies). It does not
 * need whole periods in the record. The design's own sums have closed forms (geometric series of
 * the sum and difference frequencies); the data sums are taken by Goertzel's recurrence in blocks
 * of {@value #ANCHOR} samples, each block turned to its exact phase. Covariances are the residual
 * variance times the inverse normal matrix (white noise).
 */
public final class MultisineFit {
    static final int ANCHOR = 256;

    private MultisineFit() {
    }

    /** One fit per frequency, in the order given, each with the common offset and the shared residual. */
    public static SineFitResult[] fit(double[] y, double intervalSecond, double[] frequenciesHz) {
        int n = y.length;
        int k = frequenciesHz.length;
        int p = 2 * k + 1;
        if (n <= p) {
            throw new IllegalArgumentException("a fit of " + k + " frequencies needs more than " + p + " samples, got " + n);
        }
        double[] w = new double[k];
        for (int i = 0; i < k; i++) {
            w[i] = 2 * Math.PI * frequenciesHz[i] * intervalSecond;
        }
        double[][] m = new double[p][p];
        for (int i = 0; i < k; i++) {
            double[] gi = geometric(n, w[i]);
            m[2 * i][p - 1] = m[p - 1][2 * i] = gi[0];
            m[2 * i + 1][p - 1] = m[p - 1][2 * i + 1] = gi[1];
            for (int j = i; j < k; j++) {
                double[] minus = geometric(n, w[i] - w[j]);
                double[] plus = geometric(n, w[i] + w[j]);
                // cos a cos b = (cos(a-b) + cos(a+b))/2; sin a sin b = (cos(a-b) - cos(a+b))/2;
                // cos a sin b = (sin(a+b) - sin(a-b))/2; sin a cos b = (sin(a+b) + sin(a-b))/2
                double cc = 0.5 * (minus[0] + plus[0]);
                double ss = 0.5 * (minus[0] - plus[0]);
                double cs = 0.5 * (plus[1] - minus[1]);
                double sc = 0.5 * (plus[1] + minus[1]);
                m[2 * i][2 * j] = m[2 * j][2 * i] = cc;
                m[2 * i + 1][2 * j + 1] = m[2 * j + 1][2 * i + 1] = ss;
                m[2 * i][2 * j + 1] = m[2 * j + 1][2 * i] = cs;
                m[2 * i + 1][2 * j] = m[2 * j][2 * i + 1] = sc;
            }
        }
        m[p - 1][p - 1] = n;
        double[] b = new double[p];
        double sy = 0;
        double syy = 0;
        for (double v : y) {
            sy += v;
            syy += v * v;
        }
        b[p - 1] = sy;
        double[] sums = dataSums(y, w);
        System.arraycopy(sums, 0, b, 0, 2 * k);
        RealMatrix normal = new Array2DRowRealMatrix(m, false);
        DecompositionSolver solver;
        try {
            solver = new CholeskyDecomposition(normal, 1e-12, 1e-14).getSolver();
        } catch (NonPositiveDefiniteMatrixException e) {
            throw new IllegalArgumentException("the record (" + n + " samples of " + intervalSecond
                    + " s) cannot separate these " + k + " frequencies: too short or two of them too close", e);
        }
        RealVector x = solver.solve(new ArrayRealVector(b, false));
        double rss = Math.max(0.0, syy - x.dotProduct(new ArrayRealVector(b, false)));
        double variance = rss / (n - p);
        RealMatrix inverse = solver.getInverse();
        double offset = x.getEntry(p - 1);
        SineFitResult[] out = new SineFitResult[k];
        for (int i = 0; i < k; i++) {
            out[i] = new SineFitResult(frequenciesHz[i], x.getEntry(2 * i), x.getEntry(2 * i + 1), offset, Math.sqrt(rss / n),
                    variance * inverse.getEntry(2 * i, 2 * i), variance * inverse.getEntry(2 * i + 1, 2 * i + 1),
                    variance * inverse.getEntry(2 * i, 2 * i + 1), n);
        }
        return out;
    }

    /**
     * {sum y cos(n p), sum y sin(n p)} of every step in {@code p}, as pairs in its order. Each block of
     * {@value #ANCHOR} samples is summed by Goertzel's second-order recurrence (G. Goertzel, "An
     * algorithm for the evaluation of finite trigonometric series", American Mathematical Monthly 65,
     * 1958, pp. 34-35), one multiplication and two additions a sample where turning a phasor takes six
     * and four, four steps side by side in one pass over the samples so their recurrences overlap; the
     * block's sum is then turned to the block's exact phase, so rounding does not build up over the record.
     */
    public static double[] dataSums(double[] y, double[] p) {
        int k = p.length;
        double[] out = new double[2 * k];
        int g = 0;
        for (; g + 4 <= k; g += 4) {
            fourSums(y, p, g, out);
        }
        if (g < k) {
            // the last one to three steps in a pass of their own, filled up to four with the last
            double[] rest = new double[4];
            for (int i = 0; i < 4; i++) {
                rest[i] = p[Math.min(g + i, k - 1)];
            }
            double[] sums = new double[8];
            fourSums(y, rest, 0, sums);
            System.arraycopy(sums, 0, out, 2 * g, 2 * (k - g));
        }
        return out;
    }

    /** The sums of steps p[g] .. p[g + 3] into out[2g] .. out[2g + 7]. */
    private static void fourSums(double[] y, double[] p, int g, double[] out) {
        double k0 = 2 * Math.cos(p[g]);
        double k1 = 2 * Math.cos(p[g + 1]);
        double k2 = 2 * Math.cos(p[g + 2]);
        double k3 = 2 * Math.cos(p[g + 3]);
        for (int block = 0; block < y.length; block += ANCHOR) {
            int end = Math.min(y.length, block + ANCHOR);
            double a0 = 0;
            double b0 = 0;
            double a1 = 0;
            double b1 = 0;
            double a2 = 0;
            double b2 = 0;
            double a3 = 0;
            double b3 = 0;
            for (int i = block; i < end; i++) {
                double v = y[i];
                double t0 = v + k0 * a0 - b0;
                double t1 = v + k1 * a1 - b1;
                double t2 = v + k2 * a2 - b2;
                double t3 = v + k3 * a3 - b3;
                b0 = a0;
                a0 = t0;
                b1 = a1;
                a1 = t1;
                b2 = a2;
                a2 = t2;
                b3 = a3;
                a3 = t3;
            }
            int last = end - 1;
            addBlock(out, g, p[g], a0, b0, last);
            addBlock(out, g + 1, p[g + 1], a1, b1, last);
            addBlock(out, g + 2, p[g + 2], a2, b2, last);
            addBlock(out, g + 3, p[g + 3], a3, b3, last);
        }
    }

    /**
     * A block's recurrence ended with s = {@code a} at sample {@code last} and {@code b} the one before:
     * sum over the block of y e^(j p (last - n)) = a - e^(-j p) b, turned by e^(-j p last) to the
     * record's origin, added to out[2t] (cosine sum) and out[2t + 1] (sine sum, the negated imaginary part).
     */
    private static void addBlock(double[] out, int t, double p, double a, double b, int last) {
        double re = a - Math.cos(p) * b;
        double im = Math.sin(p) * b;
        double c = Math.cos(p * last);
        double s = Math.sin(p * last);
        out[2 * t] += re * c + im * s;
        out[2 * t + 1] -= im * c - re * s;
    }

    /**
     * {sum cos(n t), sum sin(n t)} for n = 0 .. N-1 from exp(j (N-1) t / 2) sin(N t / 2) / sin(t / 2),
     * with t first brought into (-pi, pi] so that sin(t / 2) keeps its relative precision near a
     * multiple of 2 pi.
     */
    static double[] geometric(int n, double t) {
        double r = t - 2 * Math.PI * Math.rint(t / (2 * Math.PI));
        if (Math.abs(r) < 1e-13) {
            return new double[] {n, 0};
        }
        double ratio = Math.sin(n * r / 2) / Math.sin(r / 2);
        double phase = (n - 1) * r / 2;
        return new double[] {ratio * Math.cos(phase), ratio * Math.sin(phase)};
    }
}
