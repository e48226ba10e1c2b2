package org.lrbench.report;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

class ChartAxisTests {

    /** Logarithmic axes are ticked 1-2-5 in every decade (common practice, no source). */
    @Test
    void logTicksAreOneTwoFivePerDecade() {
        assertThat(Charts.EngineeringLogAxis.ticks(150, 25e3)).containsExactly(200.0, 500.0, 1e3, 2e3, 5e3, 1e4, 2e4);
        assertThat(Charts.EngineeringLogAxis.ticks(0.9e-3, 1.1e-3)).containsExactly(1e-3);
        assertThat(Charts.EngineeringLogAxis.ticks(-1, 10)).isEmpty();
    }

    /** Tick labels carry the SI prefix and unit every command prints, without trailing zeros. */
    @Test
    void tickLabelsUseSiPrefixes() {
        assertThat(Units.formatTick(1000, Dimension.FREQUENCY)).isEqualTo("1 kHz");
        assertThat(Units.formatTick(200, Dimension.FREQUENCY)).isEqualTo("200 Hz");
        assertThat(Units.formatTick(2.5e-3, Dimension.RESISTANCE)).isEqualTo("2.5 mohm");
        assertThat(Units.formatTick(1.06e-3, Dimension.INDUCTANCE)).isEqualTo("1.06 mH");
        assertThat(Units.formatTick(27, Dimension.NONE)).isEqualTo("27");
        assertThat(Units.formatTick(27.5, Dimension.NONE)).isEqualTo("27.5");
    }
}
