package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchLoader;
import org.lrbench.yaml.ProblemsException;

class SimTimingTests {

    /** 115200 baud with 8N1 framing carries 10 bits per byte: 11520 bytes/s (common practice, no source). */
    @Test
    void aSerialLinkCarriesItsBaudRateOverTenBitsPerByte() {
        assertThat(SimTiming.SERIAL.transfer(11520)).isCloseTo(1.0, within(1e-12));
        assertThat(SimTiming.NONE.transfer(1_000_000)).isZero();
        assertThat(SimTiming.NONE.none()).isTrue();
    }

    @Test
    void theBenchFileNamesAProfileOrIsToldWhichExist() throws Exception {
        String bench = Files.readString(TestBench.home().resolve("simulator/bench.yaml"));
        String usb = bench.replace("  seed: 20261201", "  seed: 20261201\n  timing: usb");
        assertThat(BenchLoader.parse(usb, "usb.yaml").simulation().timing()).isEqualTo(SimTiming.USB);
        assertThat(BenchLoader.parse(bench, "bench.yaml").simulation().timing()).isEqualTo(SimTiming.NONE);
        String wifi = bench.replace("  seed: 20261201", "  seed: 20261201\n  timing: wifi");
        assertThatThrownBy(() -> BenchLoader.parse(wifi, "wifi.yaml")).isInstanceOf(ProblemsException.class)
                .hasMessageContaining("wifi.yaml:").hasMessageContaining("timing")
                .hasMessageContaining("allowed: lan, none, serial, usb");
    }

    @Test
    void theSimulatorsTimeIsHiddenInsideTheTimeItStandsFor() {
        // a 60 ms acquisition whose record takes 40 ms to compute lasts 60 ms, not 100 (common practice,
        // no source); the margin is wide for a busy machine
        long t0 = System.nanoTime();
        long busy = t0 + 40_000_000L;
        while (System.nanoTime() < busy) {
            Thread.onSpinWait();
        }
        SimTiming.passSince(t0, 0.060);
        double ms = (System.nanoTime() - t0) / 1e6;
        assertThat(ms).isGreaterThanOrEqualTo(60).isLessThan(95);
    }

    @Test
    void theTurnedPhasorsGiveTheDirectSumOfTheLines() {
        // the recurrence against sin/cos at every sample (trigonometric identities, no source needed)
        var lines = List.of(new Harmonic(1, new Complex(1.3, -0.4)),
                new Harmonic(3, new Complex(-0.2, 0.05)),
                new Harmonic(41, new Complex(0.01, 0.002)));
        double f = 1234.5;
        double dt = 1 / (f * 407.3);
        double[] w = SimDigitizer.waveform(lines, f, 3.7e-4, dt, 5000);
        for (int n = 0; n < w.length; n++) {
            assertThat(w[n]).isCloseTo(SimDigitizer.value(lines, f, 3.7e-4 + n * dt), within(1e-11));
        }
    }
}
