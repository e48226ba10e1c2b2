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
        double previousStep = Double.POSITIVE_INFINITY;
        while (iteration < MAX_ITERATIONS) {
            iteration++;
            // in centred time tc = (i - mid) dt the model is ac cos(w tc) + bc sin(w tc) + c
            double phi = omega * mid * intervalSecond;
            double ac = a * Math.cos(phi) + b * Math.sin(phi);
            double bc = -a * Math.sin(phi) + b * Math.cos(phi);
            // the ten distinct sums of the 4 x 4 normal matrix and the four right-hand sides
            double s00 = 0, s01 = 0, s02 = 0, s03 = 0, s11 = 0, s12 = 0, s13 = 0, s23 = 0, s33 = 0;
            double v0 = 0, v1 = 0, v2 = 0, v3 = 0;
            double step = omega * intervalSecond;
            double cs = Math.cos(step);
            double sn = Math.sin(step);
            for (int block = 0; block < n; block += SineFit.ANCHOR) {
                double co = Math.cos(omega * (block - mid) * intervalSecond);
                double si = Math.sin(omega * (block - mid) * intervalSecond);
                int end = Math.min(n, block + SineFit.ANCHOR);
                for (int i = block; i < end; i++) {
                    double x3 = ((i - mid) * intervalSecond / half) * (-ac * si + bc * co);
                    double yi = y[i];
                    s00 += co * co;
                    s01 += co * si;
                    s02 += co;
                    s03 += co * x3;
                    s11 += si * si;
                    s12 += si;
                    s13 += si * x3;
                    s23 += x3;
                    s33 += x3 * x3;
                    v0 += co * yi;
                    v1 += si * yi;
                    v2 += yi;
                    v3 += x3 * yi;
                    double nc = co * cs - si * sn;
                    si = si * cs + co * sn;
                    co = nc;
                }
            }
            double[][] m = {
                {s00, s01, s02, s03},
                {s01, s11, s12, s13},
                {s02, s12, n, s23},
                {s03, s13, s23, s33}};
            double[] v = {v0, v1, v2, v3};
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
            // converged once the step is at rounding level, or has stopped shrinking (noise floor)
            if (Math.abs(dOmega) <= 1e-13 * omega || Math.abs(dOmega) >= 0.5 * previousStep && iteration > 3) {
                break;
            }
            previousStep = Math.abs(dOmega);
        }
        double f = omega / (2 * Math.PI);
        SineFitResult at = SineFit.fit(y, intervalSecond, f);
        return new Result(at, f, iteration);
    }
}
