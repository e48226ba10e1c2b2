package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

class CopperResistanceTests {

    @Test
    void annealedCopperFollowsItsIacsTemperatureCoefficient() {
        // IACS annealed copper, alpha = 0.00393 per K at 20 C (NBS Handbook 100):
        // 1.000 ohm at 20 C reads 1.01965 ohm at 25 C
        assertThat(CopperResistance.at(1.000, 20, 25)).isCloseTo(1.01965, within(1e-9));
        assertThat(CopperResistance.toReference(1.01965, 25, 20)).isCloseTo(1.000, within(1e-9));
        assertThat(Units.parse("25 C", Dimension.TEMPERATURE)).isEqualTo(25);
        assertThat(Units.parse("-5 degC", Dimension.TEMPERATURE)).isEqualTo(-5);
    }
}
