package org.lrbench.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The level is proven before it is used: on the simulated bench's personalities, a driver slip that
 * a factor common to both channels would hide (L and R come out right) is refused before the part
 * is driven at the plan's level, output off, exit 3, naming the likely key. Each case is a copy of a
 * shipped driver with one slip a person writing it from a manual could make.
 */
class LevelCheckTests {
    private static final Path HOME = CommandLineTests.HOME;
    private static final String PART = HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString();

    /** The shipped drivers in a folder of their own, with {@code file}'s text replaced as given. */
    private static Path drivers(Path dir, String file, String from, String to) throws IOException {
        Path out = Files.createDirectories(dir.resolve("drivers"));
        try (Stream<Path> files = Files.list(HOME.resolve("drivers"))) {
            for (Path f : files.toList()) {
                Files.copy(f, out.resolve(f.getFileName()));
            }
        }
        if (file != null) {
            String text = Files.readString(out.resolve(file));
            assertThat(text).as(file).contains(from);
            Files.writeString(out.resolve(file), text.replace(from, to));
        }
        return out;
    }

    private static CommandLineTests.Outcome run(Path dir, Path drivers, String bench) {
        return CommandLineTests.run("run", CommandLineTests.PLAN, "--lot", "L", "--serial", "S", "--sim", PART,
                "--bench", HOME.resolve(bench).toString(), "--drivers", drivers.toString(), "--runs",
                dir.resolve("runs").toString(), "--calibration", dir.resolve("cal").toString(), "--io-log",
                dir.resolve("io.log").toString());
    }

