package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.analysis.SeriesModel;
import org.lrbench.analysis.SeriesModelFit;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;

/**
 * Circuit theory (textbook series-circuit phasor analysis, from memory): a sine of peak V into a
 * total series resistance Rt with an inductance L drives a current of peak V / sqrt(Rt^2 + (wL)^2)
 * lagging the source by atan(wL / Rt). Here Rt = generator output + sense resistor + winding.
 */
class CircuitTheoryTests {
    static final double L = 1e-3;
    static final double R = 2.3;
    static final double RS = 100;
    static final double RG = 50;
    static final double V = 3.0;

    @Test
    void circuitCurrentMatchesTheSeriesFormula() {
        Circuit c = new Circuit(RG, RS, new PartModel(L, R, 0));
        for (double f : new double[] {50, 1e3, 33.3e3, 1e6}) {
            double w = 2 * Math.PI * f;
            Complex i = c.current(new Complex(V, 0), w);
            double rt = RG + RS + R;
            assertThat(i.abs()).isCloseTo(V / Math.sqrt(rt * rt + w * w * L * L), within(1e-12));
            assertThat(-i.getArgument()).isCloseTo(Math.atan(w * L / rt), within(1e-12));
        }
    }

    @Test
    void simulatedTracesAndExtractionAgreeWithTheoryWithoutNoise() throws Exception {
        SimSettings ideal = new SimSettings(RG, 0.0, 0, 7);
        TestBench bench = new TestBench(ideal, RS, new PartModel(L, R, 0), TestBench.real64Digitizer());
        Plan plan = PlanLoader.parse("""
                plan_format: 1
                part_number: T-1
                fixture: {sense_resistor: 100 ohm}
                sine_sweep:
                  amplitude: 3 V
                  frequencies: [1 kHz, 3.7 kHz, 21.3 kHz]
                  cycles: 7
                  samples_per_cycle: 128
                  settle: 0 s
                limits:
                  - {characteristic: series_resistance, max: 10 ohm}
                """, "t.yaml", 5.0);
        List<PointResult> points = new SweepRunner(bench.generator, bench.digitizer, BenchClock.NONE)
                .run(plan, SweepListener.NONE).points();
        for (PointResult p : points) {
            double w = 2 * Math.PI * p.impedance().frequencyHz();
            double rt = RG + RS + R;
            double expectedPeak = V / Math.sqrt(rt * rt + w * w * L * L);
            assertThat(p.senseFit().amplitude() / RS).isCloseTo(expectedPeak, within(1e-9 * expectedPeak));
            double lagOfPartVoltageBehindCurrent = p.partFit().phase() - p.senseFit().phase();
            assertThat(lagOfPartVoltageBehindCurrent).isCloseTo(Math.atan(w * L / R), within(1e-9));
            assertThat(p.impedance().resistanceOhm()).isCloseTo(R, within(1e-9 * R));
            assertThat(p.impedance().inductanceHenry()).isCloseTo(L, within(1e-9 * L));
        }
        SeriesModel model = SeriesModelFit.fit(points.stream().map(PointResult::impedance).toList());
        assertThat(model.resistanceOhm()).isCloseTo(R, within(1e-9 * R));
        assertThat(model.inductanceHenry()).isCloseTo(L, within(1e-9 * L));
        assertThat(bench.sim.generator().isOutputOn()).isFalse();
    }

    @Test
    void parallelCapacitanceGivesTheTextbookResonance() {
        // resonance of L parallel to C at f0 = 1 / (2 pi sqrt(LC)) (textbook, from memory): with a
        // lossless winding the impedance there is an open circuit, so |Z| peaks
        double c = 100e-12;
        PartModel part = new PartModel(L, 1e-3, c);
        double f0 = 1 / (2 * Math.PI * Math.sqrt(L * c));
        double at = part.impedance(2 * Math.PI * f0).abs();
        assertThat(at).isGreaterThan(part.impedance(2 * Math.PI * f0 * 0.99).abs());
        assertThat(at).isGreaterThan(part.impedance(2 * Math.PI * f0 * 1.01).abs());
        // at resonance a lossy tank is about Q^2 R = (w0 L)^2 / R
        double w0 = 2 * Math.PI * f0;
        assertThat(at).isCloseTo(w0 * L * w0 * L / 1e-3, within(1e-3 * at));
    }
}
