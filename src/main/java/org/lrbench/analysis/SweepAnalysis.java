package org.lrbench.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.DoubleFunction;
import java.util.function.UnaryOperator;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.uncertainty.Budget;
import org.lrbench.uncertainty.Contribution;
import org.lrbench.uncertainty.Distribution;

/**
 * The sweep's model fit and the uncertainty budget of every reported quantity. Type A: the noise
 * of the traces (with the part of quantization that changes from capture to capture, since it is in
 * the fit residuals) through the fit covariance, u^2 = g' V g with g the quantity's gradient in the parameters, degrees of freedom of
 * the fit. Type B: each bench specification (rectangular) as a perturbation of the measured
 * impedances, re-fitted with the same model, which gives the sensitivity coefficient numerically.
 * The sine fits estimate and remove each channel's offset, so the digitizer's offset accuracy has
 * no first-order effect and has no line. The repeatable part of quantization is corrected at each
 * point ({@link Quantization}); the correction's own uncertainty is a type-B line, the same sign at
 * every point (systematic). Where the fit could not decide on a model term, each reported value is
 * the mean of the fits with and without it, with the average's unconditional uncertainty: picking
 * one of the two by the test alone biases the value, since the runs that leave a real term out are
 * those whose noise hid it.
 */
public final class SweepAnalysis {
    private static final double STEP = 1e-6;

    private SweepAnalysis() {
    }

    /**
     * The fit, a budget per evaluation in the evaluations' order, and the parameters reported: the
     * fit's own, or where a term the test could not decide on was averaged, the models with and
     * without it averaged the same way as every budget's value. Every later step (self-resonance,
     * cross-checks, the record's model) uses these, so a part carries one value of L.
     */
    public record Result(LumpedFit.Result fit, Map<String, Budget> budgets, double[] reported) {

        public double reported(LumpedParameter p) {
            return p.in(reported);
        }
    }

    public static Result analyse(List<ImpedancePoint> points, Set<LumpedParameter> terms, List<Evaluation> evaluations,
                                 BenchAccuracy accuracy) {
        return analyse(points, terms, evaluations, accuracy, new double[points.size()]);
    }

    /**
     * As above, with each point's relative standard uncertainty from the converter's quantization
     * correction ({@code quantization[i]}, see {@link Quantization}): systematic, so it enters as one
     * line, all points moved together by their own amounts and the model re-fitted.
     */
    public static Result analyse(List<ImpedancePoint> points, Set<LumpedParameter> terms, List<Evaluation> evaluations,
                                 BenchAccuracy accuracy, double[] quantization) {
        return analyse(points, terms, evaluations, accuracy, quantization, new double[points.size()][points.size()], null);
    }

