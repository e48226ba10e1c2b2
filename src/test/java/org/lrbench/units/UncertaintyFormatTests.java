package org.lrbench.units;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class UncertaintyFormatTests {

    /**
     * JCGM 100:2008 7.2.6: the expanded uncertainty with at most two significant digits, the result
     * rounded to the same place; its example m_S = 100.021 47 g with U = 0.000 79 g is
     * written 100.021 47(79) g, that is 100.02147 +/- 0.00079 g (from memory of the guide's wording).
     */
    @Test
    void valueRoundedToTheDigitsOfItsUncertainty() {
        assertThat(Units.formatWithUncertainty(1.012034e-3, 1.661e-6, Dimension.INDUCTANCE)).isEqualTo("1.0120 ± 0.0017 mH");
        assertThat(Units.formatWithUncertainty(2.31049, 0.003958, Dimension.RESISTANCE)).isEqualTo("2.3105 ± 0.0040 ohm");
        assertThat(Units.formatWithUncertainty(27.52, 0.01531, Dimension.NONE)).isEqualTo("27.520 ± 0.016");
        assertThat(Units.formatWithUncertainty(1.0002147e5, 0.079, Dimension.FREQUENCY)).isEqualTo("100.021470 ± 0.000079 kHz");
        // an uncertainty is rounded up: 1.61 to two figures is 1.7, never 1.6
        assertThat(Units.formatWithUncertainty(10.0, 0.161, Dimension.VOLTAGE)).isEqualTo("10.00 ± 0.17 V");
    }
}
