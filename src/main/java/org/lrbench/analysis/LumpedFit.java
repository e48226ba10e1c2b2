package org.lrbench.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.EnumSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.distribution.FDistribution;
import org.lrbench.analysis.fit.FitException;
import org.lrbench.analysis.fit.FitModel;
import org.lrbench.analysis.fit.FitResult;
import org.lrbench.analysis.fit.LeastSquares;

/**
 * Fits the {@link LumpedModel} to a sweep by weighted Levenberg-Marquardt (real and imaginary parts
 * of each point, whitened by the covariance of the two), from every start the data
 * suggest, keeping the fit with the least chi-square: the series model, and, when the parallel
 * capacitance is wanted, the admittance: for a winding well above its R/L corner,
 * omega Im(1/Z) = -1/L + omega^2 C_p, a straight line in omega^2 whose intercept and slope give
 * L and C_p in closed form, through self-resonance as below it. A fit whose L is not positive, or
 * whose reduced chi-square stays above {@value #CHI_LIMIT} (no model describes the data), is refused.
 * <p>
 * An optional term is kept only when it improves the fit significantly: the extra-sum-of-squares
 * F test at the 5 % level (one added parameter against the residual variance of the fit with it).
 * A term with a negative estimate, one that leaves the covariance singular, and the weakest term
 * that fails the test are fixed at their null value in turn and the fit repeated; the result says
 * which were dropped and why. A term the test cannot decide on (it fails the test, whatever the
 * sign of its estimate) may still be there: the result keeps the fit that still had it, and the
 * reported values average the two ({@link SweepAnalysis}). Only a negative estimate the test finds
 * significant is unphysical outright and left out with no such average.
 */
public final class LumpedFit {
    /** Reduced chi-square above which the model does not describe the data and no value is reported. */
    public static final double CHI_LIMIT = 1000;
    /** What a term the test cannot decide on does to the reported values ({@link SweepAnalysis}). */
    static final String AVERAGED = "left out of the model; each reported value is the mean of the fits with and"
            + " without it";

    private LumpedFit() {
    }

    /**
     * The fit: full parameter vector, its covariance (zero rows for fixed ones), dropped parameters,
     * and the factor the covariance is scaled by: the reduced chi-square when above 1 (residuals
     * wider than their uncertainties say: a dispersion nothing explains), unless the scatter that
     * the bench's own effects leave explains it ({@link #withExpectedChiSquare}).
     */
    public record Result(double[] parameters, double[][] covariance, Set<LumpedParameter> free,
                         List<String> dropped, double reducedChiSquare, int degreesOfFreedom,
                         double capacitanceUpperBound, List<Omitted> omitted, double covarianceScale) {

        public double value(LumpedParameter p) {
            return parameters[p.ordinal()];
        }

        /** Standard uncertainty from the fit (its covariance scaled by {@link #covarianceScale}). */
        public double uncertainty(LumpedParameter p) {
            return Math.sqrt(covariance[p.ordinal()][p.ordinal()] * covarianceScale);
        }

        public double covariance(LumpedParameter a, LumpedParameter b) {
            return covariance[a.ordinal()][b.ordinal()] * covarianceScale;
        }

        /** The chi-square over its degrees of freedom that is expected once explained scatter is added. */
        public Result withExpectedChiSquare(double expected) {
            double scale = Math.max(1, reducedChiSquare * degreesOfFreedom / expected);
            return new Result(parameters, covariance, free, dropped, reducedChiSquare, degreesOfFreedom,
                    capacitanceUpperBound, omitted, scale);
        }
    }

    /**
     * A model term the test could not decide on, with the fit that still had it: its parameters,
     * their covariance (unscaled), its free parameters, reduced chi-square and degrees of freedom.
     */
    public record Omitted(LumpedParameter term, double[] parametersWith, double[][] covarianceWith,
                          Set<LumpedParameter> freeWith, double reducedChiSquareWith, int degreesOfFreedomWith) {
    }