    /**
     * As above, with each point's channel gain ratio taken from the channel match of its own range
     * pair, the ratios' relative errors of covariance {@code rangePair} (point by point: pairs solved
     * from the same readings err together). One line: the covariance's principal directions, each an
     * independent perturbation of all points by their own amounts, re-fitted, their effects added in
     * quadrature (u^2 = c' V c, GUM 5.2.2, with c the sensitivities to each point's gain ratio); the
     * bench's bound for a gain ratio on ranges the match did not cover moves only the points marked in
     * {@code uncovered} (null: all of them).
     */
    public static Result analyse(List<ImpedancePoint> points, Set<LumpedParameter> terms, List<Evaluation> evaluations,
                                 BenchAccuracy accuracy, double[] quantization, double[][] rangePair, double[] uncovered) {
        LumpedFit.Result fit = LumpedFit.fit(points, terms);
        Set<LumpedParameter> free = fit.free();
        double[] p = fit.parameters();
        double inf = Double.POSITIVE_INFINITY;
        double matchDof = accuracy.channelMatchDegreesOfFreedom();
        BenchAccuracy.TracedSense traced = accuracy.tracedSense();
        List<Perturbation> effects = new ArrayList<>();
        if (traced == null) {
            effects.add(new Perturbation("sense resistor tolerance (nominal, not traced: no meter reading)",
                    Distribution.RECTANGULAR, accuracy.senseTolerance(), "relative", inf, d -> scale(points, 1 + d)));
        } else {
            // the meter's specification is a rectangle, its readings' scatter normal: two lines, so the
            // coverage factor sees the rectangle's shape
            if (traced.meterHalfWidth() > 0) {
                effects.add(new Perturbation("sense resistor traced by the bench's meter (4-wire, DC): the meter's"
                        + " specification", Distribution.RECTANGULAR, traced.meterHalfWidth(), "relative", inf,
                        d -> scale(points, 1 + d)));
            }
            if (traced.scatter() > 0) {
                effects.add(new Perturbation("sense resistor traced by the bench's meter: the readings' scatter",
                        Distribution.NORMAL, traced.scatter(), "relative", inf, d -> scale(points, 1 + d)));
            }
        }
        List<double[]> directions = principalDirections(rangePair);
        for (double[] w : directions) {
            effects.add(new Perturbation(RANGE_PAIR, Distribution.NORMAL, 1, "u", matchDof, d -> scaleEach(points, w, d)));
        }
        if (accuracy.gainAccuracy() > 0 || directions.isEmpty()) {
            // the ratio of two channels each within +/- a: the difference of two rectangles is a
            // triangle of half-width 2a (GUM 4.3.9); after a channel match, its own u with n - 1
            // degrees of freedom
            effects.add(new Perturbation("digitizer gain ratio of the two channels", Distribution.TRIANGULAR,
                    2 * accuracy.gainAccuracy(), "relative", matchDof, d -> scale(points, 1 + d)));
        }
        effects.addAll(List.of(
                new Perturbation("residual inter-channel skew", Distribution.RECTANGULAR, accuracy.skewSecond(), "s",
                        matchDof, d -> skew(points, d)),
                new Perturbation("frequency accuracy", Distribution.RECTANGULAR, accuracy.frequencyAccuracy(), "relative",
                        inf, d -> frequency(points, 1 + d))));
        if (accuracy.rangeGainMatch() > 0) {
            // the channel match holds for the ranges it was measured on; on others the gain ratio
            // may differ by up to the bench's stated bound
            effects.add(new Perturbation("gain ratio on ranges other than the channel match's (bench specification)",
                    Distribution.RECTANGULAR, accuracy.rangeGainMatch(), "relative", inf,
                    d -> uncovered == null ? scale(points, 1 + d) : scaleEach(points, uncovered, d)));
        }
        if (traced != null && traced.acDcBound() > 0) {
            // the meter reads the resistor at DC; the sweep uses it at the plan's frequencies
            effects.add(new Perturbation("sense resistor's AC/DC difference (bench bound)", Distribution.RECTANGULAR,
                    traced.acDcBound(), "relative", inf, d -> scale(points, 1 + d)));
        }
        BenchAccuracy.FixtureBounds fx = accuracy.fixture();
        if (fx != null) {
            // no open/short compensation in force: what the fixture may add enters as the bench's bounds,
            // so U covers the uncorrected error instead of leaving the fixture out
            if (fx.leadOhm() > 0) {
                effects.add(new Perturbation("fixture leads' resistance, not compensated (bench bound)",
                        Distribution.RECTANGULAR, fx.leadOhm(), "ohm", inf, d -> series(points, new Complex(d, 0), 0)));
            }
            if (fx.leadHenry() > 0) {
                effects.add(new Perturbation("fixture leads' inductance, not compensated (bench bound)",
                        Distribution.RECTANGULAR, fx.leadHenry(), "H", inf, d -> series(points, Complex.ZERO, d)));
            }
            if (fx.strayFarad() > 0) {
                effects.add(new Perturbation("fixture's stray capacitance, not compensated (bench bound)",
                        Distribution.RECTANGULAR, fx.strayFarad(), "F", inf, d -> stray(points, d)));
            }
        }
        if (max(quantization) > 0) {
            // the correction's own uncertainty, in units of each point's standard uncertainty
            effects.add(new Perturbation("converter quantization, repeatable part (corrected)", Distribution.NORMAL, 1,
                    "u", inf, d -> scaleEach(points, quantization, d)));
        }
        // central differences over the input's own standard uncertainty: a step that size moves
        // the fit far above its convergence tolerance, and the slope is the one that matters over
        // the range the input may take
        List<double[]> perturbed = new ArrayList<>();
        // the scatter each effect leaves about the re-fitted model (what the model cannot absorb, such
        // as a skew's rotation growing with frequency) adds to the chi-square expected from noise
        double[] residuals = LumpedFit.weightedResiduals(points, p);
        double explained = 0;
        for (Perturbation e : effects) {
            double u = e.distribution.standardUncertainty(e.halfWidth);
            double step = u > 0 ? u : e.unit.equals("s") ? 1e-12 : STEP;
            perturbed.add(new double[] {step});
            List<List<ImpedancePoint>> moved = List.of(e.apply.apply(step), e.apply.apply(-step));
            double[][] refitted = refitBoth(moved, free, fit);
            for (int k = 0; k < 2; k++) {
                perturbed.add(refitted[k]);
                if (u > 0) {
                    explained += squaredDistance(LumpedFit.weightedResiduals(moved.get(k), refitted[k]), residuals) / 2;
                }
            }
        }
        // residuals wider than noise and these effects explain scale the fit covariance (a Birge
        // ratio over the expected chi-square); scatter they explain is counted once, in their lines
        LumpedFit.Result scaled = fit.withExpectedChiSquare(fit.degreesOfFreedom() + explained);
        Map<String, Budget> budgets = new LinkedHashMap<>();
        double dof = fit.degreesOfFreedom();
        for (Evaluation ev : evaluations) {
            double value = ev.at(p);
            double uA = typeA(ev, p, scaled::covariance, free);
            List<Contribution> lines = new ArrayList<>();
            lines.add(new Contribution("noise and quantization, random part (fit covariance)", "A", Distribution.NORMAL,
                    Double.NaN, "", 1.0, uA, dof, 0));
            double rangePairSquared = 0;
            for (int i = 0; i < effects.size(); i++) {
                Perturbation e = effects.get(i);
                double step = perturbed.get(3 * i)[0];
                double c = (ev.at(perturbed.get(3 * i + 1)) - ev.at(perturbed.get(3 * i + 2))) / (2 * step);
                double u = e.distribution.standardUncertainty(e.halfWidth);
                if (e.source.equals(RANGE_PAIR)) {
                    // the principal directions are independent: one line, their effects in quadrature
                    rangePairSquared += c * c;
                    if (i + 1 < effects.size() && effects.get(i + 1).source.equals(RANGE_PAIR)) {
                        continue;
                    }
                    c = Math.sqrt(rangePairSquared);
                }
                lines.add(new Contribution(e.source, "B", e.distribution, u, e.unit, c, Math.abs(c) * u,
                        e.degreesOfFreedom, 0));
            }
            // a term the test could not decide on: the models with and without it are averaged
            // with equal weights, and the average's unconditional standard uncertainty (Buckland,
            // Burnham and Augustin, Biometrics 53, 1997, eq. 9, from memory) is carried as the
            // fit's line and this one in quadrature; terms left out one after another are taken
            // from the last left out (whose "without" is the final fit) back to the first
            List<LumpedFit.Omitted> omitted = fit.omitted();
            double[] without = p;
            double uCombined = uA;
            for (int k = omitted.size() - 1; k >= 0; k--) {
                LumpedFit.Omitted o = omitted.get(k);
                double with = ev.at(o.parametersWith());
                double change = with - ev.at(without);
                without = o.parametersWith();
                if (!Double.isFinite(change) || change == 0) {
                    continue;
                }
                double scaleWith = Math.max(1, o.reducedChiSquareWith() * o.degreesOfFreedomWith()
                        / (o.degreesOfFreedomWith() + explained));
                double uWith = typeA(ev, o.parametersWith(),
                        (x, y) -> o.covarianceWith()[x.ordinal()][y.ordinal()] * scaleWith, o.freeWith());
                double half = Math.abs(change) / 2;
                double averaged = (Math.hypot(uCombined, half) + Math.hypot(uWith, half)) / 2;
                double line = Math.sqrt(Math.max(0, averaged * averaged - uCombined * uCombined));
                value += change / 2;
                lines.add(new Contribution("model term " + o.term().key() + " that the test could not decide on"
                        + " (the models with and without it averaged)", "B", Distribution.NORMAL, line, ev.unit(),
                        1.0, line, Double.POSITIVE_INFINITY, 0));
                uCombined = averaged;
            }
            budgets.put(ev.name(), Budget.of(ev.name(), value, lines));
        }
        return new Result(scaled, budgets, averaged(p, fit.omitted()));
    }

