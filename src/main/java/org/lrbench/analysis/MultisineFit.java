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
 * the sum and difference frequencies); the data sums are taken by a rotating phasor per frequency,
 * re-anchored with exact cosines every {@value #ANCHOR} samples. Covariances are the residual
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
     * {@link #dataSums(double[], double)} of every step in {@code p}, as {sum y cos, sum y sin} pairs in
     * its order: four phasors turned together in one pass over the samples (each one's arithmetic the
     * same as alone, so the sums are too), which keeps the processor's arithmetic units busy where one
     * phasor's turn waits on its last.
     */
    public static double[] dataSums(double[] y, double[] p) {
        int k = p.length;
        double[] out = new double[2 * k];
        int g = 0;
        for (; g + 4 <= k; g += 4) {
            fourSums(y, p, g, out);
        }
        for (; g < k; g++) {
            double[] cs = dataSums(y, p[g]);
            out[2 * g] = cs[0];
            out[2 * g + 1] = cs[1];
        }
        return out;
    }

    /** The sums of steps p[g] .. p[g + 3] into out[2g] .. out[2g + 7]. */
    private static void fourSums(double[] y, double[] p, int g, double[] out) {
        double cp0 = Math.cos(p[g]);
        double sp0 = Math.sin(p[g]);
        double cp1 = Math.cos(p[g + 1]);
        double sp1 = Math.sin(p[g + 1]);
        double cp2 = Math.cos(p[g + 2]);
        double sp2 = Math.sin(p[g + 2]);
        double cp3 = Math.cos(p[g + 3]);
        double sp3 = Math.sin(p[g + 3]);
        double yc0 = 0;
        double ys0 = 0;
        double yc1 = 0;
        double ys1 = 0;
        double yc2 = 0;
        double ys2 = 0;
        double yc3 = 0;
        double ys3 = 0;
        for (int block = 0; block < y.length; block += ANCHOR) {
            int end = Math.min(y.length, block + ANCHOR);
            double c0 = Math.cos(p[g] * block);
            double s0 = Math.sin(p[g] * block);
            double c1 = Math.cos(p[g + 1] * block);
            double s1 = Math.sin(p[g + 1] * block);
            double c2 = Math.cos(p[g + 2] * block);
            double s2 = Math.sin(p[g + 2] * block);
            double c3 = Math.cos(p[g + 3] * block);
            double s3 = Math.sin(p[g + 3] * block);
            for (int i = block; i < end; i++) {
                double v = y[i];
                yc0 += v * c0;
                ys0 += v * s0;
                yc1 += v * c1;
                ys1 += v * s1;
                yc2 += v * c2;
                ys2 += v * s2;
                yc3 += v * c3;
                ys3 += v * s3;
                double n0 = c0 * cp0 - s0 * sp0;
                s0 = s0 * cp0 + c0 * sp0;
                c0 = n0;
                double n1 = c1 * cp1 - s1 * sp1;
                s1 = s1 * cp1 + c1 * sp1;
                c1 = n1;
                double n2 = c2 * cp2 - s2 * sp2;
                s2 = s2 * cp2 + c2 * sp2;
                c2 = n2;
                double n3 = c3 * cp3 - s3 * sp3;
                s3 = s3 * cp3 + c3 * sp3;
                c3 = n3;
            }
        }
        out[2 * g] = yc0;
        out[2 * g + 1] = ys0;
        out[2 * g + 2] = yc1;
        out[2 * g + 3] = ys1;
        out[2 * g + 4] = yc2;
        out[2 * g + 5] = ys2;
        out[2 * g + 6] = yc3;
        out[2 * g + 7] = ys3;
    }

    /** {sum y cos(n p), sum y sin(n p)}: a phasor turned by p per sample, set exactly every ANCHOR samples. */
    static double[] dataSums(double[] y, double p) {
        double cp = Math.cos(p);
        double sp = Math.sin(p);
        double syc = 0;
        double sys = 0;
        for (int block = 0; block < y.length; block += ANCHOR) {
            int end = Math.min(y.length, block + ANCHOR);
            double c = Math.cos(p * block);
            double s = Math.sin(p * block);
            for (int i = block; i < end; i++) {
                syc += y[i] * c;
                sys += y[i] * s;
                double next = c * cp - s * sp;
                s = s * cp + c * sp;
                c = next;
            }
        }
        return new double[] {syc, sys};
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
