package org.lrbench.plan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.judge.Characteristic;
import org.lrbench.yaml.Problem;
import org.lrbench.yaml.ProblemsException;

class PlanLoaderTests {
    static final String GOOD = """
            plan_format: 1
            part_number: P-1
            fixture:
              sense_resistor: 100 ohm
            sine_sweep:
              amplitude: 3 V
              log_sweep: {start: 100 Hz, stop: 10 kHz, points: 3}
              cycles: 10
              settle: 20 ms
            limits:
              - characteristic: inductance
                nominal: 1 mH
                tolerance: 10 %
              - characteristic: quality_factor
                at: 1 kHz
                min: 5
            """;

    static List<Problem> problems(String text) {
        ProblemsException e = catchThrowableOfType(ProblemsException.class,
                () -> PlanLoader.parse(text, "p.yaml", 5.0));
        assertThat(e).as("expected problems").isNotNull();
        return e.problems();
    }

    @Test
    void loadsAGoodPlan() throws Exception {
        Plan p = PlanLoader.parse(GOOD, "p.yaml", 5.0);
        assertThat(p.sweep().frequenciesHz()).hasSize(3);
        assertThat(p.sweep().frequenciesHz().get(1)).isCloseTo(1000, within(1e-9));
        assertThat(p.sweep().samplesPerCycle()).isEqualTo(100);
        assertThat(p.limits().get(0).lower()).isCloseTo(0.9e-3, within(1e-15));
        assertThat(p.limits().get(1).characteristic()).isEqualTo(Characteristic.QUALITY_FACTOR);
    }

    @Test
    void theShippedPlansLoad() throws Exception {
        Path plans = TestBench.home().resolve("plans");
        try (var files = Files.list(plans)) {
            for (Path f : files.filter(x -> x.toString().endsWith(".yaml")).toList()) {
                assertThat(PlanLoader.load(f, 5.0).limits()).isNotEmpty();
            }
        }
    }

    @Test
    void unknownKeyIsReportedWithItsPosition() {
        List<Problem> ps = problems(GOOD.replace("  cycles: 10", "  cycels: 10"));
        assertThat(ps).extracting(Problem::toString).contains(
                "p.yaml:8:3: sine_sweep.cycels: unknown key; allowed here: amplitude, offset, frequencies,"
                        + " log_sweep, cycles, samples_per_cycle, settle, settle_rule, model_terms, distortion_limit, excitation, multisine_tolerance");
        // and the key it should have been is then missing, reported at its mapping
        assertThat(ps).extracting(Problem::toString).contains("p.yaml:6:3: sine_sweep.cycles: missing required key");
    }

    @Test
    void missingKeyIsReported() {
        List<Problem> ps = problems(GOOD.replace("part_number: P-1\n", ""));
        assertThat(ps).extracting(Problem::key).containsExactly("part_number");
        assertThat(ps.get(0).message()).isEqualTo("missing required key");
    }

    @Test
    void wrongUnitIsReported() {
        List<Problem> ps = problems(GOOD.replace("sense_resistor: 100 ohm", "sense_resistor: 100 mH"));
        assertThat(ps).hasSize(1);
        assertThat(ps.get(0).toString()).isEqualTo(
                "p.yaml:4:19: fixture.sense_resistor: '100 mH' is inductance (H); expected resistance (ohm)");
    }

    @Test
    void negativeFrequencyIsReported() {
        List<Problem> ps = problems(GOOD.replace("log_sweep: {start: 100 Hz, stop: 10 kHz, points: 3}",
                "frequencies: [1 kHz, -2 kHz]"));
        assertThat(ps).extracting(Problem::toString).containsExactly(
                "p.yaml:7:24: sine_sweep.frequencies[1]: frequency must be greater than 0 Hz, got -2.000 kHz");
    }

    @Test
    void amplitudeOverTheBenchLimitIsRefusedBeforeAnythingRuns() {
        List<Problem> ps = problems(GOOD.replace("amplitude: 3 V", "amplitude: 12 V"));
        assertThat(ps).hasSize(1);
        assertThat(ps.get(0).toString()).isEqualTo("p.yaml:6:14: sine_sweep.amplitude: 12.00 V peak exceeds the"
                + " bench's maximum generator amplitude of 5.000 V (bench max_amplitude)");
    }

