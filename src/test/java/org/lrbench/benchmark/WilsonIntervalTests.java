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

    /**
     * The chance that a pair's observed coverage lands in the 93-99 % band, against Apache Commons Math's
     * binomial distribution (a reference library): P(93 <= X <= 99) for X ~ B(100, 0.9545).
     */
    @Test
    void theBandProbabilityIsTheBinomials() {
        var b = new org.apache.commons.math3.distribution.BinomialDistribution(100, 0.9545);
        double want = b.cumulativeProbability(99) - b.cumulativeProbability(92);
        assertThat(CoverageBenchmark.inBand(0.9545, 100)).isCloseTo(want, within(1e-12));
        var b300 = new org.apache.commons.math3.distribution.BinomialDistribution(300, 0.97);
        // 279/300 = 93 %, 297/300 = 99 %
        assertThat(CoverageBenchmark.inBand(0.97, 300)).isCloseTo(b300.cumulativeProbability(297)
                - b300.cumulativeProbability(278), within(1e-12));
    }
}
