package org.lrbench.uncertainty;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

class CoverageFactorTests {
    private static final double INF = Double.POSITIVE_INFINITY;
    private static final NormalDistribution Z = new NormalDistribution(0, 1);
    private static final double P = CoverageFactor.PROBABILITY;

    private static Contribution line(Distribution d, double u) {
        return new Contribution("x", "B", d, u, "", 1, u, INF, 0);
    }

    /** The t with P(|Y| <= t) = p for a monotone P, by Commons Math's Brent solver. */
    private static double solve(DoubleUnaryOperator inside, double p, double max) {
        return new BrentSolver(1e-12).solve(1000, t -> inside.applyAsDouble(t) - p, 1e-9, max);
    }

    @Test
    void aNormalOutputGetsTheNormalsFactor() {
        // the normal quantile at (1 + p) / 2 from Commons Math's NormalDistribution: 2 at p = erf(sqrt 2)
        double expected = Z.inverseCumulativeProbability((1 + P) / 2);
        assertThat(expected).isCloseTo(2.0, within(1e-9));
        assertThat(CoverageFactor.of(List.of(line(Distribution.NORMAL, 3e-6)))).isCloseTo(expected, within(1e-4));
        // several normal lines are one normal
        assertThat(CoverageFactor.of(List.of(line(Distribution.NORMAL, 1), line(Distribution.NORMAL, 2),
                line(Distribution.NORMAL, 0.5)))).isCloseTo(expected, within(1e-4));
        assertThat(CoverageFactor.of(List.of(line(Distribution.NORMAL, 1)), 0.95))
                .isCloseTo(Z.inverseCumulativeProbability(0.975), within(1e-4));
    }

    @Test
    void aRectangleAloneGetsPTimesSqrtThree() {
        // a rectangle of half-width a holds p of itself within p a, and u = a / sqrt(3) (JCGM 100:2008
        // 4.3.7): k = p sqrt(3), 1.645 at 95 % (the usual 1.65, common practice, no source)
        assertThat(CoverageFactor.of(List.of(line(Distribution.RECTANGULAR, 0.7)))).isCloseTo(P * Math.sqrt(3),
                within(2e-3));
        assertThat(CoverageFactor.of(List.of(line(Distribution.RECTANGULAR, 1)), 0.95)).isCloseTo(1.645, within(2e-3));
    }

    @Test
    void aTriangleAloneAndTwoEqualRectanglesGetTheTrianglesFactor() {
        // a triangle of half-width c: P(|Y| > t) = ((c - t) / c)^2, u = c / sqrt(6) (JCGM 100:2008 4.3.9):
        // k = sqrt(6) (1 - sqrt(1 - p)); two equal rectangles of half-width c / 2 add up to it (derived)
        double expected = Math.sqrt(6) * (1 - Math.sqrt(1 - P));
        assertThat(CoverageFactor.of(List.of(line(Distribution.TRIANGULAR, 2)))).isCloseTo(expected, within(2e-3));
        assertThat(CoverageFactor.of(List.of(line(Distribution.RECTANGULAR, 1), line(Distribution.RECTANGULAR, 1))))
                .isCloseTo(expected, within(2e-3));
    }

    @Test
    void aNormalAndARectangleMatchTheirConvolutionIntegratedIndependently() {
        // P(|N + R| <= t) = 1/(2a) int_{-a}^{a} [Phi((t - x)/s) - Phi((-t - x)/s)] dx, integrated by Commons
        // Math's Gauss-Legendre integrator and solved by its Brent solver (an independent route)
        for (double[] c : new double[][] {{1, 1}, {1, 3}, {2, 0.5}}) {
            double s = c[0];
            double a = Math.sqrt(3) * c[1];
            DoubleUnaryOperator inside = t -> new IterativeLegendreGaussIntegrator(16, 1e-12, 1e-14)
                    .integrate(100_000, x -> Z.cumulativeProbability((t - x) / s) - Z.cumulativeProbability((-t - x) / s),
                            -a, a) / (2 * a);
            double t = solve(inside, P, 20 * (s + a));
            double expected = t / Math.hypot(c[0], c[1]);
            assertThat(CoverageFactor.of(List.of(line(Distribution.NORMAL, c[0]), line(Distribution.RECTANGULAR, c[1]))))
                    .as("normal %s, rectangle u %s", c[0], c[1]).isCloseTo(expected, within(2e-3));
        }
    }

    @Test
    void aMixedBudgetsIntervalHoldsItsShareOfMonteCarloDraws() {
        // the Monte Carlo method of JCGM 101:2008 (clause 7) as the reference: 400 000 draws of the sum of
        // the inputs, the share within +/- k u_c
        List<Contribution> lines = List.of(line(Distribution.NORMAL, 0.8), line(Distribution.RECTANGULAR, 1.2),
                line(Distribution.TRIANGULAR, 0.5), line(Distribution.RECTANGULAR, 0.4));
        double k = CoverageFactor.of(lines);
        double uc = Math.sqrt(0.64 + 1.44 + 0.25 + 0.16);
        Random r = new Random(20261204);
        int n = 400_000;
        int inside = 0;
        for (int i = 0; i < n; i++) {
            double y = 0.8 * r.nextGaussian() + Math.sqrt(3) * 1.2 * (2 * r.nextDouble() - 1)
                    + Math.sqrt(6) * 0.5 / 2 * (2 * r.nextDouble() - 1 + 2 * r.nextDouble() - 1)
                    + Math.sqrt(3) * 0.4 * (2 * r.nextDouble() - 1);
            inside += Math.abs(y) <= k * uc ? 1 : 0;
        }
        // binomial standard error sqrt(p (1 - p) / n) = 3.3e-4: within 4 of them
        assertThat((double) inside / n).isCloseTo(P, within(1.4e-3));
        assertThat(k).isBetween(1.6, 2.0);
    }

    @Test
    void aBudgetOfNothingKeepsTwoAndABadProbabilityIsRefused() {
        assertThat(CoverageFactor.of(List.of())).isEqualTo(2.0);
        assertThat(CoverageFactor.of(List.of(line(Distribution.RECTANGULAR, 0)))).isEqualTo(2.0);
        assertThatThrownBy(() -> CoverageFactor.of(List.of(), 1.0)).hasMessageContaining("0 < p < 1");
    }

    @Test
    void aBudgetThatARectangleDominatesStatesTheSmallerFactorAndItsU() {
        Budget b = Budget.of("L", 1e-3, List.of(line(Distribution.RECTANGULAR, 4e-7), line(Distribution.NORMAL, 1e-7)));
        assertThat(b.coverageFactor()).isLessThan(1.8).isGreaterThan(P * Math.sqrt(3));
        assertThat(b.expandedUncertainty()).isCloseTo(b.coverageFactor() * b.standardUncertainty(), within(1e-15));
    }
}
