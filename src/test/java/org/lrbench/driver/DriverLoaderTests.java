package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.yaml.Problem;
import org.lrbench.yaml.ProblemsException;

class DriverLoaderTests {

    @Test
    void shippedDriversLoad() throws Exception {
        DriverLoader loader = new DriverLoader(TestBench.home().resolve("drivers"));
        assertThat(loader.load("generic-source", DriverKind.SOURCE).commands()).containsKey("output_off");
        assertThat(loader.load("generic-digitizer", DriverKind.DIGITIZER).traceEncoding()).isNotNull();
    }

    @Test
    void unknownPlaceholderAndMissingOperationAreReportedWithPositions(@TempDir Path dir) throws Exception {
        String text = Files.readString(TestBench.home().resolve("drivers/generic-source.yaml"))
                .replace("{frequency}", "{freq}")
                .replaceAll("(?m)^  output_off:.*\\n", "");
        Files.writeString(dir.resolve("bad.yaml"), text);
        ProblemsException e = catchThrowableOfType(ProblemsException.class,
                () -> new DriverLoader(dir).load("bad", DriverKind.SOURCE));
        assertThat(e.problems()).extracting(Problem::key).containsExactly("commands.output_off", "commands.frequency");
        assertThat(e.problems().get(0).message()).isEqualTo("missing required key");
        Problem freq = e.problems().get(1);
        assertThat(freq.message()).startsWith("unknown placeholder {freq}").contains("allowed here: frequency");
        assertThat(freq.line()).isEqualTo(text.lines().toList().indexOf(
                text.lines().filter(l -> l.contains("{freq}")).findFirst().orElseThrow()) + 1);
        assertThat(freq.column()).isEqualTo(14);
    }

    @Test
    void wrongKindIsRefused() {
        ProblemsException e = catchThrowableOfType(ProblemsException.class,
                () -> new DriverLoader(TestBench.home().resolve("drivers")).load("generic-source", DriverKind.DIGITIZER));
        assertThat(e.problems().get(0).message()).contains("a digitizer driver is needed");
    }

    @Test
    void valuesCannotInjectASecondCommand() {
        CommandTemplate t = CommandTemplate.parse(":SOUR:FREQ {frequency}", Set.of("frequency"));
        assertThat(t.render(Map.of("frequency", "1.0E+03"))).isEqualTo(":SOUR:FREQ 1.0E+03");
        for (String attack : new String[] {"1;*RST", "1\n*RST", "1 OUTP ON", "\"x\"", "1,2"}) {
            assertThatThrownBy(() -> t.render(Map.of("frequency", attack)))
                    .as(attack).isInstanceOf(IllegalArgumentException.class);
        }
        // six decimals as %.6f writes them
        for (double v : new double[] {0, 1, -1, 0.5, -0.0000004, 0.0000005, -0.123456789, 0.999999, 1e-7}) {
            StringBuilder b = new StringBuilder();
            ScpiGenerator.appendMicro(b, v);
            assertThat(b.toString()).as("%s", v).isEqualTo(String.format(java.util.Locale.ROOT, "%.6f", v).replace("-0.000000", "0.000000"));
        }
        // 16-bit two's complement words, full scale +/-32767 (common practice, no source): 1 is 7FFF,
        // -1 is 8001, 0.5 rounds to 4000; little-endian swaps each pair
        assertThat(ScpiGenerator.words(new double[] {1, -1, 0.5}, true))
                .containsExactly(0x7f, 0xff, 0x80, 0x01, 0x40, 0x00);
        assertThat(ScpiGenerator.words(new double[] {1, -1, 0.5}, false))
                .containsExactly(0xff, 0x7f, 0x01, 0x80, 0x00, 0x40);
        // an arbitrary waveform's {points} take a list of numbers, and nothing else
        CommandTemplate data = CommandTemplate.parse(":SOUR:TRAC:DATA {points}", Set.of("points"));
        assertThat(data.render(Map.of("points", org.lrbench.scpi.DefiniteBlock.of(new byte[] {1, 10, 59}))))
                .isEqualTo(":SOUR:TRAC:DATA #13\u0001\n;");
        assertThat(data.render(Map.of("points", "0.5,-1.000000,1E-3"))).isEqualTo(":SOUR:TRAC:DATA 0.5,-1.000000,1E-3");
        for (String attack : new String[] {"1;*RST", "1,,2", "1, 2", "1,OUTP ON", ",1", "1,"}) {
            assertThatThrownBy(() -> data.render(Map.of("points", attack)))
                    .as(attack).isInstanceOf(IllegalArgumentException.class);
        }
    }

