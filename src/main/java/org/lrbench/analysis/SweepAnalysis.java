package org.lrbench.analysis;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.DoubleFunction;
import java.util.function.UnaryOperator;
import org.apache.commons.math3.complex.Complex;
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
 * every point (systematic).
 */
public final class SweepAnalysis {
    private static final double STEP = 1e-6;

    private SweepAnalysis() {
    }

    /** The fit and a budget per evaluation, in the evaluations' order. */
    public record Result(LumpedFit.Result fit, Map<String, Budget> budgets) {
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
        LumpedFit.Result fit = LumpedFit.fit(points, terms);
        Set<LumpedParameter> free = fit.free();
        double[] p = fit.parameters();
        double inf = Double.POSITIVE_INFINITY;
        double matchDof = accuracy.channelMatchDegreesOfFreedom();
        List<Perturbation> effects = new ArrayList<>(List.of(
                new Perturbation("sense resistor tolerance", Distribution.RECTANGULAR, accuracy.senseTolerance(),
                        "relative", inf, d -> scale(points, 1 + d)),
                // the ratio of two channels each within +/- a: the difference of two rectangles is a
                // triangle of half-width 2a (GUM 4.3.9); after a channel match, its own u with n - 1
                // degrees of freedom
                new Perturbation("digitizer gain ratio of the two channels", Distribution.TRIANGULAR,
                        2 * accuracy.gainAccuracy(), "relative", matchDof, d -> scale(points, 1 + d)),
                new Perturbation("residual inter-channel skew", Distribution.RECTANGULAR, accuracy.skewSecond(), "s",
                        matchDof, d -> skew(points, d)),
                new Perturbation("frequency accuracy", Distribution.RECTANGULAR, accuracy.frequencyAccuracy(), "relative",
                        inf, d -> frequency(points, 1 + d))));
        if (accuracy.rangeGainMatch() > 0) {
            // the channel match holds for the ranges it was measured on; on others the gain ratio
            // may differ by up to the bench's stated bound
            effects.add(new Perturbation("gain ratio on ranges other than the channel match's (bench specification)",
                    Distribution.RECTANGULAR, accuracy.rangeGainMatch(), "relative", inf, d -> scale(points, 1 + d)));
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
        for (Perturbation e : effects) {
            double u = e.distribution.standardUncertainty(e.halfWidth);
            double step = u > 0 ? u : e.unit.equals("s") ? 1e-12 : STEP;
            perturbed.add(new double[] {step});
            perturbed.add(LumpedFit.refit(e.apply.apply(step), free, p));
            perturbed.add(LumpedFit.refit(e.apply.apply(-step), free, p));
        }
        Map<String, Budget> budgets = new LinkedHashMap<>();
        double dof = fit.degreesOfFreedom();
        for (Evaluation ev : evaluations) {
            double value = ev.at(p);
            List<Contribution> lines = new ArrayList<>();
            lines.add(new Contribution("noise and quantization, random part (fit covariance)", "A", Distribution.NORMAL,
                    Double.NaN, "", 1.0, typeA(ev, fit), dof, 0));
            for (int i = 0; i < effects.size(); i++) {
                Perturbation e = effects.get(i);
                double step = perturbed.get(3 * i)[0];
                double c = (ev.at(perturbed.get(3 * i + 1)) - ev.at(perturbed.get(3 * i + 2))) / (2 * step);
                double u = e.distribution.standardUncertainty(e.halfWidth);
                lines.add(new Contribution(e.source, "B", e.distribution, u, e.unit, c, Math.abs(c) * u,
                        e.degreesOfFreedom, 0));
            }
            for (LumpedFit.Omitted o : fit.omitted()) {
                // the term might be there after all: the change it would make, as a rectangular
                // half-width about the value without it (JCGM 100:2008 F.2.4.5)
                double half = Math.abs(ev.at(o.parametersWith()) - value);
                if (half > 0 && Double.isFinite(half)) {
                    lines.add(new Contribution("model term " + o.term().key() + " left out", "B",
                            Distribution.RECTANGULAR, Distribution.RECTANGULAR.standardUncertainty(half), ev.unit(), 1.0,
                            Distribution.RECTANGULAR.standardUncertainty(half), Double.POSITIVE_INFINITY, 0));
                }
            }
            budgets.put(ev.name(), Budget.of(ev.name(), value, lines));
        }
        return new Result(fit, budgets);
    }

    private record Perturbation(String source, Distribution distribution, double halfWidth, String unit,
                                double degreesOfFreedom, DoubleFunction<List<ImpedancePoint>> apply) {
    }

    /** u from the fit covariance: gradient in the free parameters by central differences. */
    private static double typeA(Evaluation ev, LumpedFit.Result fit) {
        double[] p = fit.parameters();
        int m = p.length;
        double[] g = new double[m];
        for (LumpedParameter q : fit.free()) {
            int i = q.ordinal();
            double h = Math.max(Math.abs(p[i]) * 1e-6, Math.sqrt(fit.covariance()[i][i]) * 1e-3);
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
        for (LumpedParameter a : fit.free()) {
            for (LumpedParameter b : fit.free()) {
                var += g[a.ordinal()] * fit.covariance(a, b) * g[b.ordinal()];
            }
        }
        return Math.sqrt(Math.max(0, var));
    }

    private static List<ImpedancePoint> scale(List<ImpedancePoint> points, double factor) {
        return map(points, p -> new ImpedancePoint(p.frequencyHz(), p.impedanceOhm().multiply(factor),
                p.componentUncertaintyOhm() * factor, p.currentAmpere()));
    }

    /** Channel 2 late by tau against channel 1: the measured Z turns by -2 pi f tau. */
    private static List<ImpedancePoint> skew(List<ImpedancePoint> points, double tau) {
        return map(points, p -> {
            double phi = -2 * Math.PI * p.frequencyHz() * tau;
            return new ImpedancePoint(p.frequencyHz(), p.impedanceOhm().multiply(new Complex(Math.cos(phi), Math.sin(phi))),
                    p.componentUncertaintyOhm(), p.currentAmpere());
        });
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
            ImpedancePoint p = points.get(i);
            double k = 1 + d * q[i];
            out.add(new ImpedancePoint(p.frequencyHz(), p.impedanceOhm().multiply(k), p.componentUncertaintyOhm() * k,
                    p.currentAmpere()));
        }
        return out;
    }

    private static List<ImpedancePoint> frequency(List<ImpedancePoint> points, double factor) {
        return map(points, p -> new ImpedancePoint(p.frequencyHz() * factor, p.impedanceOhm(),
                p.componentUncertaintyOhm(), p.currentAmpere()));
    }

    private static List<ImpedancePoint> map(List<ImpedancePoint> points, UnaryOperator<ImpedancePoint> f) {
        return points.stream().map(f).toList();
    }
}