    public static Result fit(List<ImpedancePoint> points, Set<LumpedParameter> wanted) {
        SeriesModel series = SeriesModelFit.fit(points);
        Set<LumpedParameter> free = EnumSet.of(LumpedParameter.R_DC, LumpedParameter.L);
        free.addAll(wanted);
        List<String> dropped = new ArrayList<>();
        List<Omitted> omitted = new ArrayList<>();
        double[] scale = scales(points, series);
        double cUpper = Double.NaN;
        List<double[]> starts = starts(points, series);
        while (true) {
            if (2 * points.size() <= free.size()) {
                // too few points for this many parameters: drop optional ones first
                LumpedParameter last = lastOptional(free);
                if (last == null) {
                    throw new FitException("a sweep of " + points.size() + " points cannot fit R and L", null);
                }
                free.remove(last);
                dropped.add(last.key() + ": too few sweep points to identify it; fixed at 0");
                continue;
            }
            FitResult r;
            try {
                r = best(points, free, starts, scale);
            } catch (FitException e) {
                LumpedParameter last = lastOptional(free);
                if (last == null) {
                    throw e;
                }
                free.remove(last);
                dropped.add(last.key() + ": not identifiable from this sweep (singular fit); fixed at 0");
                continue;
            }
            double[] full = expand(r.parameters(), free, scale);
            double[][] cov = expandCovariance(r.covariance(), free, scale);
            double chi = r.reducedChiSquare();
            double inflate = chi > 1 ? chi : 1;
            if (free.contains(LumpedParameter.C_P)) {
                double v = full[LumpedParameter.C_P.ordinal()];
                cUpper = Math.max(v, 0) + 2 * Math.sqrt(cov[LumpedParameter.C_P.ordinal()][LumpedParameter.C_P.ordinal()] * inflate);
            }
            String reason = null;
            LumpedParameter drop = null;
            double weakest = Double.POSITIVE_INFINITY;
            boolean mayBeThere = false;
            for (LumpedParameter p : free) {
                if (p.optional() && full[p.ordinal()] < 0) {
                    drop = p;
                    Set<LumpedParameter> without = EnumSet.copyOf(free);
                    without.remove(p);
                    double f = fStatistic(points, without, full, scale, r);
                    double critical = critical(r.degreesOfFreedom());
                    // a negative estimate within the noise of zero: the term may still be there
                    mayBeThere = f < critical;
                    reason = mayBeThere
                            ? String.format(Locale.ROOT, "%s: %.4g +/- %.2g is negative but within the noise of zero"
                                    + " (F = %.3g < %.3g, extra-sum-of-squares test at 5 %%); %s", p.key(),
                                    full[p.ordinal()], Math.sqrt(cov[p.ordinal()][p.ordinal()] * inflate), f, critical,
                                    AVERAGED)
                            : String.format(Locale.ROOT, "%s: %.4g +/- %.2g is unphysical (negative); fixed at 0",
                                    p.key(), full[p.ordinal()], Math.sqrt(cov[p.ordinal()][p.ordinal()] * inflate));
                    break;
                }
            }
            if (drop == null) {
                for (LumpedParameter p : free) {
                    if (!p.optional()) {
                        continue;
                    }
                    Set<LumpedParameter> without = EnumSet.copyOf(free);
                    without.remove(p);
                    double f = fStatistic(points, without, full, scale, r);
                    double critical = critical(r.degreesOfFreedom());
                    if (f < critical && f < weakest) {
                        weakest = f;
                        drop = p;
                        reason = String.format(Locale.ROOT, "%s: %.4g +/- %.2g does not improve the fit significantly"
                                + " (F = %.3g < %.3g, extra-sum-of-squares test at 5 %%); %s", p.key(),
                                full[p.ordinal()], Math.sqrt(cov[p.ordinal()][p.ordinal()] * inflate), f, critical,
                                AVERAGED);
                    }
                }
            }
            if (drop != null) {
                if (mayBeThere || weakest < Double.POSITIVE_INFINITY) {
                    // left out by the test, not for an unphysical sign: it may still be there
                    omitted.add(new Omitted(drop, full.clone(), cov, EnumSet.copyOf(free), chi,
                            r.degreesOfFreedom()));
                }
                free.remove(drop);
                dropped.add(reason);
                continue;
            }
            refuseUnphysical(full, chi, free);
            return new Result(full, cov, EnumSet.copyOf(free), List.copyOf(dropped), chi, r.degreesOfFreedom(), cUpper,
                    List.copyOf(omitted), Math.max(1, chi));
        }
    }

