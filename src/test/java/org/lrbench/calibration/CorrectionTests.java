package org.lrbench.calibration;

import org.lrbench.judge.Verdict;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;

class CorrectionTests {

    @Test
    void channelMatchRecoversGainAndSkewFromExactRatios() {
        double[] f = {1e3, 1e4, 1e5, 1e6};
        List<Complex> h = new ArrayList<>();
        for (double x : f) {
            double phase = -2 * Math.PI * x * 2e-9;
            h.add(new Complex(1.004 * Math.cos(phase), 1.004 * Math.sin(phase)));
        }
        ChannelMatch m = ChannelMatch.fit("t", f, h);
        assertThat(m.gainRatio()).isCloseTo(1.004, within(1e-12));
        assertThat(m.skewSecond()).isCloseTo(2e-9, within(1e-18));
    }

    @Test
    void channelMatchWeighsEachPointByItsOwnUncertainty() {
        // the inverse-variance weighted mean and its internal and external (Birge ratio) standard
        // uncertainties: common practice, no source; R. T. Birge, Phys. Rev. 40 (1932), from memory
        double[] f = {1e3, 2e3, 5e3, 1e4, 1e5};
        double[] u = {1e-4, 1e-4, 1e-4, 1e-4, 1e-2};
        double[] off = {1e-4, -1e-4, 1e-4, -1e-4, 2e-2};   // the last point, on a small range, is far off
        List<Complex> h = new ArrayList<>();
        for (int i = 0; i < f.length; i++) {
            h.add(new Complex(1.004 * (1 + off[i]), 0));
        }
        ChannelMatch weighted = ChannelMatch.fit("t", f, h, u);
        // weights 1e8 for four points and 1e4 for the last: the mean moves by 2e-2 x 1e4 / (4e8 + 1e4)
        assertThat(weighted.gainRatio()).isCloseTo(1.004 * (1 + 2e-2 * 1e4 / (4e8 + 1e4)), within(1e-12));
        // chi^2 / (n - 1) is about (4 x 1 + 4) / 4 = 2: the scatter's uncertainty, sqrt(2) above the internal one
        double internal = 1.004 / Math.sqrt(4e8 + 1e4);
        assertThat(weighted.gainUncertainty()).isBetween(1.3 * internal, 1.5 * internal);
        // with equal weights the far point pulls the mean by a fifth of its offset
        assertThat(ChannelMatch.fit("t", f, h).gainRatio()).isCloseTo(1.004 * (1 + 2e-2 / 5), within(1e-9));
    }

    /**
     * The skew is the weighted least-squares slope of phase against -2 pi f through the origin,
     * each point weighted by its own phase uncertainty; its standard uncertainty is
     * 1 / sqrt(sum w omega^2), or the scatter's when larger (weighted straight-line fit: Bevington
     * and Robinson, Data Reduction and Error Analysis, 3rd ed., ch. 6, from memory). Over repeats
     * with one noisy point (a small signal near a part's resonance), the stated uncertainty must
     * describe the spread, and the estimate must not follow the noisy point.
     */
    @Test
    void channelMatchSkewIsWeightedByEachPointsPhaseUncertainty() {
        double[] f = new double[11];
        double[] u = new double[11];
        for (int i = 0; i < f.length; i++) {
            f[i] = 50 * Math.pow(2000, i / 10.0);
            u[i] = i == 10 ? 3e-2 : 2e-4;
        }
        double tau = 150e-12;
        java.util.Random rnd = new java.util.Random(7);
        int runs = 400;
        double z2 = 0;
        double weightedErr2 = 0;
        double alikeErr2 = 0;
        for (int k = 0; k < runs; k++) {
            List<Complex> h = new ArrayList<>();
            for (int i = 0; i < f.length; i++) {
                double phase = -2 * Math.PI * f[i] * tau;
                Complex exact = new Complex(1.004 * Math.cos(phase), 1.004 * Math.sin(phase));
                h.add(exact.multiply(new Complex(1 + u[i] * rnd.nextGaussian(), u[i] * rnd.nextGaussian())));
            }
            ChannelMatch m = ChannelMatch.fit("t", f, h, u);
            double z = (m.skewSecond() - tau) / m.skewUncertaintySecond();
            z2 += z * z;
            weightedErr2 += Math.pow(m.skewSecond() - tau, 2);
            alikeErr2 += Math.pow(ChannelMatch.fit("t", f, h).skewSecond() - tau, 2);
        }
        // the Birge ratio only ever enlarges the uncertainty: rms z at most 1, and not far below
        assertThat(Math.sqrt(z2 / runs)).isBetween(0.75, 1.1);
        assertThat(Math.sqrt(weightedErr2 / runs)).isLessThan(Math.sqrt(alikeErr2 / runs) / 3);
    }

