package org.lrbench.analysis;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.DecompositionSolver;
import org.apache.commons.math3.linear.QRDecomposition;
import org.apache.commons.math3.linear.RealVector;

/**
 * Least-squares fit of a fundamental at a known frequency and its harmonics 2..K plus an offset
 * (the multi-harmonic extension of the IEEE Std 1057 three-parameter fit), giving each harmonic's
 * cosine and sine coefficients and the total harmonic distortion
 * THD = sqrt(sum over k >= 2 of A_k^2) / A_1.
 */
public final class HarmonicFit {

    private HarmonicFit() {
    }

    /** Coefficients per harmonic (index 0 unused), the offset and the THD. */
    public record Result(double[] cosine, double[] sine, double offset, double thd) {

        public double amplitude(int k) {
            return Math.hypot(cosine[k], sine[k]);
        }
    }

    /** Fits harmonics up to {@code maxHarmonic}, lowered to what the sample rate can carry. */
    public static Result fit(double[] y, double intervalSecond, double frequencyHz, int maxHarmonic) {
        int kMax = Math.max(1, Math.min(maxHarmonic, (int) Math.floor(0.5 / (frequencyHz * intervalSecond) - 1e-9)));
        int p = 2 * kMax + 1;
        if (y.length <= p) {
            throw new IllegalArgumentException("a " + kMax + "-harmonic fit needs more than " + p + " samples");
        }
        // the normal equations from sums of single harmonics: a product of two harmonics j and k is
        // half the sum of harmonics j + k and |j - k| (angle addition), so the Gram matrix needs the
        // sums of cos(m w t_i) and sin(m w t_i) for m = 0 .. 2K only: O(N K) instead of O(N K^2)
        int mMax = 2 * kMax;
        double[] sumCos = new double[mMax + 1];
        double[] sumSin = new double[mMax + 1];
        double[] v = new double[p];
        double omegaDt = 2 * Math.PI * frequencyHz * intervalSecond;
        double c1 = 1;
        double s1 = 0;
        double cs = Math.cos(omegaDt);
        double sn = Math.sin(omegaDt);
        for (int i = 0; i < y.length; i++) {
            if (i % SineFit.ANCHOR == 0) {
                c1 = Math.cos(omegaDt * i);
                s1 = Math.sin(omegaDt * i);
            }
            // harmonics by the angle-addition recurrence from the fundamental
            double ck = c1;
            double sk = s1;
            double yi = y[i];
            for (int k = 1; k <= mMax; k++) {
                sumCos[k] += ck;
                sumSin[k] += sk;
                if (k <= kMax) {
                    v[2 * k - 2] += ck * yi;
                    v[2 * k - 1] += sk * yi;
                }
                double nc = ck * c1 - sk * s1;
                sk = sk * c1 + ck * s1;
                ck = nc;
            }
            v[p - 1] += yi;
            double nc = c1 * cs - s1 * sn;
            s1 = s1 * cs + c1 * sn;
            c1 = nc;
        }
        sumCos[0] = y.length;
        double[][] m = new double[p][p];
        for (int j = 1; j <= kMax; j++) {
            for (int k = 1; k <= kMax; k++) {
                int d = Math.abs(j - k);
                double sd = j >= k ? sumSin[d] : -sumSin[d];
                m[2 * j - 2][2 * k - 2] = 0.5 * (sumCos[d] + sumCos[j + k]);
                m[2 * j - 1][2 * k - 1] = 0.5 * (sumCos[d] - sumCos[j + k]);
                // cos(j x) sin(k x) = (sin((j + k) x) - sin((j - k) x)) / 2
                m[2 * j - 2][2 * k - 1] = 0.5 * (sumSin[j + k] - sd);
                m[2 * j - 1][2 * k - 2] = 0.5 * (sumSin[j + k] + sd);
            }
            m[2 * j - 2][p - 1] = sumCos[j];
            m[p - 1][2 * j - 2] = sumCos[j];
            m[2 * j - 1][p - 1] = sumSin[j];
            m[p - 1][2 * j - 1] = sumSin[j];
        }
        m[p - 1][p - 1] = y.length;
        DecompositionSolver solver = new QRDecomposition(new Array2DRowRealMatrix(m, false), 1e-15).getSolver();
        if (!solver.isNonSingular()) {
            throw new IllegalArgumentException("harmonic fit is singular: record too short for " + kMax + " harmonics");
        }
        RealVector x = solver.solve(new ArrayRealVector(v, false));
        double[] cos = new double[kMax + 1];
        double[] sin = new double[kMax + 1];
        double sumHarmonics = 0;
        for (int k = 1; k <= kMax; k++) {
            cos[k] = x.getEntry(2 * k - 2);
            sin[k] = x.getEntry(2 * k - 1);
            if (k >= 2) {
                sumHarmonics += cos[k] * cos[k] + sin[k] * sin[k];
            }
        }
        double fundamental = Math.hypot(cos[1], sin[1]);
        return new Result(cos, sin, x.getEntry(p - 1), fundamental > 0 ? Math.sqrt(sumHarmonics) / fundamental : Double.NaN);
    }
}
