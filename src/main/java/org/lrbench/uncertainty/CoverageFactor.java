package org.lrbench.uncertainty;

import java.util.ArrayList;
import java.util.List;

/**
 * The coverage factor k of a budget from the distribution of its output rather than from an
 * assumed normal one. The output is the linear sum of the budget's contributions (the model the law
 * of propagation of uncertainty uses, JCGM 100:2008 5.1.2), each input independent and of its own
 * shape: the normal lines together one normal of their combined u; a rectangular line a rectangle of
 * half-width sqrt(3) u_i; a triangular one a triangle of half-width sqrt(6) u_i (two rectangles of
 * half that width). The output's density is the convolution of these (the propagation of
 * distributions of JCGM 101:2008, clause 5 from memory, evaluated here on a grid instead of by Monte
 * Carlo, so the same budget always gives the same k). U = k u_c is the half-width
 * of the symmetric interval holding {@link #PROBABILITY} of it: k = 2 for a normal output, p sqrt(3) =
 * 1.653 for a rectangle alone. A budget that one rectangular line dominates therefore gets a smaller
 * k than 2, which for such a budget would cover the whole rectangle (JCGM 100:2008 G.2.3 and G.6.5
 * discuss the case, from memory).
 */
public final class CoverageFactor {
    /** The share of a normal distribution within +/- 2 standard deviations, erf(sqrt 2). */
    public static final double PROBABILITY = 0.9544997361036416;
    /** Grid points across the output's support (odd: one point at the centre). */
    private static final int POINTS = 8193;
    /** Half-width of the normal part's grid, in its standard deviations. */
    private static final double NORMAL_SPAN = 8;

    private CoverageFactor() {
    }

    /** k for the contributions of one budget at {@link #PROBABILITY}; 2 for a budget of nothing. */
    public static double of(List<Contribution> lines) {
        return of(lines, PROBABILITY);
    }

    /** k for the contributions of one budget such that +/- k u_c holds {@code probability} of the output. */
    public static double of(List<Contribution> lines, double probability) {
        if (!(probability > 0 && probability < 1)) {
            throw new IllegalArgumentException("coverage probability " + probability + ": allowed is 0 < p < 1");
        }
        double normalVariance = 0;
        List<Double> rectangles = new ArrayList<>(); // half-widths
        for (Contribution c : lines) {
            double u = Math.abs(c.contribution());
            if (!(u > 0) || !Double.isFinite(u)) {
                continue;
            }
            switch (c.distribution()) {
                case NORMAL -> normalVariance += u * u;
                case RECTANGULAR -> rectangles.add(Math.sqrt(3) * u);
                case TRIANGULAR -> {
                    rectangles.add(Math.sqrt(6) * u / 2);
                    rectangles.add(Math.sqrt(6) * u / 2);
                }
            }
        }
        double variance = normalVariance;
        double span = NORMAL_SPAN * Math.sqrt(normalVariance);
        for (double a : rectangles) {
            variance += a * a / 3;
            span += a;
        }
        if (!(variance > 0)) {
            return Budget.K;
        }
        return halfWidth(Math.sqrt(normalVariance), rectangles, span, probability) / Math.sqrt(variance);
    }

    private static double halfWidth(double sigma, List<Double> rectangles, double span, double probability) {
        double h = 2 * span / (POINTS - 1);
        double[] f = new double[POINTS];
        int centre = POINTS / 2;
        if (sigma > 4 * h) {
            for (int i = 0; i < POINTS; i++) {
                double z = (i - centre) * h / sigma;
                f[i] = Math.exp(-z * z / 2) / (sigma * Math.sqrt(2 * Math.PI));
            }
        } else {
            // a normal part narrower than a few grid steps: a rectangle of its variance instead
            // (its shape is lost at this resolution; its width is kept)
            f[centre] = 1 / h;
            if (sigma > 0) {
                rectangles = new ArrayList<>(rectangles);
                rectangles.add(Math.sqrt(3) * sigma);
            }
        }
        for (double a : rectangles) {
            f = box(f, a / h);
        }
        double[] cdf = cumulative(f, h);
        double total = cdf[POINTS - 1];
        // P(|Y| <= t) for t on the grid, then linear between grid points
        double previous = 0;
        for (int j = 1; j <= centre; j++) {
            double inside = (cdf[centre + j] - cdf[centre - j]) / total;
            if (inside >= probability) {
                return (j - 1 + (probability - previous) / (inside - previous)) * h;
            }
            previous = inside;
        }
        return span;
    }

    /** The density convolved with a rectangle of half-width {@code a} grid steps: (F(x + a) - F(x - a)) / 2a. */
    private static double[] box(double[] f, double a) {
        if (a < 1e-9) {
            return f;
        }
        double[] cdf = cumulative(f, 1);
        double[] out = new double[f.length];
        for (int i = 0; i < f.length; i++) {
            out[i] = (at(cdf, i + a) - at(cdf, i - a)) / (2 * a);
        }
        return out;
    }

    /** Trapezoidal running integral with step {@code h}. */
    private static double[] cumulative(double[] f, double h) {
        double[] c = new double[f.length];
        for (int i = 1; i < f.length; i++) {
            c[i] = c[i - 1] + (f[i - 1] + f[i]) * h / 2;
        }
        return c;
    }

    /** Linear interpolation at a fractional index, held at the ends. */
    private static double at(double[] v, double x) {
        if (x <= 0) {
            return v[0];
        }
        if (x >= v.length - 1) {
            return v[v.length - 1];
        }
        int i = (int) x;
        double w = x - i;
        return v[i] * (1 - w) + v[i + 1] * w;
    }
}