    @Test
    void openShortCompensationInvertsTheFixtureModel() {
        // Open/short compensation (the usual series-residual, shunt-admittance fixture model, derived):
        // Z_m = Z_s + 1 / (Y_o + 1 / Z_dut) is undone by (Z_m - Z_s) / (1 - (Z_m - Z_s) Y_o)
        double f = 1e5;
        double w = 2 * Math.PI * f;
        Complex zs = new Complex(0.025, w * 40e-9);
        Complex yo = new Complex(1e-7, w * 3e-12);
        Complex dut = new Complex(2.3, w * 1e-3);
        Complex zm = zs.add(yo.add(dut.reciprocal()).reciprocal());
        Complex open = zs.add(yo.reciprocal());
        FixtureCompensation c = new FixtureCompensation("t", List.of(new FixtureCompensation.Point(f, zs.getReal(),
                zs.getImaginary(), open.getReal(), open.getImaginary())));
        Complex back = c.correct(f, zm);
        assertThat(back.getReal()).isCloseTo(2.3, within(1e-9));
        assertThat(back.getImaginary()).isCloseTo(w * 1e-3, within(1e-9));
    }

    @Test
    void theShortReadingsUncertaintyIsCarriedThroughTheCompensation() {
        // first-order propagation (JCGM 100:2008 5.1.2): subtracting the short adds its variance; the
        // open correction multiplies by |dZ/dZ_m| = 1 / |1 - (Z_m - Z_s) Y_o|^2, checked by finite differences
        double f = 1e5;
        double w = 2 * Math.PI * f;
        Complex zs = new Complex(0.025, w * 40e-9);
        Complex yo = new Complex(1e-7, w * 3e-12);
        Complex open = zs.add(yo.reciprocal());
        Complex zm = new Complex(2.4, w * 1.02e-3);
        FixtureCompensation c = new FixtureCompensation("t", List.of(new FixtureCompensation.Point(f, zs.getReal(),
                zs.getImaginary(), open.getReal(), open.getImaginary(), 3e-3)));
        double h = 1e-6;
        double slope = c.correct(f, zm.add(new Complex(h, 0))).subtract(c.correct(f, zm)).abs() / h;
        assertThat(c.uncertainty(f, zm, 4e-3)).isCloseTo(Math.hypot(4e-3, 3e-3) * slope, within(1e-9));
        FixtureCompensation noOpen = new FixtureCompensation("t", List.of(new FixtureCompensation.Point(f, zs.getReal(),
                zs.getImaginary(), Double.NaN, Double.NaN, 3e-3)));
        assertThat(noOpen.uncertainty(f, zm, 4e-3)).isCloseTo(5e-3, within(1e-15));
    }

    @Test
    void theOpenAdmittancesUncertaintyIsCarriedThroughTheCompensation() {
        // first-order propagation (JCGM 100:2008 5.1.2) of u(Y_o): |dZ/dY_o| checked by finite
        // differences of the correction itself, near a resonance where the open correction matters
        double f = 1e5;
        double w = 2 * Math.PI * f;
        Complex zs = new Complex(0.025, w * 40e-9);
        Complex yo = new Complex(1e-7, w * 3e-12);
        Complex open = zs.add(yo.reciprocal());
        Complex zm = new Complex(900, 4.0e4);
        double uy = 2e-8;
        FixtureCompensation c = new FixtureCompensation("t", List.of(new FixtureCompensation.Point(f, zs.getReal(),
                zs.getImaginary(), open.getReal(), open.getImaginary(), 0.0, false, uy)));
        double h = 1e-12;
        Complex shifted = zs.add(yo.add(new Complex(h, 0)).reciprocal());
        FixtureCompensation moved = new FixtureCompensation("t", List.of(new FixtureCompensation.Point(f, zs.getReal(),
                zs.getImaginary(), shifted.getReal(), shifted.getImaginary(), 0.0)));
        double slopeY = moved.correct(f, zm).subtract(c.correct(f, zm)).abs() / h;
        double slopeZ = c.correct(f, zm.add(new Complex(1e-3, 0))).subtract(c.correct(f, zm)).abs() / 1e-3;
        assertThat(c.uncertainty(f, zm, 0.5)).isCloseTo(Math.hypot(0.5 * slopeZ, uy * slopeY),
                within(1e-3 * c.uncertainty(f, zm, 0.5)));
    }