    /**
     * The extra-sum-of-squares F statistic of one term: the chi-square of the fit without it less
     * that of the fit with it, over the reduced chi-square with it (one added parameter; Bevington
     * and Robinson, Data Reduction and Error Analysis, 3rd ed., section 11.4, from memory).
     */
    private static double fStatistic(List<ImpedancePoint> points, Set<LumpedParameter> without, double[] from,
                                     double[] scale, FitResult with) {
        double chiWith = with.reducedChiSquare() * with.degreesOfFreedom();
        double chiWithout;
        try {
            chiWithout = best(points, without, List.of(from), scale).reducedChiSquare() * (with.degreesOfFreedom() + 1);
        } catch (FitException e) {
            return Double.POSITIVE_INFINITY; // the reduced model cannot be fitted: keep the term
        }
        return (chiWithout - chiWith) / (chiWith / with.degreesOfFreedom());
    }

    /** The 95th percentile of F(1, dof): a term is kept when it explains this much more than noise. */
    private static double critical(int dof) {
        return new FDistribution(1, Math.max(1, dof)).inverseCumulativeProbability(0.95);
    }

    /**
     * Fits with exactly these free parameters, dropping none, from {@code from} (the unperturbed fit)
     * only: the quick re-fit of perturbed data in an uncertainty budget, where the model must stay the
     * same. It may end in another minimum than the fit's own after a large step ({@link #refit}).
     */
    public static double[] refitFrom(List<ImpedancePoint> points, Set<LumpedParameter> free, double[] from) {
        SeriesModel series = SeriesModelFit.fit(points);
        double[] scale = scales(points, series);
        return expand(fitOnce(points, free, from, scale).parameters(), free, scale);
    }

    /**
     * Fits with exactly these free parameters, dropping none, from {@code from} and from every start
     * the fit itself uses, keeping the least chi-square: for re-fitting perturbed data in an
     * uncertainty budget, where the model must stay the same.
     */
    public static double[] refit(List<ImpedancePoint> points, Set<LumpedParameter> free, double[] from) {
        SeriesModel series = SeriesModelFit.fit(points);
        double[] scale = scales(points, series);
        // from the unperturbed fit, and from the starts the fit itself uses: a step as large as a bench
        // bound near a self-resonance can leave the first in another minimum (a stray capacitance's line
        // on a 68 mH part read 3x too small), so the least chi-square of them is kept
        List<double[]> starts = new ArrayList<>();
        starts.add(from);
        starts.addAll(starts(points, series));
        return expand(best(points, free, starts, scale).parameters(), free, scale);
    }

    /**
     * Each point's residual (real and imaginary parts) from the model with these parameters,
     * whitened by the point's covariance as the fit weights it.
     */
    public static double[] weightedResiduals(List<ImpedancePoint> points, double[] parameters) {
        int n = points.size();
        double[] r = new double[2 * n];
        for (int i = 0; i < n; i++) {
            ImpedancePoint p = points.get(i);
            Complex z = LumpedModel.impedance(parameters, p.frequencyHz());
            white(whitening(p), p.resistanceOhm() - z.getReal(), p.reactanceOhm() - z.getImaginary(), r, i, n);
        }
        return r;
    }

    /** The standard uncertainty of a point's components as the fit weights them (floored). */
    private static double weightUncertainty(ImpedancePoint p) {
        return Math.max(p.componentUncertaintyOhm(), SeriesModelFit.MIN_RELATIVE_UNCERTAINTY * p.impedanceOhm().abs());
    }

    private static double[] scales(List<ImpedancePoint> points, SeriesModel series) {
        double fMax = points.stream().mapToDouble(ImpedancePoint::frequencyHz).max().orElseThrow();
        double l = series.inductanceHenry() > 0 ? series.inductanceHenry() : 1e-6;
        return new double[] {Math.max(Math.abs(series.resistanceOhm()), 1e-6), l,
            1 / (Math.pow(2 * Math.PI * fMax, 2) * l), 1 / fMax,
            1 / points.stream().mapToDouble(p -> p.impedanceOhm().abs()).max().orElseThrow()};
    }