    @Test
    void malformedYamlIsReportedWithItsPosition() {
        List<Problem> ps = problems(GOOD.replace("  cycles: 10", "  cycles: [10"));
        assertThat(ps).hasSize(1);
        assertThat(ps.get(0).key()).isEqualTo("(yaml)");
        assertThat(ps.get(0).message()).startsWith("malformed YAML");
        assertThat(ps.get(0).line()).isGreaterThanOrEqualTo(9);
    }

    @Test
    void limitFormsAreCheckedAndEveryProblemIsReportedAtOnce() {
        List<Problem> ps = problems(GOOD
                .replace("    tolerance: 10 %", "    tolerance: 10 Hz")
                .replace("    at: 1 kHz\n", "")
                .replace("plan_format: 1", "plan_format: 2"));
        assertThat(ps).extracting(Problem::key).containsExactly("plan_format", "limits[0].tolerance", "limits[1].at");
        assertThat(ps.get(1).message()).contains("expected a percentage or inductance (H)");
        assertThat(ps.get(2).message()).contains("depends on frequency");
    }

    @Test
    void duplicateKeysAndBothSweepFormsAreRefused() {
        List<Problem> ps = problems(GOOD.replace("  cycles: 10", "  cycles: 10\n  frequencies: [1 kHz]"));
        assertThat(ps).extracting(Problem::message).contains("give either frequencies or log_sweep, not both");
        List<Problem> dup = problems(GOOD.replace("part_number: P-1", "part_number: P-1\npart_number: P-2"));
        assertThat(dup).extracting(Problem::toString).containsExactly("p.yaml:3:1: part_number: duplicate key");
    }

    /** Plans that cannot work or make no sense, each refused with its own positioned problem. */
    @Test
    void plansThatCannotWorkAreRefusedEachWithItsOwnProblem() {
        String dc = GOOD + "dc_resistance:\n  wiring: four_wire\n  temperature: TEMP\n";
        Map<String, String> cases = new LinkedHashMap<>();
        // temperatures in degrees Celsius only, never read past: F is farad, K no unit here, a bare number
        // has no unit, and a prefix makes 23 mC a millidegree
        cases.put(dc.replace("TEMP", "73 F"), "dc_resistance.temperature");
        cases.put(dc.replace("TEMP", "296 K"), "dc_resistance.temperature");
        cases.put(dc.replace("TEMP", "23"), "dc_resistance.temperature");
        cases.put(dc.replace("TEMP", "23 mC"), "dc_resistance.temperature");
        // below absolute zero, -273.15 C (SI Brochure, from memory)
        cases.put(dc.replace("TEMP", "-300 C"), "dc_resistance.temperature");
        cases.put(dc.replace("TEMP", "23 C").replace("  wiring: four_wire", "  wirring: four_wire"), "dc_resistance.wirring");
        cases.put(GOOD.replace("tolerance: 10 %", "tolerance: 150 %"), "limits[0].tolerance");
        cases.put(GOOD.replace("nominal: 1 mH", "nominal: -1 mH"), "limits[0].nominal");
        cases.put(GOOD.replace("min: 5", "min: -20"), "limits[1].min");
        cases.put(GOOD.replace("tolerance: 10 %", "tolerance: 10 %\n    decision: guarded\n    guard_band: 0.2 mH"),
                "limits[0].guard_band");
        cases.put(GOOD.replace("settle: 20 ms", "settle: 1e6 s"), "sine_sweep.settle");
        cases.put(GOOD.replace("sense_resistor: 100 ohm", "sense_resistor: 1e-30 ohm"), "fixture.sense_resistor");
        cases.put(GOOD.replace("settle: 20 ms", "settle: 20 ms\n  distortion_limit: 200 %"), "sine_sweep.distortion_limit");
        for (var e : cases.entrySet()) {
            List<Problem> found = problems(e.getKey());
            assertThat(found).as(e.getValue()).anySatisfy(p -> {
                assertThat(p.key()).isEqualTo(e.getValue());
                assertThat(p.line()).isPositive();
            });
        }
    }

    @Test
    void anOversizedFileIsRefusedBeforeItIsRead(@TempDir Path dir) throws Exception {
        Path big = dir.resolve("big.yaml");
        Files.writeString(big, GOOD.replace("part_number: P-1", "part_number: P-1\ndescription: "
                + "x".repeat(2 * 1024 * 1024)));
        ProblemsException e = catchThrowableOfType(ProblemsException.class, () -> PlanLoader.load(big, 5.0));
        assertThat(e.problems().get(0).message()).contains("at most 1048576 bytes");
    }

