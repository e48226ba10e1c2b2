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
 * with {@code t[n] = n * dt} from the first sample. Sines and cosines come from a rotation
 * recurrence re-anchored every {@value #ANCHOR} samples, in a single pass over the samples, so
 * the cost is a few multiply-adds per sample and the error stays at rounding level.
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
        double scc = 0, scs = 0, sc = 0, ss = 0, syc = 0, sys = 0, sy = 0, syy = 0;
        double cosStep = Math.cos(omegaDt);
        double sinStep = Math.sin(omegaDt);
        for (int block = 0; block < n; block += ANCHOR) {
            // re-anchor the recurrence exactly at the start of each block
            double c = Math.cos(omegaDt * block);
            double s = Math.sin(omegaDt * block);
            int end = Math.min(n, block + ANCHOR);
            for (int i = block; i < end; i++) {
                double v = y[i];
                scc += c * c;
                scs += c * s;
                sc += c;
                ss += s;
                syc += v * c;
                sys += v * s;
                sy += v;
                syy += v * v;
                double nc = c * cosStep - s * sinStep;
                s = s * cosStep + c * sinStep;
                c = nc;
            }
        }
        // cos^2 + sin^2 = 1 per sample, so the sum of sin^2 needs no accumulator of its own
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

    /** The cosine phasor of a fit: A cos + B sin = Re((A - jB) exp(j w t)). */
    public static Complex phasor(SineFitResult r) {
        return new Complex(r.cosineCoefficient(), -r.sineCoefficient());
    }
}
