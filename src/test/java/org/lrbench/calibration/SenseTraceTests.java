package org.lrbench.calibration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SenseTraceTests {

    @Test
    void theMetersRectangleAndTheReadingsScatterAreKeptApart() {
        // u^2 = (a / sqrt 3)^2 + s^2 for a meter specification of half-width a (a rectangle, JCGM 100:2008
        // 4.3.7) and readings' scatter s: 100 ohm, a = 15 mohm, s = 2 mohm
        double u = Math.hypot(0.015 / Math.sqrt(3), 0.002);
        SenseTrace t = new SenseTrace("2026-12-04T10:00:00Z", 100, 100, u, 10, "p.yaml", 0.015);
        assertThat(t.meterRelativeHalfWidth()).isCloseTo(1.5e-4, within(1e-12));
        assertThat(t.scatterRelativeUncertainty()).isCloseTo(2e-5, within(1e-12));
        assertThat(t.relativeUncertainty()).isCloseTo(u / 100, within(1e-15));
    }

    @Test
    void aTraceKeptBeforeTheMetersLimitWasStoredIsNormalWhole(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("bench-a/sense-resistor.json");
        Files.createDirectories(file.getParent());
        Files.writeString(file, "{\"measured_at\":\"2026-11-30T09:00:00Z\",\"nominal_ohm\":100.0,\"value_ohm\":100.02,"
                + "\"standard_uncertainty_ohm\":0.009,\"readings\":10,\"plan\":\"plans/a.yaml\"}");
        SenseTrace t = new CalibrationStore(dir, "bench-a").load().sense();
        assertThat(t.meterRelativeHalfWidth()).isZero();
        assertThat(t.scatterRelativeUncertainty()).isCloseTo(0.009 / 100.02, within(1e-15));
    }

    @Test
    void aLimitLargerThanTheWholeUncertaintyAllowsIsCappedAtIt() {
        // a rectangle's u is a / sqrt(3): the stored u bounds a to sqrt(3) u, the scatter then 0
        SenseTrace t = new SenseTrace("2026-12-04T10:00:00Z", 10, 10, 0.001, 10, "p.yaml", 0.01);
        assertThat(t.meterRelativeHalfWidth()).isCloseTo(Math.sqrt(3) * 1e-4, within(1e-15));
        assertThat(t.scatterRelativeUncertainty()).isCloseTo(0, within(1e-12));
    }
}
