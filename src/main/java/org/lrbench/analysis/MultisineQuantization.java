package org.lrbench.analysis;

/**
 * The repeatable part of a converter's quantization error in a multisine fit. Through a uniform
 * quantizer the sum of tones on one harmonic grid comes out with intermodulation products that fall
 * on the grid, so on the tones' own bins: a fixed error for a given signal and range, which more
 * samples do not average out, and which matters for a tone small beside the others on its channel
 * (a few codes or less). With the step and the grid read from the samples and the noise ahead of
 * the quantizer estimated by maximum likelihood (as {@link Quantization} does for one sine), the
 * expected quantizer output of the fitted signal is worked out sample by sample, with the noise
 * averaged over (E[rint(u + s z)] = m + sum_j Phi((u - m - j + 1/2) / s) - sum_j Phi((m - j + 1/2 - u) / s),
 * m = rint(u), z standard normal); its difference from the fitted signal, fitted at the tones, is
 * the error each tone's phasor carries, and is taken off (a known systematic effect corrected, JCGM
 * 100:2008 3.2.4). Where the noise is near a step or more the quantization is dithered and the
 * phasors are left as they are; so they are where the samples show no grid.
 */
public final class MultisineQuantization {
    /** Thresholds either side of a sample's code that the noise can reach (beyond 8 sigma: none). */
    private static final double REACH = 8;

    private MultisineQuantization() {
    }

    /** The tones' phasors of samples {@code y} with the repeatable quantization error taken off. */
    public static SineFitResult[] corrected(double[] y, double intervalSecond, double[] tonesHz, SineFitResult[] fit) {
        double step = codeStep(y);
        if (!(step > 0) || fit.length == 0) {
            return fit;
        }
        double[] model = synthesized(y.length, intervalSecond, tonesHz, fit);
        double sigma = Quantization.noise(y, model, step);
        if (sigma > 0.9 * step) {
            return fit;
        }
        double origin = y[0];
        double s = Math.max(sigma / step, 1e-6);
        int reach = (int) Math.ceil(REACH * s) + 1;
        double[] error = new double[y.length];
        for (int i = 0; i < y.length; i++) {
            double u = (model[i] - origin) / step;
            double m = Math.rint(u);
            double e = m;
            for (int j = 1; j <= reach; j++) {
                e += phi((u - m - j + 0.5) / s) - phi((m - j + 0.5 - u) / s);
            }
            error[i] = origin + step * e - model[i];
        }
        SineFitResult[] err = MultisineFit.fit(error, intervalSecond, tonesHz);
        SineFitResult[] out = new SineFitResult[fit.length];
        for (int k = 0; k < fit.length; k++) {
            SineFitResult f = fit[k];
            out[k] = new SineFitResult(f.frequencyHz(), f.cosineCoefficient() - err[k].cosineCoefficient(),
                    f.sineCoefficient() - err[k].sineCoefficient(), f.offset() - err[k].offset(), f.residualRms(),
                    f.varianceCosine(), f.varianceSine(), f.covarianceCosineSine(), f.samples());
        }
        return out;
    }

    /** Samples at most that the code step is read from (then every sample is checked against it). */
    private static final int STEP_SAMPLES = 1 << 16;

    /**
     * The converter step of a long record: read from evenly spaced samples as {@link
     * Quantization#codeStep} reads a record, then every sample checked to lie on that grid (to 1e-6
     * of a step); NaN when one does not. Linear in the record's length, where sorting it is not.
     */
    static double codeStep(double[] y) {
        if (y.length <= STEP_SAMPLES) {
            return Quantization.codeStep(y);
        }
        int stride = (y.length + STEP_SAMPLES - 1) / STEP_SAMPLES;
        double[] some = new double[(y.length + stride - 1) / stride];
        for (int j = 0; j < some.length; j++) {
            some[j] = y[j * stride];
        }
        double step = Quantization.codeStep(some);
        if (!(step > 0)) {
            return Double.NaN;
        }
        for (double v : y) {
            double k = (v - y[0]) / step;
            if (Math.abs(k - Math.rint(k)) > 1e-6) {
                return Double.NaN;
            }
        }
        return step;
    }

    /**
     * The standard normal distribution function, from the complementary error function's rational
     * approximation of Abramowitz and Stegun 7.1.26 (absolute error below 1.5e-7, far below what a
     * code's fraction needs here).
     */
    static double phi(double x) {
        if (x > REACH) {
            return 1;
        }
        if (x < -REACH) {
            return 0;
        }
        double z = Math.abs(x) / Math.sqrt(2);
        double t = 1 / (1 + 0.3275911 * z);
        double erfc = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))))
                * Math.exp(-z * z);
        return x >= 0 ? 1 - 0.5 * erfc : 0.5 * erfc;
    }

    /** Samples between exact anchors of each tone's phase in {@link #synthesized}. */
    private static final int ANCHOR = 256;

    /**
     * The fitted tones and offset, sample by sample: each tone's phasor turned by one complex
     * multiplication a sample, its phase computed exactly every {@value #ANCHOR} samples.
     */
    static double[] synthesized(int n, double dt, double[] tonesHz, SineFitResult[] fit) {
        double[] s = new double[n];
        java.util.Arrays.fill(s, fit[0].offset());
        for (int k = 0; k < tonesHz.length; k++) {
            double w = 2 * Math.PI * tonesHz[k] * dt;
            double a = fit[k].cosineCoefficient();
            double b = fit[k].sineCoefficient();
            double cd = Math.cos(w);
            double sd = Math.sin(w);
            for (int start = 0; start < n; start += ANCHOR) {
                double c = Math.cos(w * start);
                double sn = Math.sin(w * start);
                int end = Math.min(n, start + ANCHOR);
                for (int i = start; i < end; i++) {
                    s[i] += a * c + b * sn;
                    double next = c * cd - sn * sd;
                    sn = sn * cd + c * sd;
                    c = next;
                }
            }
        }
        return s;
    }
}
