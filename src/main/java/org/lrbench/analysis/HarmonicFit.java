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
        double[][] m = new double[p][p];
        double[] v = new double[p];
        double[] row = new double[p];
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
            for (int k = 1; k <= kMax; k++) {
                row[2 * k - 2] = ck;
                row[2 * k - 1] = sk;
                double nc = ck * c1 - sk * s1;
                sk = sk * c1 + ck * s1;
                ck = nc;
            }
            row[p - 1] = 1.0;
            for (int r = 0; r < p; r++) {
                v[r] += row[r] * y[i];
                for (int k = r; k < p; k++) {
                    m[r][k] += row[r] * row[k];
                }
            }
            double nc = c1 * cs - s1 * sn;
            s1 = s1 * cs + c1 * sn;
            c1 = nc;
        }
        for (int r = 0; r < p; r++) {
            for (int k = 0; k < r; k++) {
                m[r][k] = m[k][r];
            }
        }
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
