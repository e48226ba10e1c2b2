package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.lrbench.analysis.SeriesModel;
import org.lrbench.analysis.SeriesModelFit;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimSettings;
import org.lrbench.TestBench;

/**
 * Parts of a tray measured one after another on instruments kept open: the part after the first
 * is ranged from the one before (no ranging records at its first point), and a part unlike the one
 * before still comes out right. Accuracy: common practice, no source (as AccuracyTests: 0.5 % in L
 * for a 1 mH choke on an 8-bit digitizer).
 */
class RangeMemoryTests {
    private static final String PLAN = """
            plan_format: 1
            part_number: T-1
            fixture: {sense_resistor: 100 ohm}
            sine_sweep: {amplitude: 3 V, frequencies: [500 Hz, 2 kHz, 8 kHz], cycles: 10, settle: 1 ms}
            triangle_check: {amplitude: 3 V, frequency: 500 Hz, cycles: 10, samples_per_cycle: 400, harmonics: 31}
            limits: [{characteristic: inductance, nominal: 1 mH, tolerance: 10 %}]
            """;

    private static SeriesModel model(SweepRunner.Measurement m) {
        return SeriesModelFit.fit(m.points().stream().map(PointResult::impedance).toList());
    }

    @Test
    void thePartAfterTheFirstIsRangedFromItAndAPartUnlikeItStillComesOutRight() throws Exception {
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        List<PartModel> tray = List.of(new PartModel(1e-3, 2.3, 0), new PartModel(1e-3, 2.3, 0),
                new PartModel(10e-3, 12, 0));
        SimSettings settings = SimSettings.defaults().withSeed(11);
        SimBench sim = new SimBench(settings, 100, tray);
        TestBench bench = new TestBench(sim, TestBench.genericDigitizer());
        RangeMemory memory = new RangeMemory();
        SweepRunner runner = new SweepRunner(bench.generator, bench.digitizer, BenchClock.NONE, memory);
        sim.switchUnit().execute(":ROUTe:CLOSe (@1)");
        SweepRunner.Measurement first = runner.run(plan, SweepListener.NONE);
        assertThat(first.points().get(0).acquisitions()).as("the first part finds its ranges on short records")
                .isGreaterThan(1);
        sim.switchUnit().execute(":ROUTe:OPEN:ALL;:ROUTe:CLOSe (@2)");
        SweepRunner.Measurement second = runner.run(plan, SweepListener.NONE);
        assertThat(second.points().get(0).acquisitions()).as("ranged from the part before").isEqualTo(1);
        assertThat(model(second).inductanceHenry()).isCloseTo(1e-3, within(0.005e-3));
        assertThat(second.triangle()).isNotNull();
        sim.switchUnit().execute(":ROUTe:OPEN:ALL;:ROUTe:CLOSe (@3)");
        SweepRunner.Measurement unlike = runner.run(plan, SweepListener.NONE);
        assertThat(model(unlike).inductanceHenry()).isCloseTo(10e-3, within(0.05e-3));
        assertThat(model(unlike).resistanceOhm()).isCloseTo(12, within(0.05 * 12));
    }

    /**
     * A part after the first sends each point's time base in its acquisition's message, whether the
     * settle is over when the point is captured (the circuit rule's microseconds) or still running
     * (the plan's fixed 1 ms): two round trips to the digitizer per point (acquire, both channels'
     * traces in one message) where the first part takes three, and the same L (common practice, no
     * source: 0.5 % as above).
     */
    @ParameterizedTest
    @ValueSource(strings = {"0 s", "1 ms"})
    void aTimeBaseGrantedAsAskedBeforeGoesWithTheAcquisition(String settle) throws Exception {
        assertThat(PLAN).contains("settle: 1 ms");
        Plan plan = PlanLoader.parse(PLAN.replace("settle: 1 ms", "settle: " + settle), "t.yaml", 5.0);
        SimBench sim = new SimBench(SimSettings.defaults().withSeed(12), 100, new PartModel(1e-3, 2.3, 0));
        TestBench bench = new TestBench(sim, TestBench.genericDigitizer());
        RangeMemory memory = new RangeMemory();
        SweepRunner runner = new SweepRunner(bench.generator, bench.digitizer, BenchClock.NONE, memory);
        long[] trips = new long[2];
        SweepRunner.Measurement[] parts = new SweepRunner.Measurement[2];
        for (int k = 0; k < 2; k++) {
            long[] atPoint = new long[3];
            parts[k] = runner.run(plan, new SweepListener() {
                @Override
                public void pointMeasured(int index, int count, PointResult point) {
                    atPoint[index] = bench.digitizerSession.queries();
                }
            });
            // from the second point's report to the third's: one point's capture (reports come a point late)
            trips[k] = atPoint[2] - atPoint[1];
        }
        assertThat(trips[0]).as("first part, time base on its own").isEqualTo(3);
        assertThat(trips[1]).as("next part, time base with the acquisition").isEqualTo(2);
        assertThat(model(parts[1]).inductanceHenry()).isCloseTo(1e-3, within(0.005e-3));
    }
}
