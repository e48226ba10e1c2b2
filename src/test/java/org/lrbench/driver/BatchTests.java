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
}
