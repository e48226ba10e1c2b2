package org.lrbench.analysis;

import java.util.Arrays;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.DecompositionSolver;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;

/**
 * The time-domain method: with a triangle wave driving the fixture the current ramps, and the part's
 * voltage follows v = R i + L di/dt + offset (the classic picture of a real inductor: the winding
 * resistance tilts the flat tops of the nearly square voltage). The current (sense-resistor voltage
 * over Rs) is first fitted with its harmonics at the known frequency, which gives a smooth i and an
 * analytic di/dt that noise does not wreck: only harmonics whose amplitude stands clear of the noise
 * ({@value #SIGNIFICANCE} times the standard deviation a harmonic coefficient has from noise alone)
 * and above half the converter's step are kept. The derivative multiplies harmonic k by k, and with
 * coherent sampling the quantization error repeats every cycle, so it sits exactly on the harmonics:
 * fitted, it would wreck di/dt and pull L low. Then v is regressed on i, di/dt and 1 by least squares.
 */
public final class TriangleExtraction {
    static final double SIGNIFICANCE = 6.0;

    private TriangleExtraction() {
    }

    /** R and L with their standard uncertainties (from the regression), the residual RMS, harmonics used. */
    public record Result(double frequencyHz, double resistanceOhm, double inductanceHenry, double resistanceUncertainty,
                         double inductanceUncertainty, double residualRmsVolt, int harmonics) {
    }

    public static Result extract(double[] sense, double[] part, double intervalSecond, double frequencyHz,
                                 double senseOhm, int harmonics) {
        if (sense.length != part.length) {
            throw new IllegalArgumentException("the two traces differ in length: " + sense.length + " and " + part.length);
        }
        HarmonicFit.Result fit = HarmonicFit.fit(sense, intervalSecond, frequencyHz, harmonics);
        int kMax = fit.cosine().length - 1;
        double omega = 2 * Math.PI * frequencyHz;
        int n = sense.length;
        boolean[] keep = significant(sense, intervalSecond, omega, fit, kMax);
        int used = 0;
        for (boolean k : keep) {
            used += k ? 1 : 0;
        }
        double[][] m = new double[3][3];
        double[] b = new double[3];
        double[] i = new double[n];
        double[] di = new double[n];
        for (int s = 0; s < n; s++) {
            double t = s * intervalSecond;
            double current = fit.offset();
            double slope = 0;
            // cos and sin of k omega t by turning the fundamental's (angle addition), two trigonometric
            // calls a sample instead of two a harmonic
            double c1 = Math.cos(omega * t);
            double s1 = Math.sin(omega * t);
            double c = c1;
            double sn = s1;
            for (int k = 1; k <= kMax; k++) {
                if (keep[k]) {
                    current += fit.cosine()[k] * c + fit.sine()[k] * sn;
                    slope += k * omega * (-fit.cosine()[k] * sn + fit.sine()[k] * c);
                }
                double next = c * c1 - sn * s1;
                sn = sn * c1 + c * s1;
                c = next;
            }
            i[s] = current / senseOhm;
            di[s] = slope / senseOhm;
            double[] row = {i[s], di[s], 1};
            for (int r = 0; r < 3; r++) {
                b[r] += row[r] * part[s];
                for (int q = 0; q < 3; q++) {
                    m[r][q] += row[r] * row[q];
                }
            }
        }
        DecompositionSolver solver = new LUDecomposition(new Array2DRowRealMatrix(m, false)).getSolver();
        if (!solver.isNonSingular()) {
            throw new IllegalArgumentException("the current does not ramp: R and L cannot be told apart");
        }
        RealVector x = solver.solve(new ArrayRealVector(b, false));
        double rss = 0;
        for (int s = 0; s < n; s++) {
            double e = part[s] - (x.getEntry(0) * i[s] + x.getEntry(1) * di[s] + x.getEntry(2));
            rss += e * e;
        }
        double variance = rss / Math.max(1, n - 3);
        RealMatrix inv = solver.getInverse();
        return new Result(frequencyHz, x.getEntry(0), x.getEntry(1), Math.sqrt(variance * inv.getEntry(0, 0)),
                Math.sqrt(variance * inv.getEntry(1, 1)), Math.sqrt(rss / n), used);
    }

    /** Which harmonics of the current fit stand clear of the noise (the fundamental always). */
    private static boolean[] significant(double[] y, double dt, double omega, HarmonicFit.Result fit, int kMax) {
        double rss = 0;
        for (int s = 0; s < y.length; s++) {
            double t = s * dt;
            double v = fit.offset();
            double c1 = Math.cos(omega * t);
            double s1 = Math.sin(omega * t);
            double c = c1;
            double sn = s1;
            for (int k = 1; k <= kMax; k++) {
                v += fit.cosine()[k] * c + fit.sine()[k] * sn;
                double next = c * c1 - sn * s1;
                sn = sn * c1 + c * s1;
                c = next;
            }
            rss += (y[s] - v) * (y[s] - v);
        }
        double sigma = Math.sqrt(rss / Math.max(1, y.length - (2 * kMax + 1)));
        double coefficientSd = sigma * Math.sqrt(2.0 / y.length);
        double floor = Math.max(SIGNIFICANCE * coefficientSd, 0.5 * quantizationStep(y));
        boolean[] keep = new boolean[kMax + 1];
        keep[1] = true;
        for (int k = 2; k <= kMax; k++) {
            keep[k] = fit.amplitude(k) > floor;
        }
        return keep;
    }

    /**
     * The converter's step as seen in the data: the smallest gap between distinct sample values,
     * provided every sample lies on that grid (0 when the data are not on a grid, as with an ideal
     * or floating-point converter).
     */
    static double quantizationStep(double[] y) {
        double[] sorted = y.clone();
        Arrays.sort(sorted);
        double step = Double.POSITIVE_INFINITY;
        double span = sorted[sorted.length - 1] - sorted[0];
        for (int i = 1; i < sorted.length; i++) {
            double gap = sorted[i] - sorted[i - 1];
            if (gap > 1e-12 * span && gap < step) {
                step = gap;
            }
        }
        if (!Double.isFinite(step)) {
            return 0;
        }
        for (double v : y) {
            double units = (v - sorted[0]) / step;
            if (Math.abs(units - Math.rint(units)) > 0.01) {
                return 0;
            }
        }
        return step;
    }
}
