package org.lrbench.run;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.RangeLinks;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.RangeLinkCapture;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * The corrections are read once and applied to every part, so their errors never average away: they
 * must be known better than the specifications they replace. The simulated bench's channel 2 lags
 * channel 1 by 150 ps and its declared skew accuracy is 200 ps (simulator/bench.yaml).
 */
class CorrectionRecordsTests {

    private static final String PLAN = """
            plan_format: 1
            part_number: T-1M
            fixture: {sense_resistor: 100 ohm}
            sine_sweep: {amplitude: 3 V, log_sweep: {start: 200 Hz, stop: 20 kHz, points: 11}, cycles: 10, settle: 0 s}
            limits: [{characteristic: inductance, min: 1 nH}]
            """;

    /** The channel match of one seed's calibration, the generator's time base off the digitizer's by {@code e}. */
    private static ChannelMatch match(long seed, double timeBaseError) throws Exception {
        BenchConfig b = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        b = b.withSimulation(b.simulation().withSeed(seed));
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 15e-12));
        sim.generator().setTimeBaseError(timeBaseError);
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(TestBench.home().resolve("drivers")), sim)) {
            return CalibrationRun.channels(plan, inst, sim::setPosition, BenchClock.NONE);
        }
    }

    @Test
    void theChannelsSkewIsKnownBetterThanTheBenchsSpecification() throws Exception {
        // common practice, no source: a correction read less surely than the specification it replaces
        // is no correction. At the plan's 10 cycles an 8-bit record left the skew about 800 ps uncertain
        double squares = 0;
        int seeds = 6;
        for (int s = 0; s < seeds; s++) {
            ChannelMatch m = match(500 + s, 0);
            assertThat(m.skewUncertaintySecond()).as("seed " + s).isLessThan(200e-12);
            assertThat(Math.abs(m.skewSecond() - 150e-12)).as("seed " + s).isLessThan(3 * m.skewUncertaintySecond());
            squares += Math.pow(m.skewSecond() - 150e-12, 2);
        }
        assertThat(Math.sqrt(squares / seeds)).as("root-mean-square error of the skew").isLessThan(200e-12);
    }

    @Test
    void aGeneratorOffTheDigitizersTimeBaseLeavesTheCorrectionsAsSure() throws Exception {
        // 30 ppm, within the bench's 50 ppm frequency accuracy (simulator/bench.yaml): over a 400-cycle
        // record a sine fitted at the generator's setting walks 0.08 rad, and the residual counted as
        // noise made the skew ten times as uncertain
        for (long seed : new long[] {610, 611}) {
            ChannelMatch exact = match(seed, 0);
            ChannelMatch off = match(seed, 30e-6);
            assertThat(off.skewUncertaintySecond()).as("seed " + seed).isLessThan(200e-12)
                    .isLessThan(1.5 * exact.skewUncertaintySecond());
            assertThat(off.gainUncertainty()).as("seed " + seed).isLessThan(1.5 * exact.gainUncertainty());
            assertThat(Math.abs(off.skewSecond() - 150e-12)).isLessThan(3 * off.skewUncertaintySecond());
        }
    }

    @Test
    void aRangePairTheMatchReadIsSolvedWithItsOwnReadings() {
        // weighted least squares (common practice, no source): the links reach pair (6.3, 6.3) through two
        // readings with 1e-4 uncertainty, the match read it directly five times at 3e-5 each; the solution
        // must follow the direct readings, within their combined uncertainty 3e-5 / sqrt(5)
        List<RangeLinkCapture.Reading> links = List.of(
                new RangeLinkCapture.Reading(1, 5.0, 2, 5.0, 1.0037, 1e-4),
                new RangeLinkCapture.Reading(1, 5.0, 2, 6.3, 1.0038, 1e-4),
                new RangeLinkCapture.Reading(1, 6.3, 2, 5.0, 1.0041, 1e-4),
                new RangeLinkCapture.Reading(1, 6.3, 2, 6.3, 1.0043, 1e-4));
        List<PointResult> points = new ArrayList<>();
        List<Complex> ratio = new ArrayList<>();
        double[] u = new double[5];
        for (int i = 0; i < 5; i++) {
            ImpedancePoint z = new ImpedancePoint(1e3 * (i + 1), new Complex(100.38, 0), 1e-6, new Complex(0.01, 0));
            points.add(new PointResult(z, null, null, 6.3, 6.3, 1e-6, 1000, 1, 0, null, null));
            ratio.add(new Complex(1.0038, 0));
            u[i] = 3e-5;
        }
        RangeLinks solved = RangeLinks.solve("t", 1e3, CalibrationRun.withMatchReadings(links, points, ratio, u), List.of());
        RangeLinks.Pair p = solved.pair(6.3, 6.3);
        assertThat(p.gainRatio()).isCloseTo(1.0038, within(3e-5 / Math.sqrt(5) * 2));
        assertThat(p.relativeUncertainty()).isLessThan(3e-5);
        // the links alone put it 4e-4 higher
        assertThat(RangeLinks.solve("t", 1e3, links, List.of()).pair(6.3, 6.3).gainRatio()).isGreaterThan(1.0041);
    }
}
