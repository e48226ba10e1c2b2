package org.lrbench.run;

import org.lrbench.judge.Verdict;

import static org.assertj.core.api.Assertions.assertThat;
import static org.mockito.ArgumentMatchers.any;
import static org.mockito.ArgumentMatchers.anyDouble;
import static org.mockito.ArgumentMatchers.anyInt;
import static org.mockito.Mockito.atLeastOnce;
import static org.mockito.Mockito.doCallRealMethod;
import static org.mockito.Mockito.doThrow;
import static org.mockito.Mockito.inOrder;
import static org.mockito.Mockito.mock;
import static org.mockito.Mockito.when;

import java.util.List;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Waveform;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;
import org.lrbench.uncertainty.BenchAccuracy;
import org.mockito.InOrder;
import org.mockito.Mockito;

/** The generator output goes off on every exit path, and a fault is never a pass. */
class OutputSafetyTests {
    static final String PLAN = """
            plan_format: 1
            part_number: T-1
            fixture: {sense_resistor: 100 ohm}
            sine_sweep: {amplitude: 3 V, frequencies: [1 kHz, 2 kHz], cycles: 10, settle: 0 s}
            limits: [{characteristic: series_resistance, max: 10 ohm}]
            """;

    static BenchConfig bench() {
        return new BenchConfig("b.yaml", "test-bench", 5.0, null, null, SimSettings.defaults(), BenchAccuracy.defaults());
    }

    static PartRun.Request request(Plan plan) {
        return new PartRun.Request(plan, "0", bench(), "L1", "S1", true, "test");
    }

    @Test
    void digitizerFaultMidSweepEndsInErrorWithOutputOff() throws Exception {
        Generator gen = mock(Generator.class);
        // settings sent together run one after another, as the interface's default does (the output
        // comes on in the generator's batch)
        doCallRealMethod().when(gen).batch(any());
        Digitizer dig = mock(Digitizer.class);
        when(gen.identity()).thenReturn(new Identity("X", "G", "1", "1"));
        when(dig.identity()).thenReturn(new Identity("X", "D", "1", "1"));
        when(dig.rangeLimits(anyInt())).thenReturn(new RangeLimits(0.01, 100));
        when(dig.setRange(anyInt(), anyDouble())).thenAnswer(a -> a.getArgument(1));
        when(dig.setRanges(anyDouble(), anyDouble())).thenCallRealMethod();
        when(dig.setTimingAndRanges(anyDouble(), anyInt(), anyDouble(), anyDouble(), any())).thenCallRealMethod();
        when(dig.setTiming(anyDouble(), anyInt())).thenAnswer(a -> new Timing(a.getArgument(0), a.getArgument(1)));
        doThrow(new InstrumentException("digitizer: link lost")).when(dig).acquire();

        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        PartResult r = PartRun.measure(request(plan), new BenchInstruments(gen, dig, List.of()), BenchClock.NONE,
                SweepListener.NONE);

        assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
        assertThat(r.error()).contains("link lost");
        assertThat(r.inductanceH()).isNull();
        InOrder order = inOrder(gen);
        order.verify(gen).outputOn();
        order.verify(gen, atLeastOnce()).outputOff();
    }

    @Test
    void failingToSwitchOffIsAnErrorEvenAfterAGoodSweep() throws Exception {
        var bench = new TestBench(SimSettings.defaults(), 100,
                new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        Generator real = bench.generator;
        Generator flaky = new Generator() {
            int offCalls;

            @Override public Identity identity() { return real.identity(); }
            @Override public void prepare() { real.prepare(); }
            @Override public void setWaveform(Waveform w) { real.setWaveform(w); }
            @Override public void setFrequency(double hz) { real.setFrequency(hz); }
            @Override public void setAmplitude(double v) { real.setAmplitude(v); }
            @Override public void setOffset(double v) { real.setOffset(v); }
            @Override public void outputOn() { real.outputOn(); }
            @Override public void outputOff() {
                // the sweep's own switch-off works; the guard's final one finds the link dead
                if (++offCalls > 1) {
                    throw new InstrumentException("generator: no reply");
                }
                real.outputOff();
            }
        };
        Plan plan = PlanLoader.parse(PLAN, "t.yaml", 5.0);
        PartResult r = PartRun.measure(request(plan), new BenchInstruments(flaky, bench.digitizer, List.of()),
                BenchClock.NONE, SweepListener.NONE);
        assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
        assertThat(r.error()).contains("could not switch the generator output off");
    }

    @Test
    void planBeyondTheDigitizerEndsInErrorAndTheSimulatedOutputIsOff() throws Exception {
        var bench = new TestBench(SimSettings.defaults(), 100,
                new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        // 10 MHz at 200 samples per cycle needs 0.5 ns sampling; the simulated digitizer's clock is 1 ns
        Plan plan = PlanLoader.parse(PLAN.replace("[1 kHz, 2 kHz]", "[1 kHz, 10 MHz]")
                .replace("cycles: 10", "cycles: 10, samples_per_cycle: 200"), "t.yaml", 5.0);
        PartResult r = PartRun.measure(request(plan), new BenchInstruments(bench.generator, bench.digitizer, List.of()),
                BenchClock.NONE, SweepListener.NONE);
        assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
        // the digitizer refuses the interval (SCPI -222), and that fault is reported as the error
        assertThat(r.error()).contains("TINTerval").contains("-222");
        assertThat(bench.sim.generator().isOutputOn()).isFalse();
    }

    @Test
    void planOverTheBenchCeilingIsRefusedBeforeAnythingIsSwitched() throws Exception {
        Generator gen = mock(Generator.class);
        Plan plan = PlanLoader.parse(PLAN.replace("3 V", "4.5 V"), "t.yaml", 5.0);
        BenchConfig low = new BenchConfig("b.yaml", "low", 4.0, null, null, SimSettings.defaults(), BenchAccuracy.defaults());
        Assertions.assertThatThrownBy(() -> PartRun.measure(
                new PartRun.Request(plan, "0", low, "L", "S", true, "t"),
                new BenchInstruments(gen, mock(Digitizer.class), List.of()), BenchClock.NONE, SweepListener.NONE))
                .hasMessageContaining("exceeds the bench's maximum");
        Mockito.verifyNoInteractions(gen);
    }
}