    /**
     * The fits of the sweep moved up and down by one step: each re-fitted from the unperturbed fit, and
     * where the two do not move its parameters about oppositely (beyond half their spread, in the fit's
     * standard uncertainties) both again from every start the fit itself uses, keeping the least
     * chi-square: a step as large as a bench bound near a self-resonance can leave a re-fit from the
     * unperturbed fit in another minimum (a stray capacitance's line on a 68 mH part read 3x small).
     */
    static double[][] refitBoth(List<List<ImpedancePoint>> moved, Set<LumpedParameter> free, LumpedFit.Result fit) {
        double[] p = fit.parameters();
        double[] up = LumpedFit.refitFrom(moved.get(0), free, p);
        double[] down = LumpedFit.refitFrom(moved.get(1), free, p);
        double apart = 0;
        double along = 0;
        for (LumpedParameter q : free) {
            double sigma = fit.uncertainty(q);
            if (!(sigma > 0)) {
                continue;
            }
            double a = (q.in(up) - q.in(p)) / sigma;
            double b = (q.in(down) - q.in(p)) / sigma;
            apart = Math.max(apart, Math.abs(a + b));
            along = Math.max(along, Math.abs(a - b));
        }
        if (apart <= 0.5 * along + 1e-3) {
            return new double[][] {up, down};
        }
        return new double[][] {LumpedFit.refit(moved.get(0), free, p), LumpedFit.refit(moved.get(1), free, p)};
    }