    @Test
    void badDriverNamesNeverLeaveTheDriversFolder() {
        ProblemsException e = catchThrowableOfType(ProblemsException.class,
                () -> new DriverLoader(TestBench.home().resolve("drivers")).load("../pom", DriverKind.SOURCE));
        assertThat(e.problems().get(0).message()).contains("no driver file");
    }

    @Test
    void theShippedPersonalityDriversDeclareTheirTraits() throws Exception {
        DriverLoader loader = new DriverLoader(TestBench.home().resolve("drivers"));
        DigitizerTraits pm = loader.load("sim-pm12-digitizer", DriverKind.DIGITIZER).digitizer();
        assertThat(pm.vertical().setting()).isEqualTo(DigitizerTraits.VerticalSetting.PLUS_MINUS);
        assertThat(pm.vertical().ranges()).hasSize(13).first().isEqualTo(0.005);
        assertThat(pm.scaling().source()).isEqualTo(DigitizerTraits.ScaleSource.FORMULA);
        assertThat(pm.acquisition().complete()).isEqualTo(DigitizerTraits.Completion.POLL);
        DigitizerTraits div = loader.load("sim-div8-digitizer", DriverKind.DIGITIZER).digitizer();
        assertThat(div.vertical().perPeakToPeak()).isEqualTo(0.1);
        assertThat(div.scaling().fields()).containsEntry("y_increment", 4).containsEntry("y_reference", 6);
        assertThat(loader.load("sim-source-matched", DriverKind.SOURCE).levelPerEmf()).isEqualTo(0.5);
    }

    @Test
    void digitizerTraitsAreCheckedWithPositions(@TempDir Path dir) throws Exception {
        String base = Files.readString(TestBench.home().resolve("drivers/sim-pm12-digitizer.yaml"));
        Map<String, String> broken = Map.of(
                "setting: plus_minus", "vertical.setting",
                "ranges: [5 mV, 10 mV", "vertical.ranges",
                "full_scale_codes: 4096", "scaling.source",
                "until: IDLE", "acquisition.until",
                "trace_format: int16-big", "scaling.source");
        Map<String, String> replacement = Map.of(
                "setting: plus_minus", "setting: halfway",
                "ranges: [5 mV, 10 mV", "ranges: [5 mV, 1 mV",
                "full_scale_codes: 4096", "clip_codes: [-1, 1]\n  # no codes",
                "until: IDLE", "# no until",
                "trace_format: int16-big", "trace_format: int16-big\nunused: 1");
        for (var e : broken.entrySet()) {
            String text = base.replace(e.getKey(), replacement.get(e.getKey()));
            if (e.getKey().startsWith("trace_format")) {
                text = base.replace("source: formula", "source: none");
            }
            Files.writeString(dir.resolve("bad.yaml"), text);
            ProblemsException x = catchThrowableOfType(ProblemsException.class,
                    () -> new DriverLoader(dir).load("bad", DriverKind.DIGITIZER));
            assertThat(x).as(e.getKey()).isNotNull();
            assertThat(x.problems()).as(e.getKey()).anySatisfy(p -> {
                assertThat(p.key()).isEqualTo(e.getValue());
                assertThat(p.line()).isPositive();
            });
        }
    }

    @Test
    void aNumericPlaceholderTakesOneFactor() {
        CommandTemplate half = CommandTemplate.parse(":CHAN{channel}:RANG {range*0.5}", Set.of("channel", "range"));
        assertThat(half.render(Map.of("channel", "1", "range", "4.0E+00"))).isEqualTo(":CHAN1:RANG 2.000000000E+00");
        CommandTemplate perDiv = CommandTemplate.parse(":TIM:SCAL {interval/10}", Set.of("interval"));
        assertThat(perDiv.render(Map.of("interval", "1.0E-03"))).isEqualTo(":TIM:SCAL 1.000000000E-04");
        assertThatThrownBy(() -> CommandTemplate.parse(":TRIG:SOUR {source*2}", Set.of("source")))
                .hasMessageContaining("is a word, not a number");
        assertThatThrownBy(() -> CommandTemplate.parse(":X {range+1}", Set.of("range")))
                .hasMessageContaining("unknown placeholder {range+1}");
    }
}
