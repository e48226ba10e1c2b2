package org.lrbench.traces;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.cli.Main;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimSettings;

public class TraceArchiveTests {

    public static List<PointResult> sweep() throws Exception {
        TestBench b = new TestBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0), TestBench.genericDigitizer());
        Plan plan = PlanLoader.parse("""
                plan_format: 1
                part_number: T-1
                fixture: {sense_resistor: 100 ohm}
                sine_sweep: {amplitude: 3 V, frequencies: [1 kHz, 5 kHz], cycles: 5, settle: 0 s}
                limits: [{characteristic: series_resistance, max: 10 ohm}]
                """, "t.yaml", 5.0);
        return new SweepRunner(b.generator, b.digitizer, BenchClock.NONE).run(plan, SweepListener.NONE).points();
    }

    @Test
    void theArchiveRoundTripIsBitExact(@TempDir Path dir) throws Exception {
        List<PointResult> points = sweep();
        byte[] bytes = TraceArchive.encode("L", "S", "T-1", 100, null, new ObjectMapper().createObjectNode(), points);
        Path f = dir.resolve("S.lrtraces");
        Files.write(f, bytes);
        TraceArchive.Contents c = TraceArchive.read(f);
        assertThat(c.points()).hasSize(2);
        for (int i = 0; i < 2; i++) {
            assertThat(c.points().get(i).sense()).containsExactly(points.get(i).senseTrace().volts());
            assertThat(c.points().get(i).part()).containsExactly(points.get(i).partTrace().volts());
            assertThat(c.points().get(i).intervalSecond()).isEqualTo(points.get(i).senseTrace().intervalSecond());
        }
        assertThat(c.header().get("serial").asText()).isEqualTo("S");
    }

    @Test
    void aTruncatedOrCorruptedArchiveIsAClearError(@TempDir Path dir) throws Exception {
        byte[] bytes = TraceArchive.encode("L", "S", "T-1", 100, null, new ObjectMapper().createObjectNode(), sweep());
        Path cut = dir.resolve("cut.lrtraces");
        Files.write(cut, Arrays.copyOf(bytes, bytes.length / 2));
        assertThatThrownBy(() -> TraceArchive.read(cut)).hasMessageContaining("corrupt or truncated");
        byte[] flipped = bytes.clone();
        flipped[flipped.length / 2] ^= 0x10;
        Path bad = dir.resolve("bad.lrtraces");
        Files.write(bad, flipped);
        assertThatThrownBy(() -> TraceArchive.read(bad)).hasMessageContaining("CRC-32");
        Path other = dir.resolve("other.lrtraces");
        Files.writeString(other, "hello, not an archive");
        assertThatThrownBy(() -> TraceArchive.read(other)).hasMessageContaining("not a trace archive");
    }

    @Test
    void reAnalysisReproducesTheMeasuredPointsAndAddsARecord(@TempDir Path dir) throws Exception {
        Path home = TestBench.home();
        int code = Main.execute("run", home.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "L", "--serial", "S", "--data", dir.resolve("data").toString(),
                "--sim", home.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.toString(),
                "--calibration", dir.resolve("none").toString());
        assertThat(code).isZero();
        Path original = dir.resolve("L/S.json");
        String before = Files.readString(original);
        assertThat(Main.execute("analyze", "--archive", dir.resolve("L/S.lrtraces").toString(), "--calibration",
                dir.resolve("none").toString())).isZero();
        assertThat(Files.readString(original)).isEqualTo(before);
        Path record;
        try (var files = Files.list(dir.resolve("L"))) {
            record = files.filter(f -> f.getFileName().toString().startsWith("S.analysis-")).findFirst().orElseThrow();
        }
        JsonNode points = new ObjectMapper().readTree(record.toFile()).get("points");
        JsonNode measured = new ObjectMapper().readTree(before).get("points");
        assertThat(points).hasSize(measured.size());
        for (int i = 0; i < points.size(); i++) {
            // the same traces through the same extraction give the same numbers, to the last bit
            assertThat(points.get(i).get("resistance_ohm").asDouble()).isEqualTo(measured.get(i).get("resistance_ohm").asDouble());
            assertThat(points.get(i).get("inductance_h").asDouble()).isEqualTo(measured.get(i).get("inductance_h").asDouble());
            // the current's distortion is worked out again from the trace, not recorded as a number never computed
            assertThat(points.get(i).get("current_thd").isNumber()).isTrue();
            assertThat(points.get(i).get("current_thd").asDouble()).isEqualTo(measured.get(i).get("current_thd").asDouble());
        }
        // the model re-fitted and the limits re-judged from the archive: the stored verdict stands, every value equal
        JsonNode again = new ObjectMapper().readTree(record.toFile());
        assertThat(again.get("stored_verdict").asText()).isEqualTo("pass");
        assertThat(again.get("verdict").asText()).isEqualTo("pass");
        JsonNode storedLimits = new ObjectMapper().readTree(before).get("limits");
        for (int i = 0; i < storedLimits.size(); i++) {
            assertThat(again.get("limits").get(i).get("value").asDouble())
                    .isCloseTo(storedLimits.get(i).get("value").asDouble(), Assertions.within(
                            1e-9 * Math.abs(storedLimits.get(i).get("value").asDouble())));
        }
        // a plan whose content changed since is refused: the verdict must be judged on the original
        Path edited = dir.resolve("edited.yaml");
        Files.writeString(edited, Files.readString(home.resolve("plans/qfd-ind-1m0.yaml")).replace("min: 20", "min: 21"));
        assertThat(Main.execute("analyze", "--archive", dir.resolve("L/S.lrtraces").toString(), "--plan", edited.toString(),
                "--calibration", dir.resolve("none").toString())).isEqualTo(2);
    }

    /**
     * Traces captured on a low-side fixture with 10x probes are re-analysed with that wiring (kept in
     * the archive's header): the same points as measured, to the last bit.
     */
    @Test
    void reAnalysisKeepsTheFixturesWiring(@TempDir Path dir) throws Exception {
        Path home = TestBench.home();
        String plan = Files.readString(home.resolve("plans/qfd-ind-1m0.yaml")).replaceFirst("(?m)^(\\s+)sense_resistor: (.*)$",
                "$1sense_resistor: $2\n$1wiring: low_side\n$1probes: {channel1: {kind: single_ended, attenuation: 10},"
                        + " channel2: {kind: single_ended, attenuation: 10}}");
        Path planFile = dir.resolve("low-side.yaml");
        Files.writeString(planFile, plan);
        int code = Main.execute("run", planFile.toString(), "--lot", "W", "--serial", "S", "--data", dir.resolve("data").toString(),
                "--sim", home.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.toString(),
                "--calibration", dir.resolve("none").toString());
        // measured (10x probes on a 100 ohm sense resistor see a noisier signal: the verdict may be either)
        assertThat(code).isIn(0, 1);
        String before = Files.readString(dir.resolve("W/S.json"));
        assertThat(Main.execute("analyze", "--archive", dir.resolve("W/S.lrtraces").toString(), "--calibration",
                dir.resolve("none").toString())).isZero();
        Path record;
        try (var files = Files.list(dir.resolve("W"))) {
            record = files.filter(f -> f.getFileName().toString().startsWith("S.analysis-")).findFirst().orElseThrow();
        }
        JsonNode points = new ObjectMapper().readTree(record.toFile()).get("points");
        JsonNode measured = new ObjectMapper().readTree(before).get("points");
        for (int i = 0; i < points.size(); i++) {
            assertThat(points.get(i).get("inductance_h").asDouble()).isEqualTo(measured.get(i).get("inductance_h").asDouble());
            assertThat(points.get(i).get("resistance_ohm").asDouble()).isEqualTo(measured.get(i).get("resistance_ohm").asDouble());
        }
    }

    /** A multisine sweep's archive is re-analysed with all its tones fitted together: the same points, to the last bit. */
    @Test
    void aMultisineArchiveIsFittedAgainAsOneCapture(@TempDir Path dir) throws Exception {
        Path home = TestBench.home();
        Path planFile = dir.resolve("multisine.yaml");
        Files.writeString(planFile, Files.readString(home.resolve("plans/qfd-ind-1m0.yaml"))
                .replace("  settle: 20 ms", "  settle: 20 ms\n  excitation: multisine"));
        int code = Main.execute("run", planFile.toString(), "--lot", "M", "--serial", "S", "--data", dir.resolve("data").toString(),
                "--sim", home.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.toString(),
                "--calibration", dir.resolve("none").toString());
        assertThat(code).isIn(0, 1);
        TraceArchive.Contents archive = TraceArchive.read(dir.resolve("M/S.lrtraces"));
        assertThat(archive.header().get("excitation").asText()).isEqualTo("multisine");
        // the one capture is kept once, not once per tone: the file holds its two channels' samples and the header
        int n = archive.points().get(0).sense().length + archive.points().get(0).part().length;
        int header = archive.header().toString().getBytes(java.nio.charset.StandardCharsets.UTF_8).length;
        assertThat(Files.size(dir.resolve("M/S.lrtraces"))).isLessThan(8L * n + 2L * header + 1000);
        assertThat(archive.points()).allSatisfy(p -> assertThat(p.sense()).isSameAs(archive.points().get(0).sense()));
        String before = Files.readString(dir.resolve("M/S.json"));
        assertThat(Main.execute("analyze", "--archive", dir.resolve("M/S.lrtraces").toString(), "--calibration",
                dir.resolve("none").toString())).isZero();
        Path record;
        try (var files = Files.list(dir.resolve("M"))) {
            record = files.filter(f -> f.getFileName().toString().startsWith("S.analysis-")).findFirst().orElseThrow();
        }
        JsonNode points = new ObjectMapper().readTree(record.toFile()).get("points");
        JsonNode measured = new ObjectMapper().readTree(before).get("points");
        assertThat(points.size()).isEqualTo(7);
        for (int i = 0; i < points.size(); i++) {
            assertThat(points.get(i).get("inductance_h").asDouble()).isEqualTo(measured.get(i).get("inductance_h").asDouble());
            assertThat(points.get(i).get("resistance_ohm").asDouble()).isEqualTo(measured.get(i).get("resistance_ohm").asDouble());
        }
    }

    /** An archive of format version 1 (every point's samples written out) still reads, point by point. */
    @Test
    void aVersionOneArchiveStillReads(@TempDir Path dir) throws Exception {
        List<PointResult> points = sweep();
        byte[] v2 = TraceArchive.encode("L", "S", "T-1", 100, null, new ObjectMapper().createObjectNode(), points);
        byte[] v1 = v2.clone();
        v1[4] = 0;
        v1[5] = 1;
        java.util.zip.CRC32 crc = new java.util.zip.CRC32();
        crc.update(v1, 0, v1.length - 4);
        java.nio.ByteBuffer.wrap(v1).putInt(v1.length - 4, (int) crc.getValue());
        Path f = dir.resolve("old.lrtraces");
        Files.write(f, v1);
        TraceArchive.Contents c = TraceArchive.read(f);
        assertThat(c.points()).hasSize(2);
        assertThat(c.points().get(1).part()).containsExactly(points.get(1).partTrace().volts());
        byte[] v3 = v2.clone();
        v3[5] = 3;
        crc.reset();
        crc.update(v3, 0, v3.length - 4);
        java.nio.ByteBuffer.wrap(v3).putInt(v3.length - 4, (int) crc.getValue());
        Files.write(f, v3);
        assertThatThrownBy(() -> TraceArchive.read(f)).hasMessageContaining("version");
    }
}
