package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Random;
import org.apache.commons.math3.complex.Complex;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.fit.FitException;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SkinEffect;

class LumpedFitTests {

    static List<ImpedancePoint> sweep(PartModel part, double from, double to, int n, double relNoise, long seed) {
        Random rnd = new Random(seed);
        List<ImpedancePoint> pts = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            double f = from * Math.pow(to / from, i / (n - 1.0));
            Complex z = part.impedance(2 * Math.PI * f);
            double u = relNoise * z.abs();
            Complex noisy = z.add(new Complex(u * rnd.nextGaussian(), u * rnd.nextGaussian()));
            pts.add(new ImpedancePoint(f, relNoise > 0 ? noisy : z, Math.max(u, 1e-9 * z.abs()), Complex.ONE));
        }
        return pts;
    }

    @Test
    void apparentInductanceRisesAsTheSelfResonanceNears() {
        // Textbook lumped model (derived): with a lossless winding, L_apparent = L / (1 - (f/f_SRF)^2),
        // 1.0101 L (1.01 % high) at f_SRF / 10
        double l = 1e-3;
        double c = 15e-12;
        double srf = LumpedModel.selfResonanceHz(l, c);
        double[] p = {1e-9, l, c, 0, 0};
        assertThat(LumpedModel.apparentInductance(p, srf / 10) / l).isCloseTo(1 / (1 - 0.01), within(1e-9));
        assertThat(LumpedModel.apparentInductance(p, srf / 10) / l - 1).isCloseTo(0.0101, within(1e-4));
    }

    @Test
    void copperSkinDepthMatchesTheHandbook() {
        // delta = sqrt(rho / (pi f mu0)), rho = 1.68e-8 ohm m for copper (handbook value):
        // 2.06 mm at 1 kHz, 0.652 mm at 10 kHz, 206 um at 100 kHz
        assertThat(SkinEffect.skinDepth(SkinEffect.COPPER_RESISTIVITY, 1e3)).isCloseTo(2.06e-3, within(0.005e-3));
        assertThat(SkinEffect.skinDepth(SkinEffect.COPPER_RESISTIVITY, 1e4)).isCloseTo(0.652e-3, within(0.001e-3));
        assertThat(SkinEffect.skinDepth(SkinEffect.COPPER_RESISTIVITY, 1e5)).isCloseTo(206e-6, within(0.5e-6));
    }

    @Test
    void recoversEveryParameterOfANoiseFreeLumpedPart() {
        PartModel part = new PartModel(1e-3, 2.3, 15e-12, 0.8e-3, 0);
        List<ImpedancePoint> pts = sweep(part, 200, 1e6, 25, 0, 1);
        LumpedFit.Result r = LumpedFit.fit(pts, EnumSet.of(LumpedParameter.C_P, LumpedParameter.SKIN));
        assertThat(r.dropped()).isEmpty();
        assertThat(r.value(LumpedParameter.L)).isCloseTo(1e-3, within(1e-9));
        assertThat(r.value(LumpedParameter.R_DC)).isCloseTo(2.3, within(1e-6));
        assertThat(r.value(LumpedParameter.C_P)).isCloseTo(15e-12, within(1e-17));
        assertThat(r.value(LumpedParameter.SKIN)).isCloseTo(SkinEffect.coefficient(0.8e-3), within(1e-9));
    }

    @Test
    void capacitanceTheSweepCannotSeeIsDroppedAndBoundedInstead() {
        // a sweep ending two decades below resonance, with 0.1 % noise per point
        PartModel part = new PartModel(1e-3, 2.3, 15e-12);
        List<ImpedancePoint> pts = sweep(part, 200, 13e3, 7, 1e-3, 3);
        LumpedFit.Result r = LumpedFit.fit(pts, EnumSet.of(LumpedParameter.C_P, LumpedParameter.SKIN));
        assertThat(r.free()).doesNotContain(LumpedParameter.C_P);
        assertThat(r.dropped()).anyMatch(s -> s.startsWith("parallel_capacitance"));
        assertThat(r.capacitanceUpperBound()).isGreaterThan(0);
        assertThat(r.value(LumpedParameter.L)).isCloseTo(1e-3, within(5e-6));
        // the bound on the resonance lies above the swept range
        double srfBound = LumpedModel.selfResonanceHz(r.value(LumpedParameter.L), r.capacitanceUpperBound());
        assertThat(srfBound).isGreaterThan(13e3);
    }

    /**
     * The term test is the extra-sum-of-squares F test at 5 % (Bevington and Robinson, Data
     * Reduction and Error Analysis, 3rd ed., 11.4, from memory): over repeats of a part with no
     * parallel capacitance worth the name, the term is kept about 5 % of the time (false alarms at
     * the test's level), and a capacitance ten times its uncertainty is always kept.
     */
    @Test
    void modelTermsAreKeptByTheFTestAtItsLevel() {
        PartModel none = new PartModel(1e-3, 2.3, 1e-18);
        int kept = 0;
        int runs = 200;
        for (int seed = 0; seed < runs; seed++) {
            LumpedFit.Result r = LumpedFit.fit(sweep(none, 200, 20e3, 11, 1e-3, seed), EnumSet.of(LumpedParameter.C_P));
            kept += r.free().contains(LumpedParameter.C_P) ? 1 : 0;
            if (!r.free().contains(LumpedParameter.C_P)) {
                assertThat(r.dropped()).singleElement().asString().contains("parallel_capacitance");
            }
        }
        // kept only with a positive estimate that passes: at most half of the 5 % two-sided chance,
        // plus binomial scatter (3 sigma of 200 draws at 5 %: 9)
        assertThat(kept).isLessThanOrEqualTo(10 + 9);
        PartModel some = new PartModel(1e-3, 2.3, 2e-9);
        for (int seed = 0; seed < 20; seed++) {
            LumpedFit.Result r = LumpedFit.fit(sweep(some, 200, 20e3, 11, 1e-3, seed), EnumSet.of(LumpedParameter.C_P));
            assertThat(r.free()).contains(LumpedParameter.C_P);
        }
    }

    @Test
    void uncertaintiesFromTheFitMatchTheScatterOverRepeats() {
        // the covariance's standard uncertainty must describe the spread of repeated fits
        PartModel part = new PartModel(1e-3, 2.3, 15e-12);
        int repeats = 200;
        double sum = 0;
        double sum2 = 0;
        double claimed = 0;
        for (int k = 0; k < repeats; k++) {
            LumpedFit.Result r = LumpedFit.fit(sweep(part, 200, 1e6, 15, 1e-3, 100 + k), EnumSet.of(LumpedParameter.C_P));
            double l = r.value(LumpedParameter.L);
            sum += l;
            sum2 += l * l;
            claimed += r.uncertainty(LumpedParameter.L);
        }
        double mean = sum / repeats;
        double sd = Math.sqrt(sum2 / repeats - mean * mean);
        assertThat(claimed / repeats).isCloseTo(sd, within(0.2 * sd));
    }

    /**
     * A 100 mH / 50 ohm / 60 pF part swept 20 Hz to 100 kHz and to 200 kHz, through its
     * self-resonance at 1 / (2 pi sqrt(L C)) = 64.97 kHz (LC resonance, circuit theory): the fit finds
     * the same L and C_p as a sweep that stops below it, with 0.1 % noise on each point.
     */
    @Test
    void aSweepThroughSelfResonanceIsFittedFromTheDataNotFromTheSeriesModel() {
        PartModel part = new PartModel(100e-3, 50, 60e-12);
        for (double top : new double[] {50e3, 100e3, 200e3}) {
            List<ImpedancePoint> pts = sweep(part, 20, top, 15, 1e-3, 7);
            LumpedFit.Result r = LumpedFit.fit(pts, EnumSet.of(LumpedParameter.C_P, LumpedParameter.SKIN));
            assertThat(r.value(LumpedParameter.L)).as("L, sweep to " + top).isCloseTo(100e-3, within(0.5e-3));
            assertThat(r.value(LumpedParameter.C_P)).as("C_p, sweep to " + top).isCloseTo(60e-12, within(1e-12));
            assertThat(r.reducedChiSquare()).as("chi2, sweep to " + top).isLessThan(3);
            assertThat(LumpedModel.selfResonanceHz(r.value(LumpedParameter.L), r.value(LumpedParameter.C_P)))
                    .isCloseTo(64.97e3, within(0.4e3));
        }
    }

    @Test
    void dataNoModelDescribesAreRefusedNotFitted() {
        // a reactance that changes sign twice is no inductor this model knows: the fit says so
        List<ImpedancePoint> pts = new ArrayList<>();
        for (int i = 0; i < 12; i++) {
            double f = 100 * Math.pow(10, i / 4.0);
            double x = (i % 2 == 0 ? 1 : -1) * 100.0 * (i + 1);
            pts.add(new ImpedancePoint(f, new Complex(10, x), 0.01, Complex.ONE));
        }
        Assertions.assertThatThrownBy(() -> LumpedFit.fit(pts, EnumSet.of(LumpedParameter.C_P)))
                .isInstanceOf(FitException.class)
                .hasMessageContaining("does not describe");
    }
}
