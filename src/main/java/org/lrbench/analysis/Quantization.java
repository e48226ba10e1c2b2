package org.lrbench.analysis;

import java.util.Arrays;
import java.util.Random;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;
import org.apache.commons.math3.optim.univariate.UnivariatePointValuePair;
import org.apache.commons.math3.special.BesselJ;

/**
 * The repeatable part of a converter's quantization error in a sine fit. A sine of amplitude A
 * about a level c, through a uniform quantizer of step D whose thresholds sit at t_k, has a
 * fundamental of amplitude A G with the describing-function gain (a Fourier coefficient of the
 * staircase, a step D at each threshold; its sine part is zero by symmetry, so the phase is not
 * biased):
 * <pre>
 *   G(A) = (2 D / (pi A)) sum_k sqrt(1 - ((t_k - c) / A)^2)     over |t_k - c| &lt; A
 * </pre>
 * With Gaussian noise of standard deviation s ahead of the quantizer each term is averaged over
 * the noise (Gauss-Hermite quadrature), which is how noise dithers the error away (G tends to 1
 * once s is near D). G differs from 1 by a few parts in 10^4 for a sine spanning a hundred codes
 * with little noise, the same every time the same signal is captured on the same range, so it is
 * corrected as a known systematic effect (JCGM 100:2008 3.2.4) rather than counted as noise. The
 * average over the sine's phase assumes the record's samples fall at phases spread over the
 * period, which holds when the sample clock is not locked to the signal.
 * <p>
 * The step and the thresholds are read from the samples themselves (every sample on one grid); the
 * noise ahead of the quantizer by maximum likelihood from which code each sample landed in, given
 * the fitted sine. A record with no grid (averaged or already-scaled data) gets no correction.
 */
public final class Quantization {
    /** Gauss-Hermite nodes and weights, 16 points (Abramowitz and Stegun, Table 25.10). */
    private static final double[] GH_X = {0.2734810461381525, 0.8229514491446559, 1.3802585391988808,
        1.9517879909162540, 2.5462021578474814, 3.1769991619799560, 3.8694479048601227, 4.6887389393058184};
    private static final double[] GH_W = {5.079294790166137e-1, 2.806474585285337e-1, 8.381004139898583e-2,
        1.288031153550997e-2, 9.322840086241805e-4, 2.711860092537882e-5, 2.320980844865211e-7,
        2.654807474011182e-10};

    private static final int SUBSET = 256;

    private Quantization() {
    }

    /**
     * The correction of one channel's fitted sine: divide its phasor by {@code gain}.
     * {@code codeStep} NaN when the record shows no quantization grid (then gain is 1);
     * {@code noise} the noise ahead of the quantizer estimated from the record; {@code gainUncertainty}
     * the standard uncertainty of the gain, from the noise estimate's own uncertainty;
     * {@code varianceCosine}, {@code varianceSine}, {@code covarianceCosineSine} the covariance of
     * the fitted sine's coefficients that noise and quantization leave after the correction (NaN
     * when there is no grid: then the fit's own, from its residuals, stands).
     */
    public record Correction(double gain, double gainUncertainty, double codeStep, double noise,
                             double varianceCosine, double varianceSine, double covarianceCosineSine) {
        public static final Correction NONE = new Correction(1, 0, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
                Double.NaN);

        /** The fit with its sine divided by the gain and, where known, this covariance in place of the fit's own. */
        public SineFitResult apply(SineFitResult fit) {
            SineFitResult scaled = fit.scaled(1 / gain);
            if (Double.isNaN(varianceCosine)) {
                return scaled;
            }
            return new SineFitResult(scaled.frequencyHz(), scaled.cosineCoefficient(), scaled.sineCoefficient(),
                    scaled.offset(), scaled.residualRms(), varianceCosine, varianceSine, covarianceCosineSine,
                    scaled.samples());
        }
    }

    /** Trials of the parametric bootstrap of the fitted sine's scatter. */
    static final int TRIALS = 24;

