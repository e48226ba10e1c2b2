package org.lrbench.analysis;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.fit.FitException;
import org.lrbench.analysis.fit.FitModel;
import org.lrbench.analysis.fit.FitResult;
import org.lrbench.analysis.fit.LeastSquares;

/**
 * Fits the {@link LumpedModel} to a sweep by weighted Levenberg-Marquardt (real and imaginary parts
 * of each point, weighted by the inverse variance of its components), from every start the data
 * suggest, keeping the fit with the least chi-square: the series model, and, when the parallel
 * capacitance is wanted, the admittance: for a winding well above its R/L corner,
 * omega Im(1/Z) = -1/L + omega^2 C_p, a straight line in omega^2 whose intercept and slope give
 * L and C_p in closed form, through self-resonance as below it. A fit whose L is not positive, or
 * whose reduced chi-square stays above {@value #CHI_LIMIT} (no model describes the data), is refused. An optional parameter that the data cannot identify, because its estimate is not
 * significantly different from its null value (less than twice its standard uncertainty), has an
 * unphysical sign, or leaves the covariance singular, is fixed at its null value and the fit is
 * repeated; the result says which parameters were dropped and why.
 */
public final class LumpedFit {
    /** Reduced chi-square above which the model does not describe the data and no value is reported. */
    public static final double CHI_LIMIT = 1000;

    private LumpedFit() {
    }

    /** The fit: full parameter vector, its covariance (zero rows for fixed ones), dropped parameters. */
    public record Result(double[] parameters, double[][] covariance, Set<LumpedParameter> free,
                         List<String> dropped, double reducedChiSquare, int degreesOfFreedom,
                         double capacitanceUpperBound) {

        public double value(LumpedParameter p) {
            return parameters[p.ordinal()];
        }

        /** Standard uncertainty from the fit (scaled by sqrt of the reduced chi-square when above 1). */
        public double uncertainty(LumpedParameter p) {
            double scale = reducedChiSquare > 1 ? reducedChiSquare : 1;
            return Math.sqrt(covariance[p.ordinal()][p.ordinal()] * scale);
        }

        public double covariance(LumpedParameter a, LumpedParameter b) {
            double scale = reducedChiSquare > 1 ? reducedChiSquare : 1;
            return covariance[a.ordinal()][b.ordinal()] * scale;
        }
    }

    public static Result fit(List<ImpedancePoint> points, Set<LumpedParameter> wanted) {
        SeriesModel series = SeriesModelFit.fit(points);
        Set<LumpedParameter> free = EnumSet.of(LumpedParameter.R_DC, LumpedParameter.L);
        free.addAll(wanted);
        List<String> dropped = new ArrayList<>();
        double[] scale = scales(points, series);
        double cUpper = Double.NaN;
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
                r = best(points, free, starts(points, series), scale);
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
            LumpedParameter worst = null;
            double worstRatio = Double.POSITIVE_INFINITY;
            for (LumpedParameter p : free) {
                if (!p.optional()) {
                    continue;
                }
                double v = full[p.ordinal()];
                double u = Math.sqrt(cov[p.ordinal()][p.ordinal()] * inflate);
                double ratio = v < 0 ? -1 : v / u;
                if (p == LumpedParameter.C_P) {
                    cUpper = Math.max(v, 0) + 2 * u;
                }
                if (ratio < 2 && ratio < worstRatio) {
                    worst = p;
                    worstRatio = ratio;
                }
            }
            if (worst != null) {
                double v = full[worst.ordinal()];
                double u = Math.sqrt(cov[worst.ordinal()][worst.ordinal()] * inflate);
                free.remove(worst);
                dropped.add(String.format(Locale.ROOT, "%s: %.4g +/- %.2g is %s; fixed at 0", worst.key(), v, u,
                        v < 0 ? "unphysical (negative)" : "not significant (under 2 standard uncertainties)"));
                continue;
            }
            if (free.contains(LumpedParameter.C_P)) {
                double v = full[LumpedParameter.C_P.ordinal()];
                cUpper = v + 2 * Math.sqrt(cov[LumpedParameter.C_P.ordinal()][LumpedParameter.C_P.ordinal()] * inflate);
            }
            refuseUnphysical(full, chi, free);
            return new Result(full, cov, EnumSet.copyOf(free), List.copyOf(dropped), chi, r.degreesOfFreedom(), cUpper);
        }
    }

    /**
     * Fits with exactly these free parameters, dropping none, starting from {@code from} (the
     * unperturbed fit): for re-fitting perturbed data in an uncertainty budget, where the model must
     * stay the same.
     */
    public static double[] refit(List<ImpedancePoint> points, Set<LumpedParameter> free, double[] from) {
        SeriesModel series = SeriesModelFit.fit(points);
        double[] scale = scales(points, series);
        return expand(fitOnce(points, free, from, scale).parameters(), free, scale);
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
        ImpedancePoint lowest = points.stream().min(java.util.Comparator.comparingDouble(ImpedancePoint::frequencyHz))
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
        double[] observed = new double[2 * n];
        double[] weights = new double[2 * n];
        for (int i = 0; i < n; i++) {
            ImpedancePoint p = points.get(i);
            observed[i] = p.resistanceOhm();
            observed[n + i] = p.reactanceOhm();
            double u = Math.max(p.componentUncertaintyOhm(), SeriesModelFit.MIN_RELATIVE_UNCERTAINTY * p.impedanceOhm().abs());
            weights[i] = 1 / (u * u);
            weights[n + i] = weights[i];
        }
        FitModel model = new FitModel() {
            @Override
            public double[] values(double[] q) {
                double[] full = expand(q, free, scale);
                double[] v = new double[2 * n];
                for (int i = 0; i < n; i++) {
                    Complex z = LumpedModel.impedance(full, points.get(i).frequencyHz());
                    v[i] = z.getReal();
                    v[n + i] = z.getImaginary();
                }
                return v;
            }

            @Override
            public double[][] jacobian(double[] q) {
                double[] full = expand(q, free, scale);
                double[][] j = new double[2 * n][order.size()];
                for (int i = 0; i < n; i++) {
                    Complex[] g = LumpedModel.gradient(full, points.get(i).frequencyHz());
                    for (int c = 0; c < order.size(); c++) {
                        int k = order.get(c).ordinal();
                        j[i][c] = g[k].getReal() * scale[k];
                        j[n + i][c] = g[k].getImaginary() * scale[k];
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
