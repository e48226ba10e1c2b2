package org.lrbench.study;

/**
 * The type-1 study: one reference part of known value measured repeatedly on one bench. The
 * capability indices compare the scatter and the bias with a share of the tolerance T:
 * Cg = 0.2 T / (6 s) and Cgk = (0.1 T - |mean - reference|) / (3 s), with s the sample standard
 * deviation; 1.33 is the usual acceptance for both (the automotive type-1 study practice, from
 * memory). The bias is tested against zero with Student's t.
 */
public final class TypeOneStudy {

    private TypeOneStudy() {
    }

    /** The figures of the study. */
    public record Result(int n, double mean, double standardDeviation, double bias, double cg, double cgk,
                         double biasPValue) {

        /** Both indices at least 1.33. */
        public boolean capable() {
            return cg >= 1.33 && cgk >= 1.33;
        }
    }

    public static Result analyse(double[] readings, double reference, double tolerance) {
        int n = readings.length;
        if (n < 10) {
            throw new IllegalArgumentException("a type-1 study needs at least 10 readings; got " + n);
        }
        if (!(tolerance > 0)) {
            throw new IllegalArgumentException("a type-1 study needs a tolerance above 0");
        }
        double mean = 0;
        for (double v : readings) {
            mean += v / n;
        }
        double ss = 0;
        for (double v : readings) {
            ss += (v - mean) * (v - mean);
        }
        double s = Math.sqrt(ss / (n - 1));
        double bias = mean - reference;
        double t = s > 0 ? bias / (s / Math.sqrt(n)) : Double.NaN;
        double pValue = Double.isFinite(t)
                ? 2 * (1 - new org.apache.commons.math3.distribution.TDistribution(null, n - 1).cumulativeProbability(Math.abs(t)))
                : Double.NaN;
        return new Result(n, mean, s, bias, 0.2 * tolerance / (6 * s), (0.1 * tolerance - Math.abs(bias)) / (3 * s), pValue);
    }
}
