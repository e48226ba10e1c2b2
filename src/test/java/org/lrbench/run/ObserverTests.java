package org.lrbench.run;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.MeasurementStopped;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.StopToken;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

/**
 * Observers observe: a sweep listener that throws changes neither the measurement nor the verdict;
 * stopping is a token the sweep checks between points; the sweep's waits go through the bench clock
 * it is given, so the settle rule is checked here in simulated time, not real time.
 */
class ObserverTests {
    private static final String PLAN = OutputSafetyTests.PLAN.replace("settle: 0 s", "settle: 40 ms")
            .replace("[1 kHz, 2 kHz]", "[1 kHz, 2 kHz, 5 kHz]");

    private static TestBench bench() throws Exception {
        return new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
    }

    private static PartRun.Measured measure(SweepListener listener, StopToken stop, BenchClock clock) throws Exception {
        TestBench b = bench();
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        return PartRun.measure(OutputSafetyTests.request(plan), new BenchInstruments(b.generator, b.digitizer, List.of()),
                clock, listener, stop);
    }

    @Test
    void aListenerThatThrowsAtEveryPointChangesNothing() throws Exception {
        AtomicInteger heard = new AtomicInteger();
        SweepListener broken = new SweepListener() {
            @Override
            public void sweepStarted() {
                throw new IllegalStateException("display gone");
            }

            @Override
            public void pointMeasured(int index, int count, PointResult point) {
                heard.incrementAndGet();
                throw new IllegalArgumentException("display gone at point " + index);
            }
        };
        PartResult quiet = measure(SweepListener.NONE, StopToken.NEVER, BenchClock.NONE).result();
        PartResult loud = measure(broken, StopToken.NEVER, BenchClock.NONE).result();
        // the simulated bench's noise is seeded: the same measurement gives the same numbers
        assertThat(heard.get()).isEqualTo(3);
        assertThat(loud.verdict()).isEqualTo(quiet.verdict()).isEqualTo(Verdict.PASS);
        assertThat(loud.error()).isNull();
        assertThat(loud.inductanceH()).isEqualTo(quiet.inductanceH());
        assertThat(loud.seriesResistanceOhm()).isEqualTo(quiet.seriesResistanceOhm());
    }

    @Test
    void aStopRequestedEndsTheSweepBetweenPointsWithTheOutputOff() throws Exception {
        TestBench b = bench();
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        List<Integer> points = new ArrayList<>();
        SweepListener count = new SweepListener() {
            @Override
            public void pointMeasured(int index, int count, PointResult point) {
                points.add(index);
            }
        };
        // asked once the first point is in: the sweep ends before it captures another
        StopToken afterFirst = () -> !points.isEmpty();
        assertThatThrownBy(() -> PartRun.measure(OutputSafetyTests.request(plan),
                new BenchInstruments(b.generator, b.digitizer, List.of()), BenchClock.NONE, count, afterFirst))
                .isInstanceOf(MeasurementStopped.class);
        assertThat(points).hasSizeLessThanOrEqualTo(2);
        assertThat(b.sim.generator().isOutputOn()).isFalse();
    }

    /** A clock that only moves when the sweep waits: the waits are the settle rule's, exactly. */
    private static final class SimulatedClock implements BenchClock {
        long now;
        final List<Double> waits = new ArrayList<>();

        @Override
        public void sleep(double seconds) {
            if (seconds > 0) {
                waits.add(seconds);
                now += (long) (seconds * 1e9);
            }
        }

        @Override
        public long nanoTime() {
            return now;
        }
    }

    @Test
    void eachPointWaitsThePlansSettleOnTheClockItIsGiven() throws Exception {
        SimulatedClock clock = new SimulatedClock();
        PartResult r = measure(SweepListener.NONE, StopToken.NEVER, clock).result();
        assertThat(r.verdict()).isEqualTo(Verdict.PASS);
        // no real time passes on this clock between the frequency change and the capture, so the level
        // check before the sweep and each of the three points wait the plan's whole fixed settle of 40 ms
        // (the first point's ranging records wait it too, and then nothing is left of it for the record)
        double total = clock.waits.stream().mapToDouble(Double::doubleValue).sum();
        assertThat(clock.waits).allSatisfy(w -> assertThat(w).isLessThanOrEqualTo(40e-3 + 1e-12));
        assertThat(total).isCloseTo(4 * 40e-3, org.assertj.core.api.Assertions.within(1e-9));
    }
}
