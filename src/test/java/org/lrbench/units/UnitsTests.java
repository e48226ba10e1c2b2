package org.lrbench.units;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class UnitsTests {

    @Test
    void readsSiPrefixesAndUnits() {
        // SI prefixes per the SI Brochure (BIPM, 9th edition, Table 7)
        assertThat(Units.parse("470 uH", Dimension.INDUCTANCE)).isCloseTo(470e-6, within(1e-18));
        assertThat(Units.parse("2.2mH", Dimension.INDUCTANCE)).isCloseTo(2.2e-3, within(1e-18));
        assertThat(Units.parse("1 kHz", Dimension.FREQUENCY)).isEqualTo(1e3);
        assertThat(Units.parse("1.5 MHz", Dimension.FREQUENCY)).isEqualTo(1.5e6);
        assertThat(Units.parse("100 ohm", Dimension.RESISTANCE)).isEqualTo(100);
        assertThat(Units.parse("4.7 kohm", Dimension.RESISTANCE)).isCloseTo(4700, within(1e-9));
        assertThat(Units.parse("250 mohm", Dimension.RESISTANCE)).isCloseTo(0.25, within(1e-15));
        assertThat(Units.parse("12 pF", Dimension.CAPACITANCE)).isCloseTo(12e-12, within(1e-24));
        assertThat(Units.parse("20 ms", Dimension.TIME)).isCloseTo(0.02, within(1e-15));
        assertThat(Units.parse("3 V", Dimension.VOLTAGE)).isEqualTo(3);
        assertThat(Units.parse("1e-3 s", Dimension.TIME)).isEqualTo(1e-3);
        Quantity pct = Units.parse("10 %");
        assertThat(pct.relative()).isTrue();
        assertThat(pct.value()).isCloseTo(0.1, within(1e-15));
    }

    @Test
    void refusesTheWrongDimensionWithAClearMessage() {
        assertThatThrownBy(() -> Units.parse("1 kHz", Dimension.INDUCTANCE))
                .hasMessageContaining("frequency (Hz)").hasMessageContaining("expected inductance (H)");
        assertThatThrownBy(() -> Units.parse("3 furlongs", Dimension.VOLTAGE)).hasMessageContaining("unknown unit");
        assertThatThrownBy(() -> Units.parse("fast", Dimension.FREQUENCY)).hasMessageContaining("not a number");
        assertThatThrownBy(() -> Units.parse("10 %", Dimension.RESISTANCE)).hasMessageContaining("percentage");
    }

    @Test
    void formatsWithEngineeringPrefixes() {
        assertThat(Units.format(0.0010059, Dimension.INDUCTANCE)).isEqualTo("1.006 mH");
        assertThat(Units.format(883.1e-6, Dimension.INDUCTANCE)).isEqualTo("883.1 uH");
        // a value that rounds up to the next prefix is written with it (common practice, no source)
        assertThat(Units.format(999.97e-6, Dimension.INDUCTANCE)).isEqualTo("1.000 mH");
        assertThat(Units.format(-999.99, Dimension.FREQUENCY)).isEqualTo("-1.000 kHz");
        assertThat(Units.format(20000, Dimension.FREQUENCY)).isEqualTo("20.00 kHz");
    }
}
