package org.lrbench.transport;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchLoader;
import org.lrbench.transport.serial.SerialSettings;
import org.lrbench.yaml.ProblemsException;

class AddressTests {

    @Test
    void readsEveryScheme() {
        Address tcp = Address.parse("tcp://192.0.2.7:5025");
        assertThat(tcp.host()).isEqualTo("192.0.2.7");
        assertThat(tcp.port()).isEqualTo(5025);
        // 5025 is the conventional raw SCPI socket port (common practice, no source)
        assertThat(Address.parse("tcp://scope.lab").port()).isEqualTo(5025);
        assertThat(Address.parse("tcp://[::1]:6000").host()).isEqualTo("::1");
        SerialSettings s = SerialSettings.of(Address.parse("serial:///dev/ttyUSB0?baud=115200&parity=even&stop=2&term=crlf"));
        assertThat(s.device()).isEqualTo("/dev/ttyUSB0");
        assertThat(s.baud()).isEqualTo(115200);
        assertThat(s.parity()).isEqualTo("even");
        assertThat(s.stopBits()).isEqualTo(2);
        assertThat(s.dataBits()).isEqualTo(8);
        assertThat(Address.parse("serial:///dev/ttyS0?term=crlf").terminator()).isEqualTo("\r\n");
        assertThat(Address.parse("usbtmc:///dev/usbtmc0").target()).isEqualTo("/dev/usbtmc0");
        assertThat(Address.parse("sim://digitizer").target()).isEqualTo("digitizer");
    }

    @Test
    void errorsNameThePartThatIsWrong() {
        assertThatThrownBy(() -> Address.parse("gpib://7")).hasMessageContaining("unknown scheme 'gpib'");
        assertThatThrownBy(() -> Address.parse("192.0.2.7:5025")).hasMessageContaining("has no scheme");
        assertThatThrownBy(() -> Address.parse("tcp://host:99999").port()).hasMessageContaining("port '99999'");
        assertThatThrownBy(() -> Transports.check(Address.parse("serial://ttyUSB0"))).hasMessageContaining("absolute path");
        assertThatThrownBy(() -> Transports.check(Address.parse("tcp://host:99999"))).hasMessageContaining("port '99999'");
        assertThatThrownBy(() -> Transports.check(Address.parse("serial:///dev/ttyUSB0?baud=abc")))
                .hasMessageContaining("baud=abc");
        assertThatThrownBy(() -> SerialSettings.of(Address.parse("serial:///dev/ttyUSB0?baud=fast")))
                .hasMessageContaining("baud=fast");
        assertThatThrownBy(() -> SerialSettings.of(Address.parse("serial:///dev/ttyUSB0?speed=9600")))
                .hasMessageContaining("unknown option 'speed'").hasMessageContaining("allowed: baud");
        assertThatThrownBy(() -> Address.parse("tcp://h?term")).hasMessageContaining("option 'term' is not key=value");
        assertThatThrownBy(() -> Address.parse("sim://g?term=nul").terminator()).hasMessageContaining("term=nul");
        Address.parse("tcp://h").requireOptions(Set.of()); // no options: nothing to refuse
    }

    @Test
    void linksAreFoundThroughTheirProvidersAndThisPackageKnowsNoImplementation() throws Exception {
        assertThat(Transports.schemes()).containsExactly("serial", "sim", "tcp", "usbtmc");
        Path dir = TestBench.home().resolve("src/main/java/org/lrbench/transport");
        try (var files = Files.list(dir)) {
            for (Path f : files.filter(x -> x.toString().endsWith(".java")).toList()) {
                assertThat(Files.readString(f)).as(f.toString())
                        .doesNotContainPattern("org\\.lrbench\\.transport\\.(tcp|serial|usbtmc|inproc)");
            }
        }
    }

    @Test
    void aMalformedAddressInABenchFileIsAPositionedProblem(@TempDir Path dir)
            throws Exception {
        Path bench = dir.resolve("bench.yaml");
        String text = Files.readString(TestBench.home().resolve("simulator/bench.yaml"));
        Files.writeString(bench, text.replaceFirst("address: sim://digitizer", "address: tcp://127.0.0.1:99999"));
        assertThatThrownBy(() -> BenchLoader.load(bench))
                .isInstanceOf(ProblemsException.class)
                .hasMessageContaining("address: instrument address 'tcp://127.0.0.1:99999': port '99999' is not 1 to 65535");
    }
}
