package org.lrbench.measure;

/**
 * The full-scale ranges lrbench asks a digitizer for: the R10 series of preferred numbers (1, 1.25,
 * 1.6, 2, 2.5, 3.15, 4, 5, 6.3, 8 in each decade; ISO 3), a request rounded up to the next of them.
 * An instrument with continuous ranges then sits on the same few ranges from part to part, so the
 * channels' gain ratio on each pair of them can be measured once at calibration and used on every
 * point (an instrument with steps of its own grants its step, as before). Steps of about 25 % keep a
 * signal asked at three quarters of full scale between 60 % and 75 % of it.
 */
public final class RangeLadder {

    /** ISO 3 R10, the rounded values: 10^(i/10) rounded to three figures. */
    private static final double[] R10 = {1.0, 1.25, 1.6, 2.0, 2.5, 3.15, 4.0, 5.0, 6.3, 8.0};

    private RangeLadder() {
    }

    /** The smallest ladder value not below {@code volt} (to 1e-9), or {@code volt} itself if not positive and finite. */
    public static double up(double volt) {
        if (!(volt > 0) || !Double.isFinite(volt)) {
            return volt;
        }
        int decade = (int) Math.floor(Math.log10(volt));
        for (int d = decade - 1; d <= decade + 1; d++) {
            double scale = Math.pow(10, d);
            for (double m : R10) {
                double v = round(m * scale);
                if (v >= volt * (1 - 1e-9)) {
                    return v;
                }
            }
        }
        return volt;
    }

    /** The ladder value next above {@code volt}'s own rung. */
    public static double next(double volt) {
        return up(up(volt) * 1.01);
    }

    /** Rounded to 12 significant figures, so a rung computed twice compares equal. */
    private static double round(double v) {
        return new java.math.BigDecimal(v).round(new java.math.MathContext(12)).doubleValue();
    }
}
