package org.lrbench.records;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.bench.CheckStandard;
import org.lrbench.study.ControlChart;

class CheckStandardLogTests {
    private static final CheckStandard STANDARD = new CheckStandard("REF-1", 1e-3, 2e-6, "p.yaml", 8 * 3600, 30 * 86400,
            20, null);

    @Test
    void aLotRunWaitsForARecentInControlCheckAndRecentCorrections(@TempDir Path dir) throws Exception {
        CheckStandardLog log = new CheckStandardLog(dir, "b1");
        Instant t0 = Instant.parse("2026-12-01T06:00:00Z");
        assertThat(log.gate(STANDARD, t0, t0)).contains("has not been measured");
        log.append(t0, "REF-1", "p.yaml", 1.0001e-3, 1.6e-6, "pass",
                new ControlChart.State(1e-3, 0.997e-3, 1.003e-3, false, true, "En = 0.05"));
        assertThat(log.gate(STANDARD, t0.plus(Duration.ofHours(7)), t0)).isNull();
        assertThat(log.gate(STANDARD, t0.plus(Duration.ofHours(9)), t0)).contains("9.0 h ago").contains("due every 8.0 h");
        assertThat(log.gate(STANDARD, t0.plus(Duration.ofHours(1)), t0.minus(Duration.ofDays(31))))
                .contains("corrections were measured 31.0 d ago");
        assertThat(log.gate(STANDARD, t0.plus(Duration.ofHours(1)), null)).contains("no corrections");
        // a record is never replaced: the same instant twice is refused, the first kept
        assertThatThrownBy(() -> log.append(t0, "REF-1", "p.yaml", 2e-3, 1.6e-6, "pass",
                new ControlChart.State(1e-3, 0.997e-3, 1.003e-3, false, false, "x")))
                .isInstanceOf(java.nio.file.FileAlreadyExistsException.class);
        assertThat(log.entries()).hasSize(1);
        assertThat(log.entries().get(0).value()).isEqualTo(1.0001e-3);
    }

    @Test
    void aCheckStandardWithBadValuesIsRefusedAtItsPositions() throws Exception {
        String bench = java.nio.file.Files.readString(org.lrbench.TestBench.home().resolve("simulator/bench-checked.yaml"))
                .replace("interval: 8 h", "interval: 8 hours").replace("uncertainty: 0.2 %", "uncertainty: 2 V")
                .replace("history: 20", "history: 2");
        assertThatThrownBy(() -> org.lrbench.bench.BenchLoader.parse(bench, "b.yaml"))
                .isInstanceOf(org.lrbench.yaml.ProblemsException.class)
                .hasMessageContaining("check_standard.interval: '8 hours' is not a duration")
                .hasMessageContaining("check_standard.uncertainty: give the certificate's expanded uncertainty")
                .hasMessageContaining("check_standard.history");
        var ok = org.lrbench.bench.BenchLoader.parse(bench.replace("interval: 8 hours", "interval: 90 min")
                .replace("uncertainty: 2 V", "uncertainty: 2 uH").replace("history: 2", "history: 25"), "b.yaml");
        assertThat(ok.checkStandard().intervalSecond()).isEqualTo(5400);
        assertThat(ok.checkStandard().certifiedExpandedHenry()).isEqualTo(2e-6, org.assertj.core.api.Assertions.within(1e-18));
        assertThat(ok.checkStandard().historyPoints()).isEqualTo(25);
    }
}
