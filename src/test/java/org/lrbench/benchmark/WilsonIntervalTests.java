package org.lrbench.benchmark;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class WilsonIntervalTests {

    /**
     * Wilson score interval, 95 %: 81 successes in 263 trials give 0.2553 to 0.3662 (the worked
     * example of Newcombe, Statistics in Medicine 17, 1998, from memory; the closed form by hand:
     * p = 0.30798, centre 0.31074, half-width 0.05546).
     */
    @Test
    void matchesTheWorkedExample() {
        double[] w = CoverageBenchmark.wilson(81, 263);
        assertThat(w[0]).isCloseTo(25.53, within(0.01));
        assertThat(w[1]).isCloseTo(36.62, within(0.01));
    }
}