    /** The correction for samples {@code y} (volts) whose sine fit at a known frequency is {@code fit}. */
    public static Correction of(double[] y, double intervalSecond, SineFitResult fit) {
        double step = codeStep(y);
        if (!(step > 0) || fit.amplitude() < 2 * step) {
            // no grid, or a sine of a few codes where no smooth correction applies
            return Correction.NONE;
        }
        double origin = y[0];
        double[] s = fitted(y.length, intervalSecond, fit);
        double sigma = noise(y, s, step);
        if (sigma > 0.9 * step) {
            // dithered: the residual variance is the noise's plus the uniform step's, s^2 + D^2 / 12
            // (common practice, no source), which measures any noise however large
            sigma = Math.sqrt(Math.max(sigma * sigma, fit.residualRms() * fit.residualRms() - step * step / 12));
        }
        double gain = gain(fit.amplitude(), fit.offset(), step, origin, sigma);
        // the noise estimate is uncertain by about 1/sqrt(number of samples near a threshold); the
        // gain's sensitivity to it is taken from a factor-of-two change either way
        double high = gain(fit.amplitude(), fit.offset(), step, origin, 2 * sigma);
        double low = gain(fit.amplitude(), fit.offset(), step, origin, 0.5 * sigma);
        double u = Math.abs(high - low) / (2 * Math.sqrt(3));
        double[] cov = scatter(y.length, intervalSecond, fit, gain, step, origin, sigma);
        return new Correction(gain, u, step, sigma, cov[0], cov[1], cov[2]);
    }

    /**
     * How much noise and quantization scatter the corrected sine's coefficients for this record's
     * time structure, by parametric bootstrap (Efron and Tibshirani, An Introduction to the
     * Bootstrap, 1993, chapter 6, from memory): the fitted sine, at phases spread over the period,
     * plus Gaussian noise of the estimated sigma, through the same grid, fitted again; the errors,
     * turned back to the record's own phase, give the covariance. Unlike the fit's residual
     * variance, which treats quantization as white, this sees a record whose samples fall on few
     * distinct phases (a sample rate close to a multiple of the signal's frequency), where the same
     * quantization error repeats cycle after cycle and does not average out. Seeded from the
     * record, so the same record always gives the same numbers.
     */
    static double[] scatter(int n, double dt, SineFitResult fit, double gain, double step, double origin, double sigma) {
        double a = fit.amplitude() / gain;
        double phase = fit.phase();
        double w = 2 * Math.PI * fit.frequencyHz() * dt;
        Random rnd = new Random(Double.doubleToLongBits(fit.amplitude()) ^ n);
        double[] y = new double[n];
        double scc = 0;
        double sss = 0;
        double scs = 0;
        for (int k = 0; k < TRIALS; k++) {
            double shift = 2 * Math.PI * (k + rnd.nextDouble()) / TRIALS;
            for (int i = 0; i < n; i++) {
                double v = a * Math.cos(w * i + phase + shift) + fit.offset() + sigma * rnd.nextGaussian();
                y[i] = origin + step * Math.rint((v - origin) / step);
            }
            SineFitResult r = SineFit.fit(y, dt, fit.frequencyHz());
            // error of the corrected phasor against the truth, turned back by the shift
            double ec = r.cosineCoefficient() / gain - a * Math.cos(phase + shift);
            double es = r.sineCoefficient() / gain + a * Math.sin(phase + shift);
            double c = Math.cos(shift);
            double sn = Math.sin(shift);
            // the phasor (cos coefficient, -sine coefficient) turned by -shift
            double re = ec * c + (-es) * sn;
            double im = -ec * sn + (-es) * c;
            scc += re * re;
            sss += im * im;
            scs += re * -im;
        }
        return new double[] {scc / TRIALS, sss / TRIALS, scs / TRIALS};
    }

    /**
     * The converter step of a record: the smallest gap between distinct sample values, when every
     * sample lies on that grid (to 1e-6 of a step); NaN otherwise.
     */
    public static double codeStep(double[] y) {
        if (y.length < 8) {
            return Double.NaN;
        }
        double[] v = y.clone();
        Arrays.sort(v);
        double span = v[v.length - 1] - v[0];
        if (!(span > 0)) {
            return Double.NaN;
        }
        double step = Double.POSITIVE_INFINITY;
        int distinct = 1;
        for (int i = 1; i < v.length; i++) {
            double d = v[i] - v[i - 1];
            if (d > 1e-9 * span) {
                step = Math.min(step, d);
                distinct++;
            }
        }
        if (distinct < 3 || distinct > v.length / 2 || !Double.isFinite(step)) {
            return Double.NaN;
        }
        for (double x : v) {
            double k = (x - v[0]) / step;
            if (Math.abs(k - Math.rint(k)) > 1e-6 * Math.max(1, Math.abs(k)) + 1e-6) {
                return Double.NaN;
            }
        }
        return step;
    }

