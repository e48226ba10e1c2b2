package org.lrbench.traces;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.cli.Main;

/**
 * Re-analysis of traces that ngspice (Debian package ngspice, a general-purpose circuit simulator;
 * .ci/run installs it) computes and writes itself: a transient of a 3 V, 1 kHz sine into a 100 ohm
 * sense resistor and a part of 1 mH with 2.3 ohm in series and 15 pF across. The extraction must
 * agree with the netlist's values to 0.1 % in L and 1 % in R.
 */
class NgspiceTraceTests {

    @Test
    void theNetlistsInductorIsRecoveredFromNgspiceTraces(@TempDir Path dir) throws Exception {
        boolean present = new ProcessBuilder("sh", "-c", "command -v ngspice").start().waitFor() == 0;
        assumeTrue(present, "ngspice is not installed (apt-get install ngspice): trace re-analysis test skipped");
        Path out = dir.resolve("traces.txt");
        Path netlist = dir.resolve("part.cir");
        Files.writeString(netlist, String.join("\n",
                "* sine into a sense resistor and a series R-L part with parallel capacitance",
                "V1 n1 0 SIN(0 3 1000)",
                "Rs n1 n2 100",
                "Rw n2 n3 2.3",
                "L1 n3 0 1m",
                "C1 n2 0 15p",
                ".options interp",
                ".control",
                "set wr_singlescale",
                "set wr_vecnames",
                "tran 2u 25m 5m",
                "wrdata " + out + " v(n1,n2) v(n2)",
                "quit",
                ".endc",
                ".end", ""));
        Process p = new ProcessBuilder("ngspice", "-b", netlist.toString()).redirectErrorStream(true)
                .redirectOutput(dir.resolve("ngspice.log").toFile()).start();
        assertThat(p.waitFor(120, TimeUnit.SECONDS)).isTrue();
        assertThat(Files.exists(out)).as(Files.readString(dir.resolve("ngspice.log"))).isTrue();
        CsvTraces t = CsvTraces.read(out);
        assertThat(t.intervalSecond()).isCloseTo(2e-6, within(1e-9));
        ImpedancePoint z = TraceAnalysis.analyse(t, 100, null);
        assertThat(z.frequencyHz()).isCloseTo(1000, within(0.01));
        assertThat(z.inductanceHenry()).isCloseTo(1e-3, within(0.001 * 1e-3));
        assertThat(z.resistanceOhm()).isCloseTo(2.3, within(0.01 * 2.3));
    }

    @Test
    void aFileWithoutAHeaderOrWithGapsIsRefusedWithItsLine(@TempDir Path dir) throws Exception {
        Path noHeader = dir.resolve("a.csv");
        Files.writeString(noHeader, "0,1,2\n1,1,2\n");
        assertThatThrownBy(() -> CsvTraces.read(noHeader)).hasMessageContaining(":1:1: expected a header");
        StringBuilder sb = new StringBuilder("time_s,sense_v,part_v\n");
        for (int i = 0; i < 20; i++) {
            sb.append(i == 10 ? 10.5 : i).append(",0,0\n");
        }
        Path gap = dir.resolve("b.csv");
        Files.writeString(gap, sb.toString());
        assertThatThrownBy(() -> CsvTraces.read(gap)).hasMessageContaining("breaks the uniform interval");
    }

    /**
     * The same traces written the two ways scopes write them: commas between fields and decimal
     * points, or semicolons between fields and decimal commas (common practice, no source: scopes in
     * locales with a decimal comma). Both read alike, to the phasor Z = Rs V2 / V1 of the two sines.
     */
    @Test
    void decimalCommaFilesWithSemicolonsReadLikeCommaFiles(@TempDir Path dir) throws Exception {
        StringBuilder points = new StringBuilder("time_s,sense_v,part_v\n");
        StringBuilder commas = new StringBuilder("Zeit (s);Kanal 1 (V);Kanal 2 (V)\n");
        double f = 1000;
        double phi = 0.6;
        for (int i = 0; i < 2000; i++) {
            double t = i * 5e-6;
            double v1 = 1.2 * Math.sin(2 * Math.PI * f * t);
            double v2 = 0.3 * Math.sin(2 * Math.PI * f * t + phi);
            points.append(String.format(Locale.ROOT, "%.9e,%.9e,%.9e%n", t, v1, v2));
            commas.append(String.format(Locale.GERMANY, "%.9e;%.9e;%.9e%n", t, v1, v2));
        }
        Path a1 = dir.resolve("points.csv");
        Path a2 = dir.resolve("commas.csv");
        Files.writeString(a1, points);
        Files.writeString(a2, commas);
        ImpedancePoint z1 = TraceAnalysis.analyse(CsvTraces.read(a1), 100, null);
        ImpedancePoint z2 = TraceAnalysis.analyse(CsvTraces.read(a2), 100, null);
        assertThat(z2.resistanceOhm()).isCloseTo(z1.resistanceOhm(), within(1e-9));
        assertThat(z2.reactanceOhm()).isCloseTo(z1.reactanceOhm(), within(1e-9));
        // Z = 100 ohm x 0.3 / 1.2 at +0.6 rad
        assertThat(z1.resistanceOhm()).isCloseTo(25 * Math.cos(phi), within(1e-4));
        assertThat(z1.reactanceOhm()).isCloseTo(25 * Math.sin(phi), within(1e-4));
        // a file that cannot be analysed is bad input (exit 2), not an internal error
        Path junk = dir.resolve("junk.csv");
        Files.writeString(junk, "a;b;c\n" + "1;x;2\n".repeat(20));
        assertThat(Main.execute("analyze", "--csv", junk.toString(), "--sense-resistor", "100 ohm")).isEqualTo(2);
    }
}
