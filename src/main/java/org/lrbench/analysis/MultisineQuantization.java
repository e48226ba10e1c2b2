package org.lrbench.analysis;

import java.util.ArrayList;
import java.util.List;

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

    /**
     * Samples the noise ahead of the quantizer is estimated from. The correction of a small tone
     * depends on it where the noise is well under a step (the expected code's slope is steep near
     * each threshold): from 256 samples, as a single sine's gain takes it, the estimate scattered by
     * a quarter from record to record at a twentieth of a step and the corrected phasors by up to
     * four times the fit's own scatter; from 32768 by about 2 to 3 %, and the corrected phasors scatter as
     * the fit's (measured on three-tone records, MultisineQuantizationTests).
     */
    static final int NOISE_SAMPLES = 1 << 15;

    private MultisineQuantization() {
    }

    /**
     * The tones' phasors of samples {@code y} with the repeatable quantization error taken off. The
     * error is worked out twice: about the fitted phasors, then again about the phasors once corrected
     * (the noise held at its first estimate), and that second error is the one taken off the fit. The
     * fitted phasors carry the error itself, so an error worked out about them is off where the expected
     * code is steep; on the 100 mH part resonating in its sweep some tones kept one to two standard
     * uncertainties of it the same way on every record, within about half a u after the second. (Repeated
     * further with the noise estimated afresh each time, the correction diverged: the noise estimate
     * follows the model it is made about.)
     */
    public static SineFitResult[] corrected(double[] y, double intervalSecond, double[] tonesHz, SineFitResult[] fit) {
        double step = codeStep(y);
        if (!(step > 0) || fit.length == 0) {
            return fit;
        }
        double[] model = synthesized(y.length, intervalSecond, tonesHz, fit);
        double sigma = Quantization.noise(y, model, step, NOISE_SAMPLES);
        if (sigma > 0.9 * step) {
            return fit;
        }
        int n = y.length;
        double rss = 0;
        for (int i = 0; i < n; i++) {
            double r = y[i] - model[i];
            rss += r * r;
        }
        // the fit's own residual variance, whose covariance the departures' estimate rescales
        double fitVariance = rss / (n - 2 * tonesHz.length - 1);
        SineFitResult[] first = minus(fit, MultisineFit.fit(expectedError(y, model, step, sigma, null), intervalSecond,
                tonesHz), null);
        double[] again = synthesized(n, intervalSecond, tonesHz, first);
        double[] departure = new double[n];
        SineFitResult[] err = MultisineFit.fit(expectedError(y, again, step, sigma, departure), intervalSecond, tonesHz);
        double sum = 0;
        for (double d : departure) {
            sum += d;
        }
        double[] doubled = new double[fit.length];
        for (int k = 0; k < fit.length; k++) {
            doubled[k] = 4 * Math.PI * tonesHz[k] * intervalSecond;
        }
        double[] twice = MultisineFit.dataSums(departure, doubled);
        double[][] covariance = new double[fit.length][];
        for (int k = 0; k < fit.length; k++) {
            covariance[k] = covariance(fit[k], n, fitVariance, sum, new double[] {twice[2 * k], twice[2 * k + 1]});
        }
        return minus(fit, err, covariance);
    }

    /**
     * Each sample's expected quantizer output about {@code model} (the noise ahead of the quantizer
     * averaged over) less the model: the repeatable error, sample by sample. With {@code departure}
     * given, each sample's squared departure from its expected code goes there: what is left random
     * once the repeatable error is known (the noise as the quantizer passes it on, and anything
     * unmodelled).
     */
    private static double[] expectedError(double[] y, double[] model, double step, double sigma, double[] departure) {
        double origin = y[0];
        double s = Math.max(sigma / step, 1e-6);
        double[] error = new double[y.length];
        if (s < TABLE_FROM) {
            for (int i = 0; i < y.length; i++) {
                double u = (model[i] - origin) / step;
                error[i] = step * (expectedCode(u - Math.rint(u), s) - (u - Math.rint(u)));
            }
        } else {
            CodeTable table = new CodeTable(s);
            for (int i = 0; i < y.length; i++) {
                error[i] = step * table.at((model[i] - origin) / step);
            }
        }
        if (departure != null) {
            for (int i = 0; i < y.length; i++) {
                double d = y[i] - model[i] - error[i];
                departure[i] = d * d;
            }
        }
        return error;
    }

    /**
     * The expected code of a level {@code f} codes from code 0 (|f| at most a half) with noise of {@code s}
     * codes ahead of the quantizer: sum_j Phi((f - j + 1/2) / s) - Phi((-j + 1/2 - f) / s).
     */
    static double expectedCode(double f, double s) {
        int reach = (int) Math.ceil(REACH * s) + 1;
        double e = 0;
        for (int j = 1; j <= reach; j++) {
            e += phi((f - j + 0.5) / s) - phi((-j + 0.5 - f) / s);
        }
        return e;
    }

    /** Noise (in codes) from which the expected code is interpolated in a table, not worked out at every sample. */
    static final double TABLE_FROM = 0.005;

    /**
     * The expected code's departure from the level, E[rint(u + s z)] - u, as a function of the level
     * {@code u} in codes: periodic in u with period one code, so tabulated once over one code
     * ({@value #NODES_PER_NOISE} nodes to the noise's standard deviation) and read at every sample by
     * cubic interpolation through four nodes (Catmull-Rom: common practice, no source), which follows
     * the direct sum to 3e-8 of a code for noise of 0.005 to 0.9 code (measured), beside the 1.5e-7 of
     * each {@link #phi}. A long record takes the exponentials of a few thousand nodes instead of several
     * a sample.
     */
    static final class CodeTable {
        private final double[] h;
        private final int nodes;

        CodeTable(double s) {
            nodes = (int) Math.ceil(NODES_PER_NOISE / s);
            h = new double[nodes];
            for (int k = 0; k < nodes; k++) {
                double f = (double) k / nodes;
                double g = f > 0.5 ? f - 1 : f;
                h[k] = expectedCode(g, s) - g;
            }
        }

        double at(double u) {
            double x = (u - Math.floor(u)) * nodes;
            int k = (int) x;
            if (k >= nodes) {
                k = nodes - 1;
            }
            double t = x - k;
            double p0 = h[(k - 1 + nodes) % nodes];
            double p1 = h[k];
            double p2 = h[(k + 1) % nodes];
            double p3 = h[(k + 2) % nodes];
            return p1 + 0.5 * t * (p2 - p0 + t * (2 * p0 - 5 * p1 + 4 * p2 - p3 + t * (3 * (p1 - p2) + p3 - p0)));
        }
    }

    /** Table nodes per standard deviation of the noise, in codes. */
    static final int NODES_PER_NOISE = 64;

    /** The fit less the error's phasors; with its covariance replaced where one is given. */
    private static SineFitResult[] minus(SineFitResult[] fit, SineFitResult[] err, double[][] covariance) {
        SineFitResult[] out = new SineFitResult[fit.length];
        for (int k = 0; k < fit.length; k++) {
            SineFitResult f = fit[k];
            double[] c = covariance == null ? new double[] {f.varianceCosine(), f.varianceSine(), f.covarianceCosineSine()}
                    : covariance[k];
            out[k] = new SineFitResult(f.frequencyHz(), f.cosineCoefficient() - err[k].cosineCoefficient(),
                    f.sineCoefficient() - err[k].sineCoefficient(), f.offset() - err[k].offset(), f.residualRms(),
                    c[0], c[1], c[2], f.samples());
        }
        return out;
    }

    /**
     * A tone's phasor covariance from the samples' departures from their expected codes d_i, by the
     * heteroscedasticity-consistent ("sandwich") estimator (H. White, "A heteroskedasticity-consistent
     * covariance matrix estimator and a direct test for heteroskedasticity", Econometrica 48, 1980,
     * pp. 817-838): for a record of whole periods, where the tones' regressors are orthogonal with
     * sum cos^2 = sum sin^2 = N / 2, var(a) = (2 / N)^2 sum d_i^2 cos^2(w t_i), var(b) the same with
     * sin^2 and cov(a, b) with cos sin. The fit's own covariance assumes every sample alike (white
     * noise of one variance), which a quantizer does not give: a sample near a code's threshold
     * varies, one between thresholds does not, and where they fall follows the signal, so the spread
     * is not white; and the residual it is worked out from holds the repeatable error as well, which
     * is corrected, not random. Each entry is the fit's own, scaled by the ratio of the two estimates
     * for its regressor (so a record not of whole periods keeps the fit's structure).
     *
     * @param sum   sum of d_i^2
     * @param twice {sum d_i^2 cos(2 w t_i), sum d_i^2 sin(2 w t_i)}
     */
    private static double[] covariance(SineFitResult f, int n, double fitVariance, double sum, double[] twice) {
        if (!(fitVariance > 0)) {
            return new double[] {f.varianceCosine(), f.varianceSine(), f.covarianceCosineSine()};
        }
        // sum d^2 cos^2 = (sum d^2 + sum d^2 cos 2wt) / 2; over sum cos^2 = N / 2
        double cosine = Math.max(0, (sum + twice[0]) / n) / fitVariance;
        double sine = Math.max(0, (sum - twice[0]) / n) / fitVariance;
        double cross = 2 * twice[1] / ((double) n * n);
        return new double[] {f.varianceCosine() * cosine, f.varianceSine() * sine,
            f.covarianceCosineSine() * Math.sqrt(cosine * sine) + cross};
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
     * The fitted tones and offset, sample by sample: each tone by the recurrence of a sampled sinusoid,
     * v[i + 1] = 2 cos(w) v[i] - v[i - 1], in Reinsch's form for a step under a quarter turn (the
     * difference d[i + 1] = v[i + 1] - v[i] = d[i] - 4 sin^2(w / 2) v[i] carried instead of v[i - 1], so
     * that a step near zero, where 2 cos(w) is near 2, does not magnify rounding: Stoer and Bulirsch,
     * Introduction to Numerical Analysis, 1980, section 2.3.4, from memory), one multiplication and two
     * additions a sample, started exactly every {@value #ANCHOR} samples; four tones side by side in one
     * pass so their recurrences overlap.
     */
    static double[] synthesized(int n, double dt, double[] tonesHz, SineFitResult[] fit) {
        double[] s = new double[n];
        java.util.Arrays.fill(s, fit[0].offset());
        List<Integer> small = new ArrayList<>();
        for (int k = 0; k < tonesHz.length; k++) {
            double w = 2 * Math.PI * tonesHz[k] * dt;
            if (Math.cos(w) >= 0) {
                small.add(k);
            } else {
                addLarge(s, w, fit[k]);
            }
        }
        for (int j = 0; j < small.size(); j += 4) {
            double[] w = new double[4];
            SineFitResult[] f = new SineFitResult[4];
            for (int i = 0; i < 4 && j + i < small.size(); i++) {
                int k = small.get(j + i);
                w[i] = 2 * Math.PI * tonesHz[k] * dt;
                f[i] = fit[k];
            }
            addFour(s, w, f);
        }
        return s;
    }

    /** Up to four tones of steps under a quarter turn added to {@code s} in Reinsch's form (a null fit: no tone). */
    private static void addFour(double[] s, double[] w, SineFitResult[] f) {
        double[] a = new double[4];
        double[] b = new double[4];
        double[] h = new double[4];
        double[] lambda = new double[4];
        for (int t = 0; t < 4; t++) {
            a[t] = f[t] == null ? 0 : f[t].cosineCoefficient();
            b[t] = f[t] == null ? 0 : f[t].sineCoefficient();
            h[t] = Math.sin(w[t] / 2);
            lambda[t] = -4 * h[t] * h[t];
        }
        double[] v = new double[4];
        double[] d = new double[4];
        for (int start = 0; start < s.length; start += ANCHOR) {
            for (int t = 0; t < 4; t++) {
                v[t] = a[t] * Math.cos(w[t] * start) + b[t] * Math.sin(w[t] * start);
                // v[start] - v[start - 1] from the sum-to-product forms, without cancellation
                d[t] = 2 * h[t] * (b[t] * Math.cos(w[t] * (start - 0.5)) - a[t] * Math.sin(w[t] * (start - 0.5)));
            }
            double v0 = v[0];
            double v1 = v[1];
            double v2 = v[2];
            double v3 = v[3];
            double d0 = d[0];
            double d1 = d[1];
            double d2 = d[2];
            double d3 = d[3];
            double l0 = lambda[0];
            double l1 = lambda[1];
            double l2 = lambda[2];
            double l3 = lambda[3];
            int end = Math.min(s.length, start + ANCHOR);
            for (int i = start; i < end; i++) {
                s[i] += (v0 + v1) + (v2 + v3);
                d0 += l0 * v0;
                d1 += l1 * v1;
                d2 += l2 * v2;
                d3 += l3 * v3;
                v0 += d0;
                v1 += d1;
                v2 += d2;
                v3 += d3;
            }
        }
    }

    /**
     * A tone of a step of a quarter turn or more (none in a multisine's record, which holds several
     * samples a cycle of its highest tone's harmonics) added to {@code s} by a phasor turned each sample,
     * which keeps its accuracy at any step where the recurrence near half a turn does not.
     */
    private static void addLarge(double[] s, double w, SineFitResult fit) {
        double a = fit.cosineCoefficient();
        double b = fit.sineCoefficient();
        double cd = Math.cos(w);
        double sd = Math.sin(w);
        for (int start = 0; start < s.length; start += ANCHOR) {
            double c = Math.cos(w * start);
            double sn = Math.sin(w * start);
            int end = Math.min(s.length, start + ANCHOR);
            for (int i = start; i < end; i++) {
                s[i] += a * c + b * sn;
                double next = c * cd - sn * sd;
                sn = sn * cd + c * sd;
                c = next;
            }
        }
    }
}