    /**
     * Start values the data suggest, as full parameter vectors: the series model, and the
     * admittance line omega Im(1/Z) = -1/L + omega^2 C_p through the points well above the
     * winding's R/L corner (|X| over three times the lowest frequency's R), with R from the lowest
     * frequency.
     */
    static List<double[]> starts(List<ImpedancePoint> points, SeriesModel series) {
        int n = LumpedParameter.values().length;
        List<double[]> out = new ArrayList<>();
        double[] s = new double[n];
        s[LumpedParameter.R_DC.ordinal()] = series.resistanceOhm();
        s[LumpedParameter.L.ordinal()] = series.inductanceHenry();
        out.add(s);
        ImpedancePoint lowest = points.stream().min(Comparator.comparingDouble(ImpedancePoint::frequencyHz))
                .orElseThrow();
        double r0 = Math.max(lowest.resistanceOhm(), 0);
        double sx = 0, sy = 0, sxx = 0, sxy = 0;
        int m = 0;
        for (ImpedancePoint p : points) {
            if (Math.abs(p.reactanceOhm()) <= 3 * r0) {
                continue;
            }
            double omega = 2 * Math.PI * p.frequencyHz();
            double x = omega * omega;
            double y = omega * p.impedanceOhm().reciprocal().getImaginary();
            sx += x;
            sy += y;
            sxx += x * x;
            sxy += x * y;
            m++;
        }
        double det = m * sxx - sx * sx;
        if (m >= 2 && det != 0) {
            double c = (m * sxy - sx * sy) / det;
            double a = (sy - c * sx) / m;
            if (a < 0 && c > 0) {
                double[] y = new double[n];
                y[LumpedParameter.R_DC.ordinal()] = r0;
                y[LumpedParameter.L.ordinal()] = -1 / a;
                y[LumpedParameter.C_P.ordinal()] = c;
                out.add(y);
            }
        }
        return out;
    }

    /** The converged fit with the least chi-square over the starts. */
    private static FitResult best(List<ImpedancePoint> points, Set<LumpedParameter> free, List<double[]> starts,
                                  double[] scale) {
        FitResult best = null;
        FitException last = null;
        for (double[] start : starts) {
            try {
                FitResult r = fitOnce(points, free, start, scale);
                if (best == null || r.reducedChiSquare() < best.reducedChiSquare()) {
                    best = r;
                }
            } catch (FitException e) {
                last = e;
            }
        }
        if (best == null) {
            throw last != null ? last : new FitException("no start value", null);
        }
        return best;
    }

    private static void refuseUnphysical(double[] full, double chi, Set<LumpedParameter> free) {
        for (double v : full) {
            if (!Double.isFinite(v)) {
                throw new FitException("the model fit gave a value that is not a number", null);
            }
        }
        if (!(full[LumpedParameter.L.ordinal()] > 0)) {
            throw new FitException(String.format(Locale.ROOT, "the model fit gave L = %.4g H, not positive: the"
                    + " sweep does not show an inductor this model describes", full[LumpedParameter.L.ordinal()]), null);
        }
        if (chi > CHI_LIMIT) {
            throw new FitException(String.format(Locale.ROOT, "the lumped model does not describe the data:"
                    + " reduced chi-square %.3g after fitting %s (limit %.0f)", chi,
                    free.stream().map(LumpedParameter::key).toList(), CHI_LIMIT), null);
        }
    }

    private static LumpedParameter lastOptional(Set<LumpedParameter> free) {
        LumpedParameter last = null;
        for (LumpedParameter p : free) {
            if (p.optional()) {
                last = p;
            }
        }
        return last;
    }