    /**
     * The describing-function gain of the quantizer with step {@code step} and a level at
     * {@code origin} for a sine of {@code amplitude} about {@code centre}, with Gaussian noise
     * {@code sigma} ahead of it. Solves for the true amplitude whose fundamental equals the fitted one.
     */
    static double gain(double fittedAmplitude, double centre, double step, double origin, double sigma) {
        double a = fittedAmplitude;
        double g = 1;
        for (int i = 0; i < 6; i++) {
            g = forwardGain(a, centre, step, origin, sigma);
            a = fittedAmplitude / g;
        }
        return g;
    }

    /**
     * The fundamental's gain for a true amplitude {@code a}: the staircase sum, with the noise
     * averaged by quadrature, while the noise is under a twentieth of a step; above, where the sum's
     * quadrature loses accuracy at the sine's turning points, the equivalent Fourier form. The
     * rounding error of the grid is a sawtooth, Q(x) - x = -D sum_k (-1)^(k+1) sin(2 pi k u) / (pi k)
     * with u = (x - origin) / D; Gaussian noise multiplies its k-th term by exp(-2 pi^2 k^2 s^2 / D^2)
     * and the sine's fundamental of each term follows from the Jacobi-Anger expansion, so
     * G = 1 - (2 D / (pi A)) sum_k (-1)^(k+1) / k exp(-2 pi^2 k^2 s^2 / D^2) cos(2 pi k (c - origin) / D) J1(2 pi k A / D).
     */
    static double forwardGain(double a, double centre, double step, double origin, double sigma) {
        return sigma >= 0.05 * step ? fourierGain(a, centre, step, origin, sigma) : staircaseGain(a, centre, step, origin, sigma);
    }

    static double fourierGain(double a, double centre, double step, double origin, double sigma) {
        {
            double sum = 0;
            for (int k = 1; ; k++) {
                double damping = Math.exp(-2 * Math.PI * Math.PI * k * k * sigma * sigma / (step * step));
                if (damping < 1e-16) {
                    break;
                }
                double sign = k % 2 == 1 ? 1 : -1;
                sum += sign / k * damping * Math.cos(2 * Math.PI * k * (centre - origin) / step)
                        * besselJ1(2 * Math.PI * k * a / step);
            }
            return 1 - 2 * step / (Math.PI * a) * sum;
        }
    }

    /**
     * J1(x): Commons Math below x = 100, the Hankel asymptotic expansion above (Abramowitz and
     * Stegun 9.2.5, two terms of P and Q; relative error under 1e-8 there).
     */
    static double besselJ1(double x) {
        if (x < 100) {
            return BesselJ.value(1, x);
        }
        double chi = x - 0.75 * Math.PI;
        double p = 1 + 15 / (128 * x * x);
        double q = 3 / (8 * x) - 315 / (3072 * x * x * x);
        return Math.sqrt(2 / (Math.PI * x)) * (p * Math.cos(chi) - q * Math.sin(chi));
    }

    static double staircaseGain(double a, double centre, double step, double origin, double sigma) {
        double reach = a + 6 * sigma;
        // thresholds origin + (j + 1/2) step within centre +/- reach
        long first = (long) Math.ceil((centre - reach - origin) / step - 0.5);
        long last = (long) Math.floor((centre + reach - origin) / step - 0.5);
        double sum = 0;
        for (long j = first; j <= last; j++) {
            double t = origin + (j + 0.5) * step - centre;
            if (sigma <= 1e-4 * step) {
                sum += arc(t / a);
            } else {
                double e = 0;
                for (int i = 0; i < GH_X.length; i++) {
                    double d = Math.sqrt(2) * sigma * GH_X[i];
                    e += GH_W[i] * (arc((t - d) / a) + arc((t + d) / a));
                }
                sum += e / Math.sqrt(Math.PI);
            }
        }
        return 2 * step * sum / (Math.PI * a);
    }

    private static double arc(double u) {
        return Math.abs(u) < 1 ? Math.sqrt(1 - u * u) : 0;
    }