    /**
     * The parameters averaged as the budgets' values are: from the last term left out back to the
     * first, each step half way to the fit with that term (for a quantity linear in the parameters,
     * such as L or R_dc, exactly the budget's value).
     */
    static double[] averaged(double[] p, List<LumpedFit.Omitted> omitted) {
        double[] out = p.clone();
        double[] without = p;
        for (int k = omitted.size() - 1; k >= 0; k--) {
            double[] with = omitted.get(k).parametersWith();
            for (int i = 0; i < out.length; i++) {
                double change = with[i] - without[i];
                if (Double.isFinite(change)) {
                    out[i] += change / 2;
                }
            }
            without = with;
        }
        return out;
    }

    private static final String RANGE_PAIR = "channel gain ratio of each point's range pair (channel match, range links)";

    /**
     * The principal directions of a covariance of the points' relative gain errors: each eigenvector scaled
     * by the root of its eigenvalue, so that the directions are independent unit perturbations whose sum of
     * outer products is the covariance; directions under 1e-12 of the largest are left out. None for a
     * covariance of zeros.
     */
    static List<double[]> principalDirections(double[][] covariance) {
        List<double[]> out = new ArrayList<>();
        int n = covariance.length;
        double largest = 0;
        for (int i = 0; i < n; i++) {
            largest = Math.max(largest, covariance[i][i]);
        }
        if (!(largest > 0)) {
            return out;
        }
        EigenDecomposition eigen = new EigenDecomposition(new Array2DRowRealMatrix(covariance));
        double[] values = eigen.getRealEigenvalues();
        double top = Arrays.stream(values).max().orElse(0);
        for (int k = 0; k < values.length; k++) {
            if (values[k] > 1e-12 * top) {
                out.add(eigen.getEigenvector(k).mapMultiply(Math.sqrt(values[k])).toArray());
            }
        }
        return out;
    }

