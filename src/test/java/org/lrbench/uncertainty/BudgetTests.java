package org.lrbench.uncertainty;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.EnumSet;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.Evaluation;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.analysis.SweepAnalysis;

class BudgetTests {

    @Test
    void rectangularAndTriangularStandardUncertainties() {
        // JCGM 100:2008 (GUM) 4.3.7: rectangular of half-width a has u = a / sqrt(3); 4.3.9: triangular u = a / sqrt(6)
        assertThat(Distribution.RECTANGULAR.standardUncertainty(1.0)).isCloseTo(0.57735, within(1e-5));
        assertThat(Distribution.TRIANGULAR.standardUncertainty(1.0)).isCloseTo(0.40825, within(1e-5));
    }

    @Test
    void welchSatterthwaiteEffectiveDegreesOfFreedom() {
        // GUM G.4.1, equation (G.2b): nu_eff = u_c^4 / sum(u_i^4 / nu_i). Three unit contributions,
        // one with 4 degrees of freedom: u_c^2 = 3, nu_eff = 9 / (1/4) = 36 (derived)
        assertThat(Budget.welchSatterthwaite(new double[] {1, 1, 1},
                new double[] {4, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY})).isCloseTo(36, within(1e-12));
        // a lone type A contribution keeps its own degrees of freedom
        assertThat(Budget.welchSatterthwaite(new double[] {0.3}, new double[] {7})).isCloseTo(7, within(1e-12));
    }

    @Test
    void contributionsCombineInQuadratureAndShareTheVariance() {
        Budget b = Budget.of("x", 1.0, List.of(
                new Contribution("a", "B", Distribution.RECTANGULAR, 3, "", 1, 3, Double.POSITIVE_INFINITY, 0),
                new Contribution("b", "A", Distribution.NORMAL, 4, "", 1, 4, 10, 0)));
        assertThat(b.standardUncertainty()).isCloseTo(5, within(1e-12));
        // U = k u_c with k from the output's distribution (CoverageFactorTests): between the rectangle's
        // p sqrt(3) and the normal's 2 for a normal and a rectangle together
        assertThat(b.coverageFactor()).isBetween(1.66, 2.0);
        assertThat(b.expandedUncertainty()).isCloseTo(b.coverageFactor() * 5, within(1e-12));
        assertThat(b.contributions().get(0).share()).isCloseTo(9.0 / 25, within(1e-12));
    }

    static List<ImpedancePoint> ideal(double l, double r, double... freqs) {
        return Arrays.stream(freqs).mapToObj(f -> new ImpedancePoint(f, new Complex(r, 2 * Math.PI * f * l),
                1e-9, Complex.ONE)).toList();
    }

    @Test
    void skewMovesResistanceByQTimesThePhaseError() {
        // Derived from the series model: a skew tau turns Z by 2 pi f tau, moving R by about
        // X * 2 pi f tau, i.e. Q times the phase error in relative terms. For 100 uH at 100 kHz with
        // Q = 100, 100 ps of skew moves R by about 0.63 %.
        double l = 100e-6;
        double x = 2 * Math.PI * 1e5 * l;
        double r = x / 100;
        var points = ideal(l, r, 90e3, 100e3, 110e3);
        var eval = new Evaluation("R", "ohm", p -> p[0]);
        var result = SweepAnalysis.analyse(points, EnumSet.noneOf(LumpedParameter.class), List.of(eval),
                new BenchAccuracy(0, 0, 100e-12, 0));
        Contribution skew = result.budgets().get("R").contributions().stream()
                .filter(c -> c.source().contains("skew")).findFirst().orElseThrow();
        double shiftFor100ps = Math.abs(skew.sensitivity()) * 100e-12;
        assertThat(shiftFor100ps / r).isCloseTo(0.00628, within(0.0002));
    }

    @Test
    void senseResistorToleranceScalesInductanceOneForOne() {
        // L = X / w with X proportional to Rs: the relative sensitivity is 1, so u(L) = L a / sqrt(3)
        var points = ideal(1e-3, 2.3, 1e3, 2e3, 5e3, 10e3);
        var result = SweepAnalysis.analyse(points, EnumSet.noneOf(LumpedParameter.class),
                List.of(new Evaluation("L", "H", p -> p[1])), new BenchAccuracy(0.001, 0, 0, 0));
        Contribution rs = result.budgets().get("L").contributions().get(1);
        assertThat(rs.source()).contains("sense resistor");
        assertThat(rs.contribution()).isCloseTo(1e-3 * 0.001 / Math.sqrt(3), within(1e-12));
    }
}