    @Test
    void calibrationOnTheSimulatedBenchRemovesLeadsGainAndSkew(@TempDir Path dir) throws Exception {
        // known truth: a 100 uH, 0.5 ohm part behind 25 mohm + 40 nH leads, channel 2 reading 1 % high
        // and 2 ns late; measured up to 200 kHz where skew matters (Q about 250 at the top)
        BenchConfig bench = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        SimSettings s = new SimSettings(50, 0.5e-3, 8, 11, 0.01, 2e-9, 0.025, 40e-9, 3e-12);
        BenchConfig b = bench.withSimulation(s);
        Plan plan = PlanLoader.parse("""
                plan_format: 1
                part_number: T-2
                fixture: {sense_resistor: 10 ohm}
                sine_sweep:
                  amplitude: 3 V
                  log_sweep: {start: 1 kHz, stop: 200 kHz, points: 8}
                  cycles: 20
                  settle: 0 s
                  model_terms: []
                limits: [{characteristic: series_resistance, max: 10 ohm}]
                """, "t.yaml", 5.0);
        PartModel part = new PartModel(100e-6, 0.5, 0);
        SimBench sim = new SimBench(s, 10, part);
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        PartResult raw;
        PartResult corrected;
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            raw = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "raw", true, "t"), inst, BenchClock.NONE,
                    SweepListener.NONE);
            ChannelMatch m = CalibrationRun.channels(plan, inst, sim::setPosition, BenchClock.NONE);
            FixtureCompensation fx = CalibrationRun.fixture(plan, inst, sim::setPosition, BenchClock.NONE, m);
            assertThat(m.gainRatio()).isCloseTo(1.01, within(0.0005));
            assertThat(m.skewSecond()).isCloseTo(2e-9, within(0.3e-9));
            corrected = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "cor", true, "t", new Calibration(m, fx)),
                    inst, BenchClock.NONE, SweepListener.NONE);
        }
        double rawErr = Math.abs(raw.seriesResistanceOhm() - 0.5);
        double corErr = Math.abs(corrected.seriesResistanceOhm() - 0.5);
        assertThat(rawErr).isGreaterThan(0.02);
        assertThat(corErr).isLessThan(0.005);
        assertThat(Math.abs(corrected.inductanceH() - 100e-6)).isLessThan(0.1e-6);
        assertThat(Math.abs(raw.inductanceH() - 100e-6)).isGreaterThan(0.5e-6);
        // and the corrections are named in the record
        assertThat(corrected.corrections().channel2GainRatio()).isCloseTo(1.01, within(0.0005));
    }

    /**
     * The sweep's fit runs on a thread of its own while the triangle is measured; a fit that fails
     * there must still make the part an error with the fit's reason, never a verdict: corrections
     * measured with another plan's frequencies do not cover this sweep.
     */
    @Test
    void aFitThatFailsAheadOfTheTriangleIsAnErrorWithItsReason() throws Exception {
        BenchConfig bench = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        String planText = """
                plan_format: 1
                part_number: T-3
                fixture: {sense_resistor: 100 ohm}
                sine_sweep:
                  amplitude: 3 V
                  log_sweep: {start: %s, stop: %s, points: 5}
                  cycles: 10
                  settle: 0 s
                triangle_check: {amplitude: 3 V, frequency: 500 Hz, cycles: 5}
                limits: [{characteristic: inductance, min: 1 uH}]
                """;
        Plan other = PlanLoader.parse(planText.formatted("1 kHz", "10 kHz"), "other.yaml", 5.0);
        Plan plan = PlanLoader.parse(planText.formatted("200 Hz", "20 kHz"), "t.yaml", 5.0);
        SimBench sim = new SimBench(bench.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 15e-12));
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        try (BenchInstruments inst = BenchInstruments.open(bench, drivers, sim)) {
            Calibration fromOther = CalibrationRun.calibrate(other, inst, sim::setPosition, BenchClock.NONE);
            PartResult r = PartRun.measure(new PartRun.Request(plan, "0", bench, "L", "S", true, "t", fromOther), inst,
                    BenchClock.NONE, SweepListener.NONE);
            assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
            assertThat(r.error()).contains("could not be fitted").contains("has no reading at");
            assertThat(r.limits()).isEmpty();
        }
    }
}
