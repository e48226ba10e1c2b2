package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.sim.PartModel;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.uncertainty.Budget;

class SweepAnalysisTests {
    private static final Evaluation L = new Evaluation("L", "H", p -> p[LumpedParameter.L.ordinal()]);

    /**
     * A pre-test estimator (keep a term only when a test finds it) is biased when the term is
     * real but near the noise: the runs that leave it out are those whose noise hid it (omitted-
     * variable bias after a preliminary test; T. A. Bancroft, Ann. Math. Statist. 15, 1944, from
     * memory). A 15 pF capacitance on a 1 mH part swept to 20 kHz is about 1.5 of its standard
     * uncertainties: the value averaged over the fits with and without the term must be less biased
     * than the value of the model the test picked, and its U must cover the truth about as
     * often as it promises.
     */
    @Test
    void aTermTheTestCannotDecideOnIsAveragedNotPicked() {
        PartModel part = new PartModel(1e-3, 2.3, 15e-12);
        int runs = 300;
        double[] averaged = new double[runs];
        double[] picked = new double[runs];
        int covered = 0;
        int undecided = 0;
        for (int k = 0; k < runs; k++) {
            List<ImpedancePoint> pts = LumpedFitTests.sweep(part, 200, 20e3, 11, 1e-4, 500 + k);
            SweepAnalysis.Result r = SweepAnalysis.analyse(pts, EnumSet.of(LumpedParameter.C_P), List.of(L),
                    new BenchAccuracy(0, 0, 0, 0));
            Budget b = r.budgets().get("L");
            averaged[k] = b.value();
            picked[k] = r.fit().value(LumpedParameter.L);
            covered += Math.abs(b.value() - 1e-3) <= b.expandedUncertainty() ? 1 : 0;
            if (!r.fit().omitted().isEmpty()) {
                undecided++;
                // one undecided term: the value is the mean of the two fits'
                LumpedFit.Omitted o = r.fit().omitted().get(0);
                assertThat(b.value()).isCloseTo((picked[k] + o.parametersWith()[LumpedParameter.L.ordinal()]) / 2,
                        within(1e-12 * picked[k]));
                // one value of L per part: the parameters reported carry the budget's L, not the picked fit's
                assertThat(r.reported(LumpedParameter.L)).isCloseTo(b.value(), within(1e-12 * picked[k]))
                        .isNotEqualTo(picked[k]);
            }
        }
        assertThat(undecided).as("runs the test could not decide").isBetween(runs / 5, 4 * runs / 5);
        double sd = sd(averaged);
        double biasAveraged = (mean(averaged) - 1e-3) / sd;
        double biasPicked = (mean(picked) - 1e-3) / sd(picked);
        assertThat(Math.abs(biasAveraged)).isLessThan(0.6 * Math.abs(biasPicked));
        assertThat(Math.abs(biasAveraged)).isLessThan(0.3);
        // a k = 2 interval covers 95.45 % of a normal distribution (JCGM 100:2008 G.3); 300 runs
        // scatter by 1.2 % about it
        assertThat(covered / (double) runs).isBetween(0.92, 0.995);
    }

    /**
     * An uncompensated stray capacitance's bound (10 pF) on a part resonating in its sweep (68 mH, 53 pF,
     * 83.8 kHz): f = 1 / (2 pi sqrt(L C)) moves by f / (2 C) per farad (circuit theory), so the line's
     * sensitivity must be that, whichever minimum a re-fit started from the unperturbed fit would reach
     * (it reached one at 93 pF for the step that takes the stray off, and read the line 3x small on a
     * real sweep). The central difference over +/- 5.77 pF of C^-1/2 is 0.8 % above the derivative.
     */
    @Test
    void aStrayBoundsLineFollowsTheResonancesOwnSlope() {
        PartModel part = new PartModel(68e-3, 60, 53e-12);
        List<ImpedancePoint> pts = LumpedFitTests.sweep(part, 1e3, 120e3, 15, 1e-5, 1);
        Evaluation resonance = new Evaluation("resonance", "Hz",
                p -> LumpedModel.selfResonanceHz(LumpedParameter.L.in(p), LumpedParameter.C_P.in(p)));
        SweepAnalysis.Result r = SweepAnalysis.analyse(pts, EnumSet.of(LumpedParameter.C_P), List.of(resonance),
                new BenchAccuracy(0, 0, 0, 0).withFixture(new BenchAccuracy.FixtureBounds(0, 0, 10e-12)));
        Budget b = r.budgets().get("resonance");
        double slope = b.value() / (2 * LumpedParameter.C_P.in(r.reported()));
        assertThat(b.contributions()).filteredOn(c -> c.source().startsWith("fixture's stray capacitance"))
                .singleElement().satisfies(c -> assertThat(c.sensitivity()).isCloseTo(slope, within(0.02 * slope)));
    }

