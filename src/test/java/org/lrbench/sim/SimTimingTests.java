package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
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
}
