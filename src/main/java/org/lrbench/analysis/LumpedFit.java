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
 * of each point, weighted by the inverse variance of its components), starting from the series
 * model. An optional parameter that the data cannot identify, because its estimate is not
 * significantly different from its null value (less than twice its standard uncertainty), has an
 * unphysical sign, or leaves the covariance singular, is fixed at its null value and the fit is
 * repeated; the result says which parameters were dropped and why.
 */
public final class LumpedFit {

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
        double fMax = points.stream().mapToDouble(ImpedancePoint::frequencyHz).max().orElseThrow();
        double[] scale = {Math.max(series.resistanceOhm(), 1e-6), series.inductanceHenry(),
            1 / (Math.pow(2 * Math.PI * fMax, 2) * series.inductanceHenry()), 1 / fMax,
            1 / points.stream().mapToDouble(p -> p.impedanceOhm().abs()).max().orElseThrow()};
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
                r = fitOnce(points, free, series, scale);
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
            return new Result(full, cov, EnumSet.copyOf(free), List.copyOf(dropped), chi, r.degreesOfFreedom(), cUpper);
        }
    }

    /**
     * Fits with exactly these free parameters, dropping none: for re-fitting perturbed data in an
     * uncertainty budget, where the model must stay the same.
     */
    public static double[] refit(List<ImpedancePoint> points, Set<LumpedParameter> free) {
        SeriesModel series = SeriesModelFit.fit(points);
        double fMax = points.stream().mapToDouble(ImpedancePoint::frequencyHz).max().orElseThrow();
        double[] scale = {Math.max(series.resistanceOhm(), 1e-6), series.inductanceHenry(),
            1 / (Math.pow(2 * Math.PI * fMax, 2) * series.inductanceHenry()), 1 / fMax,
            1 / points.stream().mapToDouble(p -> p.impedanceOhm().abs()).max().orElseThrow()};
        return expand(fitOnce(points, free, series, scale).parameters(), free, scale);
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

    private static FitResult fitOnce(List<ImpedancePoint> points, Set<LumpedParameter> free, SeriesModel series,
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
            start[c] = switch (order.get(c)) {
                case R_DC -> series.resistanceOhm() / scale[0];
                case L -> 1.0;
                default -> 0.0;
            };
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
