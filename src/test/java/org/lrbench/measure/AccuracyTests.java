package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.analysis.SeriesModel;
import org.lrbench.analysis.SeriesModelFit;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

/** Extraction through the full SCPI path with the default bench imperfections. */
class AccuracyTests {

    @Test
    void oneMillihenryChokeIsMeasuredWithinBenchPracticeAccuracy() throws Exception {
        // Common practice, no source: a 1 mH inductor with 2.3 ohm winding resistance behind a
        // 100 ohm sense resistor, driven with a 3 V peak 1 kHz sine, measured with default noise
        // and an 8-bit digitizer, comes out within 0.5 % in L and 5 % in R.
        for (long seed = 1; seed <= 5; seed++) {
            TestBench bench = new TestBench(SimSettings.defaults().withSeed(seed), 100,
                    new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
            Plan plan = PlanLoader.parse("""
                    plan_format: 1
                    part_number: T-1
                    fixture: {sense_resistor: 100 ohm}
                    sine_sweep: {amplitude: 3 V, frequencies: [1 kHz], cycles: 10, settle: 1 ms}
                    limits: [{characteristic: inductance, nominal: 1 mH, tolerance: 10 %}]
                    """, "t.yaml", 5.0);
            List<PointResult> points = new SweepRunner(bench.generator, bench.digitizer, BenchClock.NONE)
                    .run(plan, SweepListener.NONE).points();
            SeriesModel m = SeriesModelFit.fit(points.stream().map(PointResult::impedance).toList());
            assertThat(m.inductanceHenry()).as("seed %d", seed).isCloseTo(1e-3, within(0.005e-3));
            assertThat(m.resistanceOhm()).as("seed %d", seed).isCloseTo(2.3, within(0.05 * 2.3));
            PointResult p = points.get(0);
            assertThat(p.senseRangeVolt()).isGreaterThan(0);
            // auto-ranging leaves both traces between half and nine tenths of full scale
            double fill1 = 2 * p.senseFit().amplitude() / p.senseRangeVolt();
            double fill2 = 2 * p.partFit().amplitude() / p.partRangeVolt();
            assertThat(fill1).isBetween(0.45, 0.9);
            assertThat(fill2).isBetween(0.45, 0.9);
        }
    }
}
