package org.lrbench.calibration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.BufferedReader;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.fixture.FixturePosition;
import org.lrbench.measure.BenchClock;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.FixtureChange;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * A calibration is believed only when it is what the bench can physically be: made with the wiring
 * never changed (the operator pressed Enter at every prompt), it measures the part and is refused,
 * nothing kept; an operator gone at a prompt is a clean stop.
 */
class PlausibilityTests {
    private static final String PLAN = """
            plan_format: 1
            part_number: T-5
            fixture: {sense_resistor: 100 ohm}
            sine_sweep: {amplitude: 3 V, log_sweep: {start: 200 Hz, stop: 20 kHz, points: 5}, cycles: 10, settle: 0 s}
            limits: [{characteristic: inductance, min: 1 uH}]
            """;

    private static BenchConfig bench() throws Exception {
        return BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
    }

    @Test
    void aChannelMatchTakenAcrossThePartIsRefused() throws Exception {
        BenchConfig b = bench();
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        // a good 1.5 mH part left in the fixture, the wiring never changed
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1.5e-3, 4.0, 0));
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(TestBench.home().resolve("drivers")), sim)) {
            FixtureChange nothing = position -> { };
            assertThatThrownBy(() -> CalibrationRun.channels(plan, inst, nothing, BenchClock.NONE, b.accuracy()))
                    .isInstanceOf(CalibrationRefused.class).hasMessageContaining("channel 2 reads")
                    .hasMessageContaining("nothing stored").hasMessageContaining("sense resistor");
        }
    }

    @Test
    void aShortAndOpenThatAreThePartAreRefused() throws Exception {
        BenchConfig b = bench();
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1.5e-3, 4.0, 0));
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(TestBench.home().resolve("drivers")), sim)) {
            ChannelMatch m = CalibrationRun.channels(plan, inst, sim::setPosition, BenchClock.NONE, b.accuracy());
            // the channel match was rewired; the short and the open were not: the part stays in
            FixtureChange onlyBack = position -> sim.setPosition(FixturePosition.PART);
            assertThatThrownBy(() -> CalibrationRun.fixture(plan, inst, onlyBack, BenchClock.NONE, m))
                    .isInstanceOf(CalibrationRefused.class).hasMessageContaining("the short reads")
                    .hasMessageContaining("the open reads only").hasMessageContaining("shorting bar");
            // done as asked, the same bench is plausible
            FixtureCompensation good = CalibrationRun.fixture(plan, inst, sim::setPosition, BenchClock.NONE, m);
            assertThat(Plausibility.fixture(good)).isEmpty();
        }
    }

    @Test
    void anOperatorGoneAtAPromptIsACleanStop() {
        ByteArrayOutputStream shown = new ByteArrayOutputStream();
        FixtureChange console = FixtureChange.console(new BufferedReader(new StringReader("")),
                new PrintStream(shown, true, StandardCharsets.UTF_8));
        assertThatThrownBy(() -> console.moveTo(FixturePosition.SHORT)).isInstanceOf(FixtureChange.OperatorGone.class)
                .hasMessageContaining("nothing stored").hasMessageContaining("output is off");
        assertThat(shown.toString(StandardCharsets.UTF_8)).contains("shorting bar");
    }
}
