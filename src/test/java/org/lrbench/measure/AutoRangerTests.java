package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

class AutoRangerTests {

    TestBench bench(long seed) throws Exception {
        TestBench b = new TestBench(SimSettings.defaults().withSeed(seed), 100, new PartModel(1e-3, 2.3, 0),
                TestBench.genericDigitizer());
        b.generator.prepare();
        b.digitizer.prepare();
        b.generator.setWaveform(Waveform.SINE);
        b.generator.setFrequency(1000);
        b.generator.setAmplitude(3.0);
        b.digitizer.setTiming(1e-5, 1000);
        b.digitizer.setTrigger(TriggerSource.CHANNEL1, 0, true);
        b.generator.outputOn();
        return b;
    }

    @Test
    void startingFarTooSensitiveItClipsThenSettlesInsideTheWindow() throws Exception {
        TestBench b = bench(3);
        AutoRanger ranger = new AutoRanger(b.digitizer, 0.01, 0.01);
        AutoRanger.Capture c = ranger.acquire();
        assertThat(c.acquisitions()).isGreaterThan(1);
        for (var t : new org.lrbench.instrument.Trace[] {c.sense(), c.part()}) {
            assertThat(t.clippedSamples()).isZero();
            assertThat(t.peakToPeak() / t.rangeVolt()).isBetween(AutoRanger.LOW_FILL, AutoRanger.HIGH_FILL);
        }
    }

    @Test
    void startingFarTooCoarseItNarrowsDown() throws Exception {
        TestBench b = bench(4);
        AutoRanger.Capture c = new AutoRanger(b.digitizer, 100, 100).acquire();
        assertThat(c.part().peakToPeak() / c.part().rangeVolt()).isBetween(AutoRanger.LOW_FILL, AutoRanger.HIGH_FILL);
        assertThat(c.acquisitions()).isLessThanOrEqualTo(AutoRanger.MAX_ACQUISITIONS);
    }

    @Test
    void theSameSeedGivesTheSameTracesAndAnotherSeedOthers() throws Exception {
        double[] a = new AutoRanger(bench(9).digitizer, 1, 1).acquire().part().volts();
        double[] again = new AutoRanger(bench(9).digitizer, 1, 1).acquire().part().volts();
        double[] other = new AutoRanger(bench(10).digitizer, 1, 1).acquire().part().volts();
        assertThat(again).containsExactly(a);
        assertThat(other).isNotEqualTo(a);
    }
}
