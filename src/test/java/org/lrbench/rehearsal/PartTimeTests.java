package org.lrbench.rehearsal;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.lrbench.sim.SimTiming;

/**
 * Which excitation rehearse advises: the multisine only where it is faster with every U within 1.5x
 * of the stepped sweep's (the project's rule that a speed figure counts only at an equal
 * uncertainty; the 1.5x is the goal the owner set, common practice, no source).
 */
class PartTimeTests {

    private static PartTime.Estimate estimate(double stepped, double multi, String refused, double... ratios) {
        Map<String, double[]> u = new LinkedHashMap<>();
        for (int i = 0; i < ratios.length; i++) {
            u.put("limit " + i, new double[] {1.0, ratios[i]});
        }
        return new PartTime.Estimate(SimTiming.LAN, stepped, multi, refused, u);
    }

    @Test
    void theMultisineIsAdvisedOnlyFasterAtAboutTheSameUncertainty() {
        assertThat(estimate(0.6, 0.3, null, 1.1, 1.4).advice()).startsWith("multisine: 2.0x faster");
        assertThat(estimate(0.6, 0.3, null, 1.1, 5.5).advice()).startsWith("stepped").contains("U(limit 1) is 5.5x");
        assertThat(estimate(0.3, 0.6, null, 1.0, 1.0).advice()).startsWith("stepped").contains("not faster");
        assertThat(estimate(0.6, Double.NaN, "no arbitrary waveforms").advice()).startsWith("stepped")
                .contains("cannot play");
        // a U that could not be compared (NaN) never advises the multisine
        assertThat(estimate(0.6, 0.3, null, Double.NaN).advice()).startsWith("stepped");
    }
}
