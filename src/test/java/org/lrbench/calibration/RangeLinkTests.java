package org.lrbench.calibration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.RangeLadder;
import org.lrbench.measure.RangeLinkCapture;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * The channel match on every range pair a sweep uses: a digitizer whose two channels' gains differ
 * from one front-end stage to the next (within a quarter of the declared 0.1 % range match each) gives
 * each range pair its own gain ratio. Calibration reads pairs of ranges against each other on one signal
 * and solves every pair; the simulator's own stage gains are the truth each solved pair is checked
 * against, within its expanded uncertainty (GUM 6.2, k = 2; the ratio's definition is circuit theory:
 * both channels across the same node, from memory).
 */
class RangeLinkTests {
    private static final double SPREAD = 0.00025;

    private static BenchConfig bench() throws Exception {
        BenchConfig b = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        return b.withSimulation(b.simulation().withRangeGainSpread(SPREAD));
    }

    @Test
    void everyLinkedPairIsTheSimulatorsOwnRatioWithinItsUncertainty() throws Exception {
        BenchConfig b = bench();
        Plan plan = PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 0));
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            ChannelMatch m = CalibrationRun.channels(plan, inst, sim::setPosition, BenchClock.NONE, b.accuracy());
            RangeLinks links = m.links();
            assertThat(links).isNotNull();
            assertThat(links.pairs()).hasSizeGreaterThan(100);
            int checked = 0;
            int outside = 0;
            for (RangeLinks.Pair p : links.pairs()) {
                if (p.senseRangeVolt() < 0.1 || p.partRangeVolt() < 0.1) {
                    continue; // small ranges: read with little signal, checked by their u alone below
                }
                double truth = (1 + b.simulation().channel2GainError())
                        * sim.digitizer().stageGain(2, p.partRangeVolt())
                        / sim.digitizer().stageGain(1, p.senseRangeVolt());
                double z = Math.abs(p.gainRatio() / truth - 1) / p.relativeUncertainty();
                checked++;
                if (z > 2) {
                    outside++;
                }
                assertThat(z).as("pair %s / %s", p.senseRangeVolt(), p.partRangeVolt()).isLessThan(4);
            }
            // about 95 % inside k = 2 (GUM 6.2); pairs share readings, so allow a few more outside
            assertThat(checked).isGreaterThan(100);
            assertThat(outside).isLessThanOrEqualTo(checked / 8);
            // a pair on the ranges the demo's sweep uses is known far better than the 0.1 % bound
            // (0.1 % rectangular: u = 0.058 %)
            assertThat(links.pair(RangeLadder.up(6.0), RangeLadder.up(0.4)).relativeUncertainty()).isLessThan(2e-4);
            assertThat(links.pair(RangeLadder.up(6.0), RangeLadder.up(4.0)).relativeUncertainty()).isLessThan(5e-5);
        }
    }

    @Test
    void aCalibratedPartCarriesNoBoundForOtherRangesAndIsRightWithinU() throws Exception {
        BenchConfig b = bench();
        Plan plan = PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 0));
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            Calibration all = CalibrationRun.calibrate(plan, inst, sim::setPosition, BenchClock.NONE);
            PartResult linked = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "A", true, "t", all), inst,
                    BenchClock.NONE, SweepListener.NONE);
            ChannelMatch unlinked = all.channels().withLinks(null);
            PartResult bounded = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "B", true, "t",
                    new Calibration(unlinked, all.fixture(), 0, all.sense())), inst, BenchClock.NONE, SweepListener.NONE);
            assertThat(linked.budgets().get("inductance").contributions())
                    .noneSatisfy(c -> assertThat(c.source()).contains("ranges other than"))
                    .anySatisfy(c -> assertThat(c.source()).contains("each point's range pair"));
            assertThat(bounded.budgets().get("inductance").contributions())
                    .anySatisfy(c -> assertThat(c.source()).contains("ranges other than"));
            assertThat(bounded.warnings()).anySatisfy(w -> assertThat(w).contains("does not cover the range pair"));
            assertThat(linked.warnings()).noneSatisfy(w -> assertThat(w).contains("does not cover the range pair"));
            assertThat(linked.inductanceExpandedUncertaintyH()).isLessThan(bounded.inductanceExpandedUncertaintyH());
            assertThat(Math.abs(linked.inductanceH() - 1e-3))
                    .isLessThanOrEqualTo(linked.inductanceExpandedUncertaintyH());
        }
    }

    /**
     * A pair lost to clipping at the smallest ranges can leave the first reading on an island of its own;
     * the solution is that of the largest linked group, whatever order the pairs were read in (a
     * calibration on the simulated bench lost 77 of 78 readings this way). The ratios are made up so that
     * each solved pair is a product of readings (graph theory, from memory).
     */
    @Test
    void anIslandReadFirstDoesNotHideTheLinkedRanges() {
        var island = new org.lrbench.measure.RangeLinkCapture.Reading(1, 0.016, 2, 0.016, 1.004, 1e-3);
        var a = new org.lrbench.measure.RangeLinkCapture.Reading(1, 0.1, 2, 0.1, 1.002, 1e-4);
        var b = new org.lrbench.measure.RangeLinkCapture.Reading(1, 0.1, 2, 0.125, 1.003, 1e-4);
        var c = new org.lrbench.measure.RangeLinkCapture.Reading(1, 0.125, 2, 0.125, 1.001, 1e-4);
        RangeLinks links = RangeLinks.solve("t", 1000, List.of(island, a, b, c), List.of());
        assertThat(links.pairs()).hasSize(4);
        assertThat(links.pair(0.125, 0.1).gainRatio()).isCloseTo(1.001 * 1.002 / 1.003,
                org.assertj.core.data.Offset.offset(1e-9));
        assertThat(links.pair(0.016, 0.016)).isNull();
        assertThat(links.unread()).containsExactly("1 reading(s) on ranges not linked to the others");
        RangeLinks more = links.plus("t", List.of(new org.lrbench.measure.RangeLinkCapture.Reading(2, 0.125, 2, 0.16,
                1.0005, 1e-4)), List.of());
        assertThat(more.unread()).containsExactly("1 reading(s) on ranges not linked to the others");
        assertThat(more.pair(0.1, 0.16)).isNotNull();
    }

    @Test
    void aMultisinePlansChannelMatchIsReadAsSurelyAsASteppedPlans() throws Exception {
        // a correction is read once and applied to every part: read stepped at the multisine's tones, its
        // skew is as certain as a stepped plan's (read from the multisine itself it was 1.8 times as
        // uncertain); the channel skew's scatter falls with the points' phase uncertainty, common
        // practice, no source
        BenchConfig b = bench();
        Plan plan = PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        double[] skewU = new double[2];
        double[] lowest = new double[2];
        for (int k = 0; k < 2; k++) {
            Plan p = plan.withSweep(plan.sweep().withMultisine(k == 1));
            SimBench sim = new SimBench(b.simulation(), p.wiring(), new PartModel(1e-3, 2.3, 0));
            try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
                Calibration c = CalibrationRun.calibrate(p, inst, sim::setPosition, BenchClock.NONE);
                skewU[k] = c.channels().skewUncertaintySecond();
                lowest[k] = c.fixture().points().get(0).frequencyHz();
            }
        }
        assertThat(skewU[1]).isLessThan(1.5 * skewU[0]);
        // the fixture read at the multisine's tones, which a multisine run looks up (200 Hz moved to its bin)
        assertThat(lowest[1]).isNotEqualTo(lowest[0]).isCloseTo(200.0, org.assertj.core.data.Percentage.withPercentage(2));
    }

    /**
     * Two pairs solved through a chain: channel 2 on 1 V read against channel 1 on 1 V (u1), and channel 2 on
     * 2 V against itself on 1 V (u2). The pair (1 V, 2 V) is the sum of both readings' ln ratios, the pair
     * (1 V, 1 V) the first alone: their covariance is u1^2 and their correlation u1 / sqrt(u1^2 + u2^2)
     * (the law of propagation for correlated outputs, JCGM 100:2008 F.1.2.3; with u1 = u2, 1 / sqrt 2).
     */
    @Test
    void pairsSolvedThroughAChainAreCorrelatedAsThePropagationLawSays() {
        double u1 = 2e-4;
        double u2 = 3e-4;
        RangeLinks links = RangeLinks.solve("now", 1e3, List.of(
                new RangeLinkCapture.Reading(1, 1.0, 2, 1.0, 1.0002, u1),
                new RangeLinkCapture.Reading(2, 1.0, 2, 2.0, 0.9997, u2)), List.of());
        double[][] r = links.correlation(List.of(new double[] {1.0, 1.0}, new double[] {1.0, 2.0}));
        assertThat(r[0][0]).isEqualTo(1);
        assertThat(r[0][1]).isCloseTo(u1 / Math.hypot(u1, u2), within(1e-12));
        assertThat(r[1][0]).isEqualTo(r[0][1]);
        // the stored uncertainties are the same solution's: u1 and sqrt(u1^2 + u2^2)
        assertThat(links.pair(1.0, 2.0).relativeUncertainty()).isCloseTo(Math.hypot(u1, u2), within(1e-12));
        // a pair the readings never solved: no correlation to give
        assertThat(links.correlation(List.of(new double[] {1.0, 5.0}))).isNull();
    }
}
