package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.time.Duration;
import java.util.List;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.analysis.SeriesModel;
import org.lrbench.analysis.SeriesModelFit;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.ScpiDigitizer;
import org.lrbench.driver.ScpiGenerator;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;
import org.lrbench.transport.inproc.InProcessTransport;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;

/** Fixture topologies and probes on the simulated bench. */
class WiringTests {
    static final String PLAN = """
            plan_format: 1
            part_number: T-W
            fixture:
              sense_resistor: 100 ohm
            %s
            sine_sweep: {amplitude: 3 V, log_sweep: {start: 1 kHz, stop: 20 kHz, points: 5}, cycles: 10, settle: 0 s,
                         model_terms: []}
            limits: [{characteristic: series_resistance, max: 10 ohm}]
            """;

    static SeriesModel measure(String wiring) throws Exception {
        Plan plan = PlanLoader.parse(PLAN.formatted(wiring), "w.yaml", 5.0);
        // a 12-bit digitizer with 0.5 mV of noise and no channel mismatch
        SimBench sim = new SimBench(new SimSettings(50, 0.5e-3, 12, 3), plan.wiring(), new PartModel(1e-3, 2.3, 0));
        DriverFile source = DriverLoader.read(TestBench.home().resolve("drivers/generic-source.yaml"), "s",
                DriverKind.SOURCE, new Problems("s"));
        DriverFile dig = DriverLoader.read(TestBench.home().resolve("drivers/generic-digitizer-float.yaml"), "d",
                DriverKind.DIGITIZER, new Problems("d"));
        var gen = new ScpiGenerator(new ScpiSession("g", new InProcessTransport("sim://g", sim.generator()),
                Duration.ofSeconds(1)), source);
        var d = new ScpiDigitizer(new ScpiSession("d", new InProcessTransport("sim://d", sim.digitizer()),
                Duration.ofSeconds(1)), dig);
        List<PointResult> pts = new SweepRunner(gen, d, BenchClock.NONE).run(plan, SweepListener.NONE).points();
        return SeriesModelFit.fit(pts.stream().map(PointResult::impedance).toList());
    }

    @Test
    void lowSideSenseRecoversTheSameInductorAsDifferentialWiring() throws Exception {
        SeriesModel diff = measure("");
        SeriesModel low = measure("  wiring: low_side\n"
                + "  probes: {channel1: {kind: single_ended, attenuation: 10}, channel2: {kind: single_ended, attenuation: 10}}");
        // circuit theory (textbook, from memory): V_part = V(top) - V(sense) when both share ground
        assertThat(low.inductanceHenry()).isCloseTo(1e-3, within(0.002e-3));
        assertThat(low.resistanceOhm()).isCloseTo(2.3, within(0.05));
        assertThat(low.inductanceHenry()).isCloseTo(diff.inductanceHenry(), within(0.002e-3));
        assertThat(low.resistanceOhm()).isCloseTo(diff.resistanceOhm(), within(0.05));
    }

    @Test
    void probeAttenuationIsAppliedToTheData() throws Exception {
        SeriesModel tenX = measure("  probes: {channel1: {attenuation: 10}, channel2: {attenuation: 10}}");
        assertThat(tenX.inductanceHenry()).isCloseTo(1e-3, within(0.002e-3));
        assertThat(tenX.resistanceOhm()).isCloseTo(2.3, within(0.05));
    }

    @Test
    void aGroundedInputAcrossTheFloatingSenseResistorIsRefused() {
        var e = Assertions.catchThrowableOfType(ProblemsException.class, () -> PlanLoader.parse(
                PLAN.formatted("  probes: {channel1: {kind: single_ended}}"), "w.yaml", 5.0));
        assertThat(e.problems().get(0).key()).isEqualTo("fixture.probes");
        assertThat(e.problems().get(0).message()).contains("single-ended").contains("low_side");
    }
}
