package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

/** Settings sent together in one message, and what an instrument says once asked once. */
class BatchTests {

    @Test
    void settingsInABatchGoAsOneMessageAndAllTakeEffect() throws Exception {
        TestBench b = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        b.generator.prepare();
        long before = b.generatorSession.queries();
        b.generator.batch(() -> {
            b.generator.setWaveform(Waveform.TRIANGLE);
            b.generator.setFrequency(1234);
            b.generator.setAmplitude(1.5);
        });
        // one round trip (the settings and one error query), not three
        assertThat(b.generatorSession.queries() - before).isEqualTo(1);
        assertThat(b.sim.generator().waveform()).isEqualTo(Waveform.TRIANGLE);
        assertThat(b.sim.generator().frequency()).isEqualTo(1234.0);
        // an error in any of them fails the batch, naming the message (SCPI-1999 -222, data out of range)
        assertThatThrownBy(() -> b.generator.batch(() -> {
            b.generator.setFrequency(1000);
            b.generator.setFrequency(1e12);
        })).isInstanceOf(InstrumentException.class).hasMessageContaining("-222");
    }

    /**
     * An output-off the generator confirmed is not sent again while nothing else has been sent (the
     * end of a part and the guard on its way out take one message, not two); any message since,
     * whatever it was, makes the next one go out.
     */
    @Test
    void aConfirmedOutputOffIsNotSentAgainUntilAnotherMessageIs() throws Exception {
        TestBench b = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        b.generator.prepare();
        b.generator.outputOn();
        assertThat(b.sim.generator().isOutputOn()).isTrue();
        long before = b.generatorSession.queries();
        b.generator.outputOff();
        b.generator.outputOff();
        assertThat(b.generatorSession.queries() - before).isEqualTo(1);
        assertThat(b.sim.generator().isOutputOn()).isFalse();
        // a query in between (nothing that switches it on) still counts as a message since
        b.generatorSession.query("*IDN?");
        long again = b.generatorSession.queries();
        b.generator.outputOff();
        assertThat(b.generatorSession.queries() - again).isEqualTo(1);
        b.generator.outputOn();
        b.generator.outputOff();
        assertThat(b.sim.generator().isOutputOn()).isFalse();
        // inside a batch the off goes with the batch and is not taken as confirmed on its own
        b.generator.batch(() -> {
            b.generator.outputOff();
            b.generator.outputOn();
        });
        assertThat(b.sim.generator().isOutputOn()).isTrue();
        b.generator.outputOff();
        assertThat(b.sim.generator().isOutputOn()).isFalse();
    }

    @Test
    void rangeLimitsAreAskedOnceInOneMessage() throws Exception {
        TestBench b = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        b.digitizer.prepare();
        long before = b.digitizerSession.queries();
        var first = b.digitizer.rangeLimits(1);
        assertThat(b.digitizerSession.queries() - before).isEqualTo(1);
        b.digitizer.prepare();
        long again = b.digitizerSession.queries();
        assertThat(b.digitizer.rangeLimits(1)).isEqualTo(first);
        assertThat(b.digitizerSession.queries()).isEqualTo(again);
        assertThat(first.minVolt()).isPositive().isLessThan(first.maxVolt());
    }

    @Test
    void theTimeBaseAndTheRangesGoAsOneMessageAndGrantWhatSeparateMessagesGrant() throws Exception {
        TestBench separate = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        TestBench together = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        separate.digitizer.prepare();
        together.digitizer.prepare();
        var t1 = separate.digitizer.setTiming(2.5e-6, 2023);
        double[] r1 = separate.digitizer.setRanges(5.3, 0.27);
        long before = together.digitizerSession.queries();
        double[] r2 = new double[2];
        var t2 = together.digitizer.setTimingAndRanges(2.5e-6, 2023, 5.3, 0.27, r2);
        assertThat(together.digitizerSession.queries() - before).as("one round trip").isEqualTo(1);
        assertThat(t2).isEqualTo(t1);
        assertThat(r2).containsExactly(r1);
        // a channel whose request did not change is not sent again; the other is
        long again = together.digitizerSession.queries();
        double[] r3 = new double[2];
        together.digitizer.setTimingAndRanges(5e-6, 2023, 5.3, 0.5, r3);
        assertThat(together.digitizerSession.queries() - again).isEqualTo(1);
        assertThat(r3[0]).isEqualTo(r2[0]);
        assertThat(r3[1]).isEqualTo(separate.digitizer.setRange(2, 0.5));
    }

    /**
     * The time base, the ranges and the acquisition in one message: one round trip where the
     * settings and then the acquisition take two, the same time base and ranges granted, and the
     * same record (the simulated bench is seeded alike, so the traces agree sample for sample).
     */
    @Test
    void theTimeBaseTheRangesAndTheAcquisitionGoAsOneMessageAndRecordWhatSeparateMessagesRecord() throws Exception {
        TestBench separate = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        TestBench together = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        for (TestBench b : new TestBench[] {separate, together}) {
            b.generator.prepare();
            b.generator.setFrequency(1e3);
            b.generator.setAmplitude(3);
            b.generator.outputOn();
            b.digitizer.prepare();
        }
        double[] r1 = new double[2];
        var t1 = separate.digitizer.setTimingAndRanges(5e-6, 2023, 8, 8, r1);
        long before = separate.digitizerSession.queries();
        separate.digitizer.acquire();
        long separateTrips = separate.digitizerSession.queries() - before;
        double[] r2 = new double[2];
        before = together.digitizerSession.queries();
        var t2 = together.digitizer.setTimingAndRangesThenAcquire(5e-6, 2023, 8, 8, r2);
        assertThat(together.digitizerSession.queries() - before).as("one round trip").isEqualTo(1);
        assertThat(separateTrips).as("the acquisition alone").isEqualTo(1);
        assertThat(t2).isEqualTo(t1);
        assertThat(r2).containsExactly(r1);
        for (int ch = 1; ch <= 2; ch++) {
            assertThat(together.digitizer.fetch(ch).volts()).containsExactly(separate.digitizer.fetch(ch).volts());
        }
    }
}
