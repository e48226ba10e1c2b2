package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The time-base difference a multisine record shows, against records generated with a known one
 * (the generated truth; the phase a sine fit gives is IEEE Std 1057's, 4.1.3.1).
 */
class MultisineTimeBaseTests {

    /** Tones at {@code hz} times (1 + e), amplitudes 1 / (i + 1), Schroeder-like phases, Gaussian noise. */
    private static double[] record(double[] hz, double e, int n, double dt, double noise, long seed) {
        Random r = new Random(seed);
        double[] y = new double[n];
        for (int k = 0; k < n; k++) {
            double t = k * dt;
            double v = 0.01;
            for (int i = 0; i < hz.length; i++) {
                v += Math.cos(2 * Math.PI * hz[i] * (1 + e) * t - Math.PI * i * i / hz.length) / (i + 1);
            }
            y[k] = v + noise * r.nextGaussian();
        }
        return y;
    }

    @Test
    void aFewPpmAreReadWithinTheirUncertainty() {
        double[] hz = {200, 460, 1000, 2150, 4640, 10000, 20000};
        for (double e : new double[] {0, 3e-6, -2e-5, 5e-5}) {
            double[] y = record(hz, e, 50_000, 1e-6, 1e-3, 7);
            MultisineTimeBase.Estimate est = MultisineTimeBase.estimate(y, 1e-6, hz);
            assertThat(Math.abs(est.error() - e)).as("e = %g", e).isLessThan(3 * est.uncertainty());
            assertThat(est.uncertainty()).isLessThan(1e-6);
        }
    }

    @Test
    void aTopToneThatWalksManyTurnsIsUnwrappedFromTheLowerOnes() {
        // 1 s at 1 MHz: at 40 ppm the 100 kHz tone gains 18.8 rad between the first and last quarters'
        // middles, the 100 Hz one 0.019 rad
        double[] hz = {100, 1000, 10000, 100000};
        double e = 40e-6;
        double[] y = record(hz, e, 1_000_000, 1e-6, 1e-3, 11);
        MultisineTimeBase.Estimate est = MultisineTimeBase.estimate(y, 1e-6, hz);
        assertThat(Math.abs(est.error() - e)).isLessThan(3 * est.uncertainty());
        double[] seen = MultisineTimeBase.tones(y, y, 1e-6, hz);
        assertThat(seen[3] / hz[3] - 1).isCloseTo(e, org.assertj.core.api.Assertions.within(1e-7));
    }

    @Test
    void aRecordWithoutTonesLeavesTheDesignAlone() {
        double[] hz = {1000, 2000};
        double[] silent = new double[4000];
        assertThat(MultisineTimeBase.tones(silent, silent, 1e-5, hz)).containsExactly(hz);
    }
}
