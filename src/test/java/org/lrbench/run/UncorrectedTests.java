package org.lrbench.run;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.FixtureCompensation;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * No corrections means an honest U and a visible word: on the simulated bench (its fixture adds
 * 25 mohm and 40 nH of leads and 3 pF across the terminals, simulator/bench.yaml), a part measured
 * with no compensation in force reads the fixture too, and U must cover that error rather than leave
 * the fixture out; a part whose true value is outside a limit must not pass for want of corrections.
 */
class UncorrectedTests {

    private static PartResult measure(String planText, PartModel part, Calibration corrections) throws Exception {
        BenchConfig b = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        Plan plan = PlanLoader.parse(planText, "t.yaml", b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(TestBench.home().resolve("drivers")), sim)) {
            return PartRun.measure(new PartRun.Request(plan, "0", b, "L", "S", true, "t", corrections), inst,
                    BenchClock.NONE, SweepListener.NONE);
        }
    }

    @Test
    void aSmallResistanceReadThroughUncompensatedLeadsIsCoveredByItsU() throws Exception {
        // 22 uH, 30 mohm: the leads add 25 mohm, most of the reading
        PartResult r = measure("""
                plan_format: 1
                part_number: T-22U
                fixture: {sense_resistor: 10 ohm}
                sine_sweep: {amplitude: 1 V, log_sweep: {start: 1 kHz, stop: 100 kHz, points: 7}, cycles: 10, settle: 0 s}
                limits: [{characteristic: series_resistance, max: 40 mohm}]
                """, new PartModel(22e-6, 0.030, 0), Calibration.NONE);
        assertThat(r.error()).isNull();
        assertThat(r.seriesResistanceOhm() - 0.030).as("the leads are read with the part").isGreaterThan(0.015);
        assertThat(Math.abs(r.seriesResistanceOhm() - 0.030)).isLessThanOrEqualTo(r.seriesResistanceExpandedUncertaintyOhm());
        assertThat(r.budgets().get("series_resistance_dc").contributions())
                .anySatisfy(c -> assertThat(c.source()).contains("fixture leads' resistance, not compensated"));
        assertThat(r.corrections().inForce()).isEqualTo("none");
    }

    @Test
    void aResonanceAboveItsMaximumDoesNotPassForWantOfCorrections() throws Exception {
        // 68 mH with 50 pF: 1 / (2 pi sqrt(L C)) = 86.3 kHz (circuit theory), above the 85 kHz maximum;
        // the fixture's 3 pF pull the reading down to about 83.8 kHz, inside it
        double c = 50e-12;
        double truth = 1 / (2 * Math.PI * Math.sqrt(68e-3 * c));
        assertThat(truth).isGreaterThan(85e3);
        for (String rule : List.of("simple", "guarded")) {
            PartResult r = measure("""
                    plan_format: 1
                    part_number: T-68M
                    fixture: {sense_resistor: 1 kohm}
                    sine_sweep:
                      amplitude: 3 V
                      log_sweep: {start: 1 kHz, stop: 120 kHz, points: 15}
                      cycles: 10
                      samples_per_cycle: 100
                      settle: 0 s
                    limits:
                      - {name: resonance, characteristic: self_resonance, max: 85 kHz, decision: RULE}
                    """.replace("RULE", rule), new PartModel(68e-3, 60, c), Calibration.NONE);
            assertThat(r.error()).as(rule).isNull();
            assertThat(r.selfResonanceHz()).as(rule).isNotNull().isLessThan(85e3);
            PartResult.LimitRecord l = r.limits().get(0);
            assertThat(Math.abs(l.value() - truth)).as(rule + ": U covers the uncorrected error")
                    .isLessThanOrEqualTo(l.expandedUncertainty());
            if (rule.equals("guarded")) {
                // guarded acceptance: a reading whose U reaches past the limit is not accepted
                assertThat(r.verdict()).isNotEqualTo(Verdict.PASS);
            }
        }
    }

    @Test
    void aCompensationMeasuredWithAnotherSenseResistorIsNeverApplied() throws Exception {
        FixtureCompensation other = new FixtureCompensation("2026-12-01T00:00:00Z", List.of(
                new FixtureCompensation.Point(1e3, 0.02, 0.0002, Double.NaN, Double.NaN)), "other.yaml", 100.0);
        PartResult r = measure("""
                plan_format: 1
                part_number: T-22U
                fixture: {sense_resistor: 10 ohm}
                sine_sweep: {amplitude: 1 V, frequencies: [1 kHz], cycles: 10, settle: 0 s}
                limits: [{characteristic: series_resistance, max: 40 mohm}]
                """, new PartModel(22e-6, 0.030, 0), new Calibration(null, other));
        assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
        assertThat(r.error()).contains("100.0 ohm sense resistor").contains("other.yaml").contains("calibrate");
    }
}