    @Test
    void aPlanNotInUtf8IsRefusedNamingItsLikelyEncodingAndTheFix(@TempDir Path dir) throws Exception {
        // UTF-16 with a byte order mark, UTF-32, and a Latin-1 byte (0xE9, e acute) that is no UTF-8 sequence
        // (RFC 3629 for UTF-8's byte patterns, from memory)
        Path u16 = dir.resolve("u16.yaml");
        Files.write(u16, GOOD.getBytes(java.nio.charset.StandardCharsets.UTF_16));
        Path u32 = dir.resolve("u32.yaml");
        Files.write(u32, GOOD.getBytes(java.nio.charset.Charset.forName("UTF-32")));
        Path latin = dir.resolve("latin.yaml");
        Files.write(latin, GOOD.replace("part_number: P-1", "part_number: P-1\ndescription: caf\u00e9")
                .getBytes(java.nio.charset.StandardCharsets.ISO_8859_1));
        assertThat(catchThrowableOfType(ProblemsException.class, () -> PlanLoader.load(u16, 5.0)).problems().get(0)
                .message()).contains("UTF-16").contains("save it as UTF-8");
        assertThat(catchThrowableOfType(ProblemsException.class, () -> PlanLoader.load(u32, 5.0)).problems().get(0)
                .message()).contains("UTF-32").contains("save it as UTF-8");
        String m = catchThrowableOfType(ProblemsException.class, () -> PlanLoader.load(latin, 5.0)).problems().get(0)
                .message();
        assertThat(m).contains("byte 0xE9").contains("line 3").contains("Latin-1").contains("save it as UTF-8");
        // a UTF-8 file with a byte order mark is UTF-8
        Path bom = dir.resolve("bom.yaml");
        Files.write(bom, ("\uFEFF" + GOOD).getBytes(java.nio.charset.StandardCharsets.UTF_8));
        assertThat(PlanLoader.load(bom, 5.0).partNumber()).isEqualTo("P-1");
    }

    @Test
    void aControlCharacterInAQuantityIsRefusedNotIgnored() {
        // YAML's double-quoted escape \u0000 (YAML 1.1, 5.7) puts a NUL inside the quantity
        String nul = GOOD.replace("amplitude: 3 V", "amplitude: \"3 V\\u0000\"");
        assertThat(nul).contains("\\u0000");
        ProblemsException e = catchThrowableOfType(ProblemsException.class, () -> PlanLoader.parse(nul, "nul.yaml", 5.0));
        assertThat(e).isNotNull();
        assertThat(e.problems().get(0).key()).endsWith("amplitude");
        assertThat(e.problems().get(0).message()).contains("U+0000");
    }

    @Test
    void aPartNumberThatCouldHarmAFileNameOrATerminalIsRefused() {
        // part numbers reach file names, reports and the store: control characters, path separators, ".."
        // and very long ones are refused at their position, the text echoed without its control characters
        for (String bad : new String[] {"\"QFD\\nIND\\u0007\"", "\"A/B\"", "\"A\\\\B\"", "\"..x\"",
            "\"" + "P".repeat(100_000) + "\""}) {
            ProblemsException e = catchThrowableOfType(ProblemsException.class, () -> PlanLoader.parse(
                    GOOD.replace("part_number: P-1", "part_number: " + bad), "pn.yaml", 5.0));
            assertThat(e).as(bad.substring(0, Math.min(20, bad.length()))).isNotNull();
            Problem p = e.problems().get(0);
            assertThat(p.key()).isEqualTo("part_number");
            assertThat(p.line()).isEqualTo(2);
            assertThat(p.message()).doesNotContain("\n").doesNotContain("\u0007").hasSizeLessThan(300);
        }
        ProblemsException d = catchThrowableOfType(ProblemsException.class, () -> PlanLoader.parse(
                GOOD.replace("part_number: P-1", "part_number: P-1\ndescription: \"two\\nlines\""), "d.yaml", 5.0));
        assertThat(d.problems().get(0).key()).isEqualTo("description");
    }

    @Test
    void questionablePlansGetWarnings() throws Exception {
        Plan p = PlanLoader.parse(GOOD.replace("tolerance: 10 %", "tolerance: 60 %").replace("settle: 20 ms", "settle: 30 s"),
                "p.yaml", 5.0);
        assertThat(PlanAdvice.warnings(p)).hasSize(2);
        assertThat(PlanAdvice.warnings(PlanLoader.parse(GOOD, "p.yaml", 5.0))).isEmpty();
    }
}