    private static FitResult fitOnce(List<ImpedancePoint> points, Set<LumpedParameter> free, double[] startFull,
                                     double[] scale) {
        List<LumpedParameter> order = new ArrayList<>(free);
        int n = points.size();
        double[][] whiten = new double[n][];
        for (int i = 0; i < n; i++) {
            whiten[i] = whitening(points.get(i));
        }
        // each point's real and imaginary residuals whitened by its own covariance (unit weights)
        double[] observed = new double[2 * n];
        for (int i = 0; i < n; i++) {
            ImpedancePoint p = points.get(i);
            white(whiten[i], p.resistanceOhm(), p.reactanceOhm(), observed, i, n);
        }
        double[] weights = new double[2 * n];
        Arrays.fill(weights, 1.0);
        FitModel model = new FitModel() {
            @Override
            public double[] values(double[] q) {
                double[] full = expand(q, free, scale);
                double[] v = new double[2 * n];
                for (int i = 0; i < n; i++) {
                    Complex z = LumpedModel.impedance(full, points.get(i).frequencyHz());
                    white(whiten[i], z.getReal(), z.getImaginary(), v, i, n);
                }
                return v;
            }

            @Override
            public double[][] jacobian(double[] q) {
                double[] full = expand(q, free, scale);
                double[][] j = new double[2 * n][order.size()];
                double[] pair = new double[2 * n];
                for (int i = 0; i < n; i++) {
                    Complex[] g = LumpedModel.gradient(full, points.get(i).frequencyHz());
                    for (int c = 0; c < order.size(); c++) {
                        int k = order.get(c).ordinal();
                        white(whiten[i], g[k].getReal() * scale[k], g[k].getImaginary() * scale[k], pair, i, n);
                        j[i][c] = pair[i];
                        j[n + i][c] = pair[n + i];
                    }
                }
                return j;
            }
        };
        double[] start = new double[order.size()];
        for (int c = 0; c < order.size(); c++) {
            int k = order.get(c).ordinal();
            start[c] = startFull[k] / scale[k];
        }
        return LeastSquares.fit(model, observed, weights, start);
    }

    /**
     * The Cholesky factor {l11, l21, l22} of a point's covariance of its real and imaginary parts,
     * each variance floored at the fit's least relative uncertainty and the correlation held within
     * +/- 0.99: residuals multiplied by its inverse are independent with unit variance.
     */
    private static double[] whitening(ImpedancePoint p) {
        double floor = SeriesModelFit.MIN_RELATIVE_UNCERTAINTY * p.impedanceOhm().abs();
        double vr = Math.max(p.varianceR(), floor * floor);
        double vx = Math.max(p.varianceX(), floor * floor);
        double limit = 0.99 * Math.sqrt(vr * vx);
        double k = Math.max(-limit, Math.min(limit, p.covarianceRX()));
        if (!Double.isFinite(vr) || !Double.isFinite(vx) || !Double.isFinite(k)) {
            double u = weightUncertainty(p);
            return new double[] {u, 0, u};
        }
        double l11 = Math.sqrt(vr);
        double l21 = k / l11;
        return new double[] {l11, l21, Math.sqrt(vx - l21 * l21)};
    }

    /** The pair (r, x) through the inverse of the factor, into out[i] and out[n + i]. */
    private static void white(double[] l, double r, double x, double[] out, int i, int n) {
        double a = r / l[0];
        out[i] = a;
        out[n + i] = (x - l[1] * a) / l[2];
    }

    private static double[] expand(double[] q, Set<LumpedParameter> free, double[] scale) {
        double[] full = new double[LumpedParameter.values().length];
        int c = 0;
        for (LumpedParameter p : free) {
            full[p.ordinal()] = q[c++] * scale[p.ordinal()];
        }
        return full;
    }

    private static double[][] expandCovariance(double[][] cov, Set<LumpedParameter> free, double[] scale) {
        int m = LumpedParameter.values().length;
        double[][] full = new double[m][m];
        List<LumpedParameter> order = new ArrayList<>(free);
        for (int a = 0; a < order.size(); a++) {
            for (int b = 0; b < order.size(); b++) {
                int i = order.get(a).ordinal();
                int j = order.get(b).ordinal();
                full[i][j] = cov[a][b] * scale[i] * scale[j];
            }
        }
        return full;
    }
}