    private record Perturbation(String source, Distribution distribution, double halfWidth, String unit,
                                double degreesOfFreedom, DoubleFunction<List<ImpedancePoint>> apply) {
    }

    /** u from a fit covariance: the quantity's gradient in the free parameters by central differences. */
    private static double typeA(Evaluation ev, double[] p, Covariance cov, Set<LumpedParameter> free) {
        int m = p.length;
        double[] g = new double[m];
        for (LumpedParameter q : free) {
            int i = q.ordinal();
            double h = Math.max(Math.abs(p[i]) * 1e-6, Math.sqrt(cov.of(q, q)) * 1e-3);
            if (h == 0) {
                continue;
            }
            double[] up = p.clone();
            double[] down = p.clone();
            up[i] += h;
            down[i] -= h;
            g[i] = (ev.at(up) - ev.at(down)) / (2 * h);
        }
        double var = 0;
        for (LumpedParameter a : free) {
            for (LumpedParameter b : free) {
                var += g[a.ordinal()] * cov.of(a, b) * g[b.ordinal()];
            }
        }
        return Math.sqrt(Math.max(0, var));
    }

    private interface Covariance {
        double of(LumpedParameter a, LumpedParameter b);
    }

    private static List<ImpedancePoint> scale(List<ImpedancePoint> points, double factor) {
        return map(points, p -> p.times(new Complex(factor, 0)));
    }

    /** Leads in series taken out: Z - (r + j w l). */
    private static List<ImpedancePoint> series(List<ImpedancePoint> points, Complex r, double henry) {
        return map(points, p -> {
            Complex lead = r.add(new Complex(0, 2 * Math.PI * p.frequencyHz() * henry));
            return p.corrected(p.impedanceOhm().subtract(lead), Complex.ONE, 0);
        });
    }

    /** A stray capacitance across the terminals taken out: 1 / (1 / Z - j w C). */
    private static List<ImpedancePoint> stray(List<ImpedancePoint> points, double farad) {
        return map(points, p -> {
            Complex y = new Complex(0, 2 * Math.PI * p.frequencyHz() * farad);
            Complex z = p.impedanceOhm();
            Complex out = z.reciprocal().subtract(y).reciprocal();
            // d out / d z = 1 / (1 - y z)^2
            Complex slope = Complex.ONE.subtract(y.multiply(z)).pow(-2);
            return p.corrected(out, slope, 0);
        });
    }

    /** Channel 2 late by tau against channel 1: the measured Z turns by -2 pi f tau. */
    private static List<ImpedancePoint> skew(List<ImpedancePoint> points, double tau) {
        return map(points, p -> {
            double phi = -2 * Math.PI * p.frequencyHz() * tau;
            return p.times(new Complex(Math.cos(phi), Math.sin(phi)));
        });
    }

    private static double squaredDistance(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += (a[i] - b[i]) * (a[i] - b[i]);
        }
        return s;
    }

    private static double max(double[] v) {
        double m = 0;
        for (double x : v) {
            m = Math.max(m, x);
        }
        return m;
    }

    /** Point i scaled by 1 + d q[i]. */
    private static List<ImpedancePoint> scaleEach(List<ImpedancePoint> points, double[] q, double d) {
        List<ImpedancePoint> out = new ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            out.add(points.get(i).times(new Complex(1 + d * q[i], 0)));
        }
        return out;
    }

    private static List<ImpedancePoint> frequency(List<ImpedancePoint> points, double factor) {
        return map(points, p -> p.atFrequency(p.frequencyHz() * factor));
    }

    private static List<ImpedancePoint> map(List<ImpedancePoint> points, UnaryOperator<ImpedancePoint> f) {
        return points.stream().map(f).toList();
    }
}
