package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.scpi.TraceEncoding;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transports;
import org.lrbench.yaml.Problem;
import org.lrbench.yaml.ProblemsException;

/**
 * Driver files written from a manual: unsigned codes, instruments without an input offset or a
 * trigger setting, and the mistakes `check` must catch where they are made (a per-channel command
 * without {channel}, inverted or impossible clip codes, addresses no transport can reach, a driver
 * that is not there).
 */
class ManualDialectTests {

    private static String generic() throws Exception {
        return Files.readString(TestBench.home().resolve("drivers/generic-digitizer.yaml"));
    }

    private static ProblemsException refused(Path dir, String text) throws Exception {
        Files.writeString(dir.resolve("d.yaml"), text);
        return catchThrowableOfType(ProblemsException.class, () -> new DriverLoader(dir).load("d", DriverKind.DIGITIZER));
    }

    @Test
    void unsignedCodesDecodeInEitherByteOrder() {
        // unsigned binary: 0xFFFE is 65534, not -2 (two's complement would make it negative); a 10-bit
        // converter's mid code 512 is 0x0200 big-endian (common practice, no source)
        assertThat(TraceEncoding.byKey("uint16-big").decode(new byte[] {(byte) 0xFF, (byte) 0xFE, 0x02, 0x00}))
                .containsExactly(65534, 512);
        assertThat(TraceEncoding.byKey("uint16-little").decode(new byte[] {(byte) 0xFE, (byte) 0xFF, 0x00, 0x02}))
                .containsExactly(65534, 512);
        assertThat(TraceEncoding.byKey("uint8").decode(new byte[] {(byte) 0x80, (byte) 0xFF, 0}))
                .containsExactly(128, 255, 0);
        assertThat(TraceEncoding.UINT8.minCode()).isZero();
        assertThat(TraceEncoding.UINT16_BIG.maxCode()).isEqualTo(65535);
    }

    @Test
    void aPerChannelCommandWithoutChannelIsRefusedAtItsLine(@TempDir Path dir) throws Exception {
        String text = generic().replace(":SENSe{channel}:VOLTage:RANGe {range}", ":SENSe1:VOLTage:RANGe {range}");
        ProblemsException e = refused(dir, text);
        Problem p = e.problems().get(0);
        assertThat(p.key()).isEqualTo("commands.range");
        assertThat(p.message()).contains("has no {channel}");
        assertThat(p.line()).isEqualTo(text.lines().toList().indexOf(text.lines()
                .filter(l -> l.contains(":SENSe1:VOLTage:RANGe")).findFirst().orElseThrow()) + 1);
    }

    @Test
    void aScaleQueryWithoutChannelIsRefused(@TempDir Path dir) throws Exception {
        String text = Files.readString(TestBench.home().resolve("drivers/sim-div8-timebase-digitizer.yaml"));
        if (!text.contains("queries:")) {
            return;
        }
        String broken = text.replaceFirst("(y_increment: \"[^\"]*)\\{channel\\}", "$11");
        assertThat(broken).isNotEqualTo(text);
        ProblemsException e = refused(dir, broken);
        assertThat(e.problems()).anySatisfy(p -> {
            assertThat(p.key()).endsWith("y_increment");
            assertThat(p.message()).contains("would read the same channel's for both");
        });
    }

    @Test
    void clipCodesMustBeLowestThenHighestWithinTheFormat(@TempDir Path dir) throws Exception {
        String withClip = generic().replace("scaling:", "scaling:\n  clip_codes: [100, -100]");
        if (!generic().contains("scaling:")) {
            withClip = generic() + "scaling:\n  source: scale_query\n  clip_codes: [100, -100]\n";
        }
        assertThat(refused(dir, withClip).problems()).anySatisfy(p -> {
            assertThat(p.key()).endsWith("clip_codes");
            assertThat(p.message()).contains("the first code must be below the second");
        });
        String outside = withClip.replace("[100, -100]", "[-128, 300]");
        assertThat(refused(dir, outside).problems()).anySatisfy(p ->
                assertThat(p.message()).contains("outside what int8 can carry"));
    }

    @Test
    void offsetAndTriggerMayBeLeftOutAndTheInstrumentRunsFree(@TempDir Path dir) throws Exception {
        String text = generic().replaceAll("(?m)^  offset: .*\\n", "").replaceAll("(?m)^  trigger: .*\\n", "")
                .replaceAll("(?ms)^trigger_sources:.*?(?=^slopes:)", "").replaceAll("(?ms)^slopes:\\n(  .*\\n)*", "");
        Files.writeString(dir.resolve("d.yaml"), text);
        DriverFile d = new DriverLoader(dir).load("d", DriverKind.DIGITIZER);
        assertThat(d.has("offset")).isFalse();
        assertThat(d.has("trigger")).isFalse();
        // a trigger command without {slope} needs no slopes, and slopes given then are refused as unused
        String noSlope = generic().replace(";LEVel {level};SLOPe {slope}", ";LEVel {level}");
        assertThat(refused(dir, noSlope).problems()).anySatisfy(p -> {
            assertThat(p.key()).isEqualTo("slopes");
            assertThat(p.message()).contains("not used");
        });
    }

    @Test
    void addressesNoTransportCanReachAreRefusedBeforeAnyRun() {
        for (String bad : new String[] {"tcp://[::1", "tcp://[::1]x", "tcp://::1", "tcp://bad host", "tcp://h:0",
            "tcp://h:99999", "tcp://", "sim://nothing", "serial://ttyUSB0", "usbtmc://usbtmc0", "gpib://1"}) {
            assertThatThrownBy(() -> Transports.check(Address.parse(bad))).as(bad).isInstanceOf(AddressException.class);
        }
        for (String good : new String[] {"tcp://[::1]", "tcp://[::1]:5025", "tcp://127.0.0.1:5025", "tcp://scope-3.lab",
            "sim://generator", "serial:///dev/ttyUSB0?baud=115200", "usbtmc:///dev/usbtmc0"}) {
            Transports.check(Address.parse(good));
        }
    }

    @Test
    void aMissingDriverIsReportedAtTheBenchFilesDriverLine(@TempDir Path dir) throws Exception {
        String text = Files.readString(TestBench.home().resolve("simulator/bench.yaml"))
                .replace("driver: generic-digitizer", "driver: no-such-digitizer");
        Path bench = dir.resolve("bench.yaml");
        Files.writeString(bench, text);
        BenchConfig b = BenchLoader.load(bench);
        ProblemsException e = catchThrowableOfType(ProblemsException.class, () -> new DriverLoader(
                TestBench.home().resolve("drivers")).load(b.digitizer().driver(), DriverKind.DIGITIZER, b.digitizer().driverAt()));
        Problem p = e.problems().get(0);
        assertThat(p.file()).isEqualTo(bench.toString());
        assertThat(p.line()).isEqualTo(text.lines().toList().indexOf(text.lines()
                .filter(l -> l.contains("no-such-digitizer")).findFirst().orElseThrow()) + 1);
        assertThat(p.message()).contains("no driver file no-such-digitizer.yaml").contains("generic-digitizer");
    }
}