    @Test
    void everyShippedPersonalityProvesItsLevel(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, null, null, null);
        for (String bench : List.of("simulator/bench.yaml", "simulator/bench-pm12.yaml", "simulator/bench-div8.yaml")) {
            CommandLineTests.Outcome o = run(dir.resolve(bench.replace('/', '-')), d, bench);
            assertThat(o.code()).as(bench + ": " + o.err()).isZero();
        }
    }

    @Test
    void vppSentWhereTheInstrumentTakesPeakEmfIsRefusedBeforeThePlansLevel(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, "sim-source-peak.yaml", "{amplitude_vpk}", "{amplitude_vpp}");
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-pm12.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("level check").contains("2.00 times the EMF asked for")
                .contains("{amplitude_vpp} or {amplitude_vpk}").contains("output is off");
        assertThat(dir.resolve("runs/L/S.json")).doesNotExist();
        // the plan asks 3 V peak: the probe asked 0.3 V, sent as 0.6 (its Vpp), and nothing higher was ever
        // sent; the plan's level never reached the generator (the I/O log proves it)
        List<Double> peaks = values(dir.resolve("io.log"), ":WAVe:PEAK ([-0-9.E+]+)");
        assertThat(peaks).isNotEmpty().allSatisfy(v -> assertThat(v).isLessThanOrEqualTo(0.6 + 1e-9));
        assertThat(String.join("\n", Files.readAllLines(dir.resolve("io.log")))).contains(":OUTPut OFF");
    }

    @Test
    void calibrateProvesTheLevelBeforeItsFirstSweep(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, "sim-source-peak.yaml", "{amplitude_vpk}", "{amplitude_vpp}");
        CommandLineTests.Outcome o = CommandLineTests.run("calibrate", CommandLineTests.PLAN, "--sim", PART, "--bench",
                HOME.resolve("simulator/bench-pm12.yaml").toString(), "--drivers", d.toString(), "--calibration",
                dir.resolve("cal").toString(), "--io-log", dir.resolve("io.log").toString());
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("2.00 times the EMF asked for");
        assertThat(dir.resolve("cal")).doesNotExist();
        assertThat(values(dir.resolve("io.log"), ":WAVe:PEAK ([-0-9.E+]+)")).allSatisfy(v ->
                assertThat(v).isLessThanOrEqualTo(0.6 + 1e-9));
    }

    @Test
    void aDigitizerScaleOffByTwoIsRefused(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, "sim-pm12-digitizer.yaml", "full_scale_codes: 4096", "full_scale_codes: 2048");
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-pm12.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("level check").contains("a factor of 2").contains("scaling");
    }

    @Test
    void aRangeConventionDeclaredWrongIsRefused(@TempDir Path dir) throws Exception {
        // plus-minus ranges declared as peak-to-peak: every code is read at half its volts
        Path d = drivers(dir, "sim-pm12-digitizer.yaml", "setting: plus_minus", "setting: peak_to_peak");
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-pm12.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("level check").contains("vertical.setting");
    }

    @Test
    void fieldPositionsCountedFromZeroReadNearlyNothingAndAreRefused(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, "sim-div8-digitizer.yaml", "    y_increment: 4", "    y_increment: 3");
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-div8.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        // the third field is the time of the first sample, not a volts-per-code step: traces near zero
        assertThat(o.err()).contains("level check").contains("field positions count from 1");
    }

    @Test
    void theWrongByteOrderIsRefusedNamingTheTraceFormat(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, "sim-pm12-digitizer.yaml", "trace_format: int16-big", "trace_format: int16-little");
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-pm12.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("level check").contains("trace_format");
    }

    @Test
    void levelsDeclaredOpenCircuitOnAGeneratorThatRefersThemToALoadAreRefused(@TempDir Path dir) throws Exception {
        // the instrument takes its settings as the voltage across 50 ohm: an EMF twice the setting
        Path d = drivers(dir, "sim-source-matched.yaml", "  referred_to: load", "  referred_to: open_circuit");
        String text = Files.readString(d.resolve("sim-source-matched.yaml"));
        Files.writeString(d.resolve("sim-source-matched.yaml"), text.replaceAll("(?m)^  (load|output_impedance): .*\\n", ""));
        CommandLineTests.Outcome o = run(dir, d, "simulator/bench-div8.yaml");
        assertThat(o.code()).as(o.err()).isEqualTo(3);
        assertThat(o.err()).contains("2.00 times the EMF asked for").contains("levels.referred_to");
    }

    private static CommandLineTests.Outcome exercise(Path drivers, String bench, String... more) {
        List<String> args = new java.util.ArrayList<>(List.of("exercise", "--sim", PART, "--bench",
                HOME.resolve(bench).toString(), "--drivers", drivers.toString()));
        args.addAll(List.of(more));
        return CommandLineTests.run(args.toArray(String[]::new));
    }

    @Test
    void exerciseJudgesASignalAndPassesSoundDrivers(@TempDir Path dir) throws Exception {
        Path d = drivers(dir, null, null, null);
        for (String bench : List.of("simulator/bench.yaml", "simulator/bench-pm12.yaml", "simulator/bench-div8.yaml")) {
            CommandLineTests.Outcome open = exercise(d, bench);
            assertThat(open.code()).as(bench + open.out()).isZero();
            assertThat(open.out()).contains("ok     signal");
            CommandLineTests.Outcome withPart = exercise(d, bench, "--plan", CommandLineTests.PLAN);
            assertThat(withPart.code()).as(bench + withPart.out()).isZero();
        }
    }

    @Test
    void exerciseFailsDriversThatReadNothingOrGarbageWithTheKeyToCheck(@TempDir Path dir) throws Exception {
        // every operation on its own still answers; only a signal shows the traces are wrong
        Path zero = drivers(dir.resolve("zero"), "sim-div8-digitizer.yaml", "    y_increment: 4", "    y_increment: 3");
        CommandLineTests.Outcome z = exercise(zero, "simulator/bench-div8.yaml");
        assertThat(z.code()).isEqualTo(3);
        assertThat(z.out()).contains("FAILED signal").contains("field positions count from 1");
        Path order = drivers(dir.resolve("order"), "sim-pm12-digitizer.yaml", "trace_format: int16-big",
                "trace_format: int16-little");
        CommandLineTests.Outcome o = exercise(order, "simulator/bench-pm12.yaml");
        assertThat(o.code()).isEqualTo(3);
        assertThat(o.out()).contains("FAILED signal").contains("trace_format");
    }

    private static List<Double> values(Path log, String regex) throws IOException {
        Matcher m = Pattern.compile(regex).matcher(Files.readString(log));
        List<Double> out = new java.util.ArrayList<>();
        while (m.find()) {
            out.add(Double.parseDouble(m.group(1)));
        }
        return out;
    }
}
