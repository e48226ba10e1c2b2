package org.lrbench.report;

/**
 * Process capability of a sample against its specification limits (the usual textbook indices):
 * Cp = (USL - LSL) / (6 s) and Cpk = min(USL - mean, mean - LSL) / (3 s), s the sample standard
 * deviation. With one limit only, Cp is undefined and Cpk is the one-sided index.
 */
public record Capability(int n, double mean, double sd, Double cp, Double cpk) {

    public static Capability of(double[] values, double lower, double upper) {
        int n = values.length;
        double mean = 0;
        for (double v : values) {
            mean += v;
        }
        mean /= n;
        double ss = 0;
        for (double v : values) {
            ss += (v - mean) * (v - mean);
        }
        double sd = n > 1 ? Math.sqrt(ss / (n - 1)) : Double.NaN;
        boolean lo = Double.isFinite(lower);
        boolean hi = Double.isFinite(upper);
        if (!(sd > 0)) {
            return new Capability(n, mean, sd, null, null);
        }
        Double cp = lo && hi ? (upper - lower) / (6 * sd) : null;
        double cpl = lo ? (mean - lower) / (3 * sd) : Double.POSITIVE_INFINITY;
        double cpu = hi ? (upper - mean) / (3 * sd) : Double.POSITIVE_INFINITY;
        double cpk = Math.min(cpl, cpu);
        return new Capability(n, mean, sd, cp, Double.isFinite(cpk) ? cpk : null);
    }
}