    private static double[] fitted(int n, double dt, SineFitResult fit) {
        double w = 2 * Math.PI * fit.frequencyHz() * dt;
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            s[i] = fit.cosineCoefficient() * Math.cos(w * i) + fit.sineCoefficient() * Math.sin(w * i) + fit.offset();
        }
        return s;
    }

    /**
     * The noise ahead of the quantizer by maximum likelihood: each sample y_n is the code whose
     * bin [y_n - D/2, y_n + D/2] the fitted value plus noise fell in; the log-likelihood over sigma
     * is maximised by golden-section search on log sigma between 1e-3 and 1 step (beyond, the
     * quantization is dithered away: the gain differs from 1 by less than exp(-2 pi^2)).
     */
    static double noise(double[] y, double[] s, double step) {
        // at most SUBSET samples, evenly spaced through the record: enough for a correction that
        // hardly depends on sigma where sigma is small
        return noise(y, s, step, SUBSET, Math.log(1e-3 * step), Math.log(step), 1e-4);
    }

    /**
     * The same from at most {@code samples} samples, evenly spaced through the record: first from
     * {@value #SUBSET}, then searched again from all of them within a factor {@value #REFINE} of that
     * first estimate, to 0.1 % (where more samples make the estimate surer, its search need not start
     * from the whole range again).
     */
    static double noise(double[] y, double[] s, double step, int samples) {
        if (samples <= SUBSET) {
            return noise(y, s, step, samples, Math.log(1e-3 * step), Math.log(step), 1e-4);
        }
        double rough = noise(y, s, step, SUBSET);
        double lo = Math.max(Math.log(1e-3 * step), Math.log(rough / REFINE));
        double hi = Math.min(Math.log(step), Math.log(rough * REFINE));
        return noise(y, s, step, samples, lo, hi, 1e-3);
    }

    /** How far from the first estimate the second search looks (a factor either way). */
    private static final double REFINE = 2.5;

    /**
     * The likelihood's maximum over log sigma in [lo, hi], to {@code tolerance} in log sigma, by Brent's
     * method (golden sections with parabolic steps; R. P. Brent, Algorithms for Minimization without
     * Derivatives, 1973, chapter 5), as Commons Math implements it: the log-likelihood is smooth in log
     * sigma, so the parabolic steps take about half the golden sections' evaluations, each a pass over up
     * to 32768 samples (measured on MultisineQuantizationTests' records: mostly 8 where the golden
     * sections took 16 on the refined search, 9 to 11 where they took 24 on the rough one). A range
     * that is empty (a first estimate beyond 2.5 steps: dithered, which the callers test for) gives its
     * lower end.
     */
    private static double noise(double[] y, double[] s, double step, int samples, double lo, double hi, double tolerance) {
        int stride = Math.max(1, (y.length + samples - 1) / samples);
        int m = (y.length + stride - 1) / stride;
        double[] toUpper = new double[m];
        double[] toLower = new double[m];
        for (int j = 0; j < m; j++) {
            int i = j * stride;
            toUpper[j] = y[i] + step / 2 - s[i];
            toLower[j] = y[i] - step / 2 - s[i];
        }
        if (!(hi > lo)) {
            return Math.exp(lo);
        }
        // Brent's tolerance is 2 (rel |x| + abs): abs is half the tolerance asked
        UnivariatePointValuePair best = new BrentOptimizer(1e-10, tolerance / 2).optimize(new MaxEval(200),
                new UnivariateObjectiveFunction(x -> logLikelihood(toUpper, toLower, Math.exp(x))), GoalType.MAXIMIZE,
                new SearchInterval(lo, hi));
        return Math.exp(best.getPoint());
    }

    /** Sum of log P(sample in its bin); a sample more than 7 sigma inside its bin adds log(1) = 0. */
    private static double logLikelihood(double[] toUpper, double[] toLower, double sigma) {
        double sum = 0;
        double k = 1 / (sigma * Math.sqrt(2));
        double far = 7 * sigma;
        for (int i = 0; i < toUpper.length; i++) {
            if (toUpper[i] > far && toLower[i] < -far) {
                continue;
            }
            double upper = toUpper[i] * k;
            double lower = toLower[i] * k;
            // P = (erfc(lower) - erfc(upper)) / 2, computed on the side where it does not cancel
            double p = lower >= 0 ? 0.5 * (erfc(lower) - erfc(upper))
                    : upper <= 0 ? 0.5 * (erfc(-upper) - erfc(-lower))
                    : 1 - 0.5 * (erfc(-lower) + erfc(upper));
            sum += Math.log(Math.max(p, 1e-300));
        }
        return sum;
    }

    /**
     * The complementary error function with fractional error under 1.2e-7 everywhere (Chebyshev
     * fit, Press et al., Numerical Recipes, 2nd ed., section 6.2, from memory); accurate in the far tail,
     * where the likelihood of a sample that missed its bin is decided.
     */
    static double erfc(double x) {
        double z = Math.abs(x);
        double t = 1 / (1 + 0.5 * z);
        double ans = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418
                + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587
                + t * (-0.82215223 + t * 0.17087277)))))))));
        return x >= 0 ? ans : 2 - ans;
    }
}
