package org.lrbench.analysis;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.DecompositionSolver;
import org.apache.commons.math3.linear.QRDecomposition;
import org.apache.commons.math3.linear.RealVector;

/**
 * The four-parameter sine fit of IEEE Std 1057 (4.1.3.2): amplitude, phase, offset and frequency.
 * Starting from a frequency estimate (the generator's setting, or {@link FrequencyEstimate}), each
 * iteration linearises the model in the frequency and solves for cosine, sine, offset and the
 * frequency step. The time axis is centred on the record and the frequency column scaled by the
 * half record length, which keeps the 4 x 4 normal matrix well conditioned; it is solved by QR.
 * Each iteration is one pass over the samples with sines and cosines by recurrence.
 */
public final class FourParameterSineFit {
    static final int MAX_ITERATIONS = 60;

    private FourParameterSineFit() {
    }

    /** The fit and the frequency it converged to. The phase refers to the first sample's time. */
    public record Result(SineFitResult fit, double frequencyHz, int iterations) {
    }

    public static Result fit(double[] y, double intervalSecond, double startFrequencyHz) {
        int n = y.length;
        if (n < 8) {
            throw new IllegalArgumentException("a four-parameter sine fit needs at least 8 samples, got " + n);
        }
        SineFitResult start = SineFit.fit(y, intervalSecond, startFrequencyHz);
        double omega = 2 * Math.PI * startFrequencyHz;
        double a = start.cosineCoefficient();
        double b = start.sineCoefficient();
        double mid = 0.5 * (n - 1);
        double half = Math.max(1.0, mid) * intervalSecond;
        int iteration = 0;
        double c = 0;
        while (iteration < MAX_ITERATIONS) {
            iteration++;
            // in centred time tc = (i - mid) dt the model is ac cos(w tc) + bc sin(w tc) + c
            double phi = omega * mid * intervalSecond;
            double ac = a * Math.cos(phi) + b * Math.sin(phi);
            double bc = -a * Math.sin(phi) + b * Math.cos(phi);
            double[][] m = new double[4][4];
            double[] v = new double[4];
            double step = omega * intervalSecond;
            double cs = Math.cos(step);
            double sn = Math.sin(step);
            double co = 0;
            double si = 0;
            for (int i = 0; i < n; i++) {
                double tc = (i - mid) * intervalSecond;
                if (i % SineFit.ANCHOR == 0) {
                    co = Math.cos(omega * tc);
                    si = Math.sin(omega * tc);
                }
                double x3 = (tc / half) * (-ac * si + bc * co);
                double[] row = {co, si, 1.0, x3};
                for (int r = 0; r < 4; r++) {
                    v[r] += row[r] * y[i];
                    for (int k = r; k < 4; k++) {
                        m[r][k] += row[r] * row[k];
                    }
                }
                double nc = co * cs - si * sn;
                si = si * cs + co * sn;
                co = nc;
            }
            for (int r = 0; r < 4; r++) {
                for (int k = 0; k < r; k++) {
                    m[r][k] = m[k][r];
                }
            }
            DecompositionSolver solver = new QRDecomposition(new Array2DRowRealMatrix(m, false), 1e-15).getSolver();
            if (!solver.isNonSingular()) {
                throw new IllegalArgumentException("four-parameter fit is singular at " + omega / (2 * Math.PI) + " Hz");
            }
            RealVector x = solver.solve(new ArrayRealVector(v, false));
            double dOmega = x.getEntry(3) / half;
            double acNew = x.getEntry(0);
            double bcNew = x.getEntry(1);
            c = x.getEntry(2);
            omega += dOmega;
            // back to first-sample time: rotate by -omega * mid * dt
            double phiNew = omega * mid * intervalSecond;
            a = acNew * Math.cos(phiNew) - bcNew * Math.sin(phiNew);
            b = acNew * Math.sin(phiNew) + bcNew * Math.cos(phiNew);
            if (Math.abs(dOmega) <= 1e-13 * omega) {
                break;
            }
        }
        double f = omega / (2 * Math.PI);
        SineFitResult at = SineFit.fit(y, intervalSecond, f);
        return new Result(at, f, iteration);
    }
}
