package org.lrbench.run;

import org.lrbench.judge.Verdict;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;

/**
 * A part measured through its self-resonance on the simulated bench: 100 mH, 50 ohm, 60 pF, whose
 * resonance is at 1 / (2 pi sqrt(L C)) = 64.97 kHz (LC resonance, circuit theory), swept 20 Hz to
 * 100 kHz. The resonance is a measured value and limits on it are judged on it.
 */
class ResonanceTests {
    static final Path HOME = TestBench.home();

    static PartResult measure(double minResonanceHz) throws Exception {
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench.yaml"))
                .withSimulation(SimSettings.defaults().withSeed(11));
        Plan plan = PlanLoader.parse("""
                plan_format: 1
                part_number: T-100MH
                fixture: {sense_resistor: 1 kohm}
                sine_sweep:
                  amplitude: 3 V
                  log_sweep: {start: 20 Hz, stop: 100 kHz, points: 15}
                  cycles: 10
                  samples_per_cycle: 100
                  settle: 0 s
                limits:
                  - {name: inductance, characteristic: inductance, at: 100 Hz, nominal: 100 mH, tolerance: 10 %}
                  - {name: resonance, characteristic: self_resonance, min: MINIMUM}
                """.replace("MINIMUM", minResonanceHz + " Hz"), "t.yaml", b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(100e-3, 50, 60e-12));
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(HOME.resolve("drivers")), sim)) {
            return PartRun.measure(new PartRun.Request(plan, "0", b, "L", "S", true, "test"), inst, BenchClock.NONE,
                    SweepListener.NONE);
        }
    }

    @Test
    void aPartSweptThroughItsResonanceIsMeasuredAndJudgedOnIt() throws Exception {
        PartResult below = measure(50e3);
        assertThat(below.error()).isNull();
        assertThat(below.inductanceH()).isCloseTo(100e-3, within(1e-3));
        assertThat(below.selfResonanceHz()).isNotNull().isCloseTo(64.97e3, within(1.3e3));
        assertThat(below.verdict()).isEqualTo(Verdict.PASS);
        // the same part against a minimum above its resonance fails on the measured resonance
        PartResult above = measure(100e3);
        assertThat(above.verdict()).isEqualTo(Verdict.FAIL);
        assertThat(above.failedLimits()).singleElement().asString().contains("resonance");
    }
}