    /**
     * A skew the channel match leaves (its own uncertainty, 1 ns) rotates each point by 2 pi f tau,
     * which no lumped term absorbs: the residuals it leaves are explained by the skew's budget line,
     * so the fit covariance is not scaled up for them as well. Without that line the same residuals
     * are unexplained scatter and the covariance is scaled (the Birge ratio; R. T. Birge, Phys. Rev.
     * 40, 1932, from memory).
     */
    @Test
    void scatterTheSkewExplainsIsCountedOnceInItsOwnLine() {
        PartModel part = new PartModel(22e-3, 20, 120e-12);
        List<ImpedancePoint> exact = LumpedFitTests.sweep(part, 50, 50e3, 11, 0, 1);
        double tau = 1e-9;
        List<ImpedancePoint> turned = new ArrayList<>();
        for (ImpedancePoint p : exact) {
            double phi = -2 * Math.PI * p.frequencyHz() * tau;
            turned.add(new ImpedancePoint(p.frequencyHz(), p.impedanceOhm().multiply(new Complex(Math.cos(phi),
                    Math.sin(phi))), 2e-5 * p.impedanceOhm().abs(), Complex.ONE));
        }
        var terms = EnumSet.of(LumpedParameter.C_P);
        SweepAnalysis.Result unexplained = SweepAnalysis.analyse(turned, terms, List.of(L), new BenchAccuracy(0, 0, 0, 0));
        assertThat(unexplained.fit().reducedChiSquare()).isGreaterThan(2);
        assertThat(unexplained.fit().covarianceScale()).isEqualTo(unexplained.fit().reducedChiSquare());
        // a rectangular half-width of sqrt(3) ns is a standard uncertainty of 1 ns (JCGM 100:2008 4.3.7)
        SweepAnalysis.Result explained = SweepAnalysis.analyse(turned, terms, List.of(L),
                new BenchAccuracy(0, 0, Math.sqrt(3) * tau, 0));
        assertThat(explained.fit().reducedChiSquare()).isEqualTo(unexplained.fit().reducedChiSquare());
        assertThat(explained.fit().covarianceScale()).isCloseTo(1, within(1e-9));
        Budget b = explained.budgets().get("L");
        assertThat(b.contributions()).anyMatch(c -> c.source().contains("skew") && c.contribution() > 0);
    }

    /**
     * Range pairs linked through a chain of readings err like a random walk along the sweep: the gain
     * error of point i is the sum of i + 1 independent steps, covariance s^2 (min(i, j) + 1). The range
     * pairs' line must be what those errors do to L and R: checked against Monte Carlo draws of the
     * correlated errors, each sweep re-fitted (JCGM 101:2008, propagation of distributions; 600 draws
     * estimate a standard deviation to 2.9 %). Fully correlated errors (one scale for every point)
     * move L by L times the scale (Z scaled: circuit theory).
     */
    @Test
    void theRangePairsLineFollowsTheirCorrelation() {
        PartModel part = new PartModel(1e-3, 2.3, 0);
        double s = 1e-4;
        // exact impedances, each known to s of its magnitude (the fit's weights)
        List<ImpedancePoint> pts = LumpedFitTests.sweep(part, 200, 20e3, 11, 0, 1).stream()
                .map(p -> new ImpedancePoint(p.frequencyHz(), p.impedanceOhm(), s * p.impedanceOhm().abs(), Complex.ONE))
                .toList();
        int n = pts.size();
        double[][] walk = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                walk[i][j] = s * s * (Math.min(i, j) + 1);
            }
        }
        Evaluation r = new Evaluation("R", "ohm", p -> p[LumpedParameter.R_DC.ordinal()]);
        var none = EnumSet.noneOf(LumpedParameter.class);
        SweepAnalysis.Result res = SweepAnalysis.analyse(pts, none, List.of(L, r), new BenchAccuracy(0, 0, 0, 0),
                new double[n], walk, null);
        java.util.Random rnd = new java.util.Random(7);
        int draws = 600;
        double[] ls = new double[draws];
        double[] rs = new double[draws];
        for (int k = 0; k < draws; k++) {
            List<ImpedancePoint> moved = new ArrayList<>();
            double e = 0;
            for (ImpedancePoint p : pts) {
                e += s * rnd.nextGaussian();
                moved.add(p.times(new Complex(1 + e, 0)));
            }
            double[] fitted = LumpedFit.fit(moved, none).parameters();
            ls[k] = fitted[LumpedParameter.L.ordinal()];
            rs[k] = fitted[LumpedParameter.R_DC.ordinal()];
        }
        assertThat(rangePairLine(res.budgets().get("L"))).isCloseTo(sd(ls), within(0.1 * sd(ls)));
        assertThat(rangePairLine(res.budgets().get("R"))).isCloseTo(sd(rs), within(0.1 * sd(rs)));

        double[][] whole = new double[n][n];
        for (double[] row : whole) {
            java.util.Arrays.fill(row, s * s);
        }
        SweepAnalysis.Result one = SweepAnalysis.analyse(pts, none, List.of(L), new BenchAccuracy(0, 0, 0, 0),
                new double[n], whole, null);
        assertThat(rangePairLine(one.budgets().get("L"))).isCloseTo(1e-3 * s, within(1e-3 * 1e-3 * s));
    }

    private static double rangePairLine(Budget b) {
        return b.contributions().stream().filter(c -> c.source().startsWith("channel gain ratio of each point"))
                .mapToDouble(c -> c.contribution()).sum();
    }

    private static double mean(double[] v) {
        double s = 0;
        for (double x : v) {
            s += x;
        }
        return s / v.length;
    }

    private static double sd(double[] v) {
        double m = mean(v);
        double s = 0;
        for (double x : v) {
            s += (x - m) * (x - m);
        }
        return Math.sqrt(s / (v.length - 1));
    }
}
