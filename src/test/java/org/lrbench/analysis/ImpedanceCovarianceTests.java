package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;

/**
 * The covariance of an impedance's real and imaginary parts from the two phasors' covariances, by
 * the law of propagation for a bivariate quantity (JCGM 102:2011, 6.2), checked against a Monte
 * Carlo propagation of the same distributions (JCGM 101:2008, from memory for the method).
 */
class ImpedanceCovarianceTests {

    @Test
    void anImpedancesCovarianceFollowsItsPhasorsCovariances() {
        double f = 1e3;
        double rs = 100;
        // phasors of V = A cos - B sin: (Re, Im) = (A, -B); noise unlike in A and B and correlated,
        // as quantization leaves it
        SineFitResult sense = new SineFitResult(f, 0.9, -0.35, 0, 0, 4e-8, 1e-8, 1.5e-8, 1000);
        SineFitResult part = new SineFitResult(f, 0.4, -1.7, 0, 0, 1e-8, 9e-8, -2e-8, 1000);
        ImpedancePoint z = PhasorImpedance.of(f, sense, part, rs);
        Random rnd = new Random(3);
        int n = 200_000;
        double sr = 0;
        double sx = 0;
        double srr = 0;
        double sxx = 0;
        double srx = 0;
        for (int i = 0; i < n; i++) {
            double[] d1 = draw(rnd, sense);
            double[] d2 = draw(rnd, part);
            SineFitResult s = new SineFitResult(f, 0.9 + d1[0], -0.35 + d1[1], 0, 0, 0, 0, 0, 1000);
            SineFitResult p = new SineFitResult(f, 0.4 + d2[0], -1.7 + d2[1], 0, 0, 0, 0, 0, 1000);
            Complex zz = PhasorImpedance.of(f, s, p, rs).impedanceOhm();
            double r = zz.getReal() - z.resistanceOhm();
            double x = zz.getImaginary() - z.reactanceOhm();
            sr += r;
            sx += x;
            srr += r * r;
            sxx += x * x;
            srx += r * x;
        }
        double vr = srr / n - (sr / n) * (sr / n);
        double vx = sxx / n - (sx / n) * (sx / n);
        double k = srx / n - (sr / n) * (sx / n);
        // 200 000 draws: a variance known to about 0.3 %; first order against the draws to 2 %
        assertThat(z.varianceR()).isCloseTo(vr, within(0.02 * vr));
        assertThat(z.varianceX()).isCloseTo(vx, within(0.02 * vx));
        assertThat(z.covarianceRX()).isCloseTo(k, within(0.02 * Math.sqrt(vr * vx)));
        // the two parts are not alike here: a single uncertainty for both would misstate one of them
        assertThat(Math.max(vr, vx) / Math.min(vr, vx)).isGreaterThan(1.5);
    }

    @Test
    void theMagnitudeAndPhaseUncertaintiesAreTheScatterAlongAndAcrossZ() {
        // first-order propagation (JCGM 102:2011 6.2): for Z = 3 + 4j, d|Z| = (3 dR + 4 dX) / 5 and
        // d(arg Z) = (3 dX - 4 dR) / 25; with var R = 4e-6, var X = 1e-6 and cov 1e-6
        ImpedancePoint z = new ImpedancePoint(1e3, new Complex(3, 4), Complex.ONE, 4e-6, 1e-6, 1e-6);
        double magnitude = Math.sqrt((9 * 4e-6 + 16 * 1e-6 + 24 * 1e-6) / 25) / 5;
        double phase = Math.sqrt(16 * 4e-6 + 9 * 1e-6 - 24 * 1e-6) / 25;
        assertThat(z.magnitudeRelativeUncertainty()).isCloseTo(magnitude, within(1e-12));
        assertThat(z.phaseUncertainty()).isCloseTo(phase, within(1e-12));
    }

    @Test
    void aQuarterTurnSwapsTheVariancesAndNegatesTheCovariance() {
        // multiplying by j maps (R, X) to (-X, R): linear algebra, no source needed beyond that
        ImpedancePoint p = new ImpedancePoint(1e3, new Complex(2, 5), Complex.ONE, 4, 1, 0.5);
        ImpedancePoint q = p.times(Complex.I);
        assertThat(q.varianceR()).isCloseTo(1, within(1e-12));
        assertThat(q.varianceX()).isCloseTo(4, within(1e-12));
        assertThat(q.covarianceRX()).isCloseTo(-0.5, within(1e-12));
        assertThat(q.componentUncertaintyOhm()).isCloseTo(p.componentUncertaintyOhm(), within(1e-12));
    }

    /** Correlated Gaussian (A, B) draws with the fit's covariance (Cholesky factor). */
    private static double[] draw(Random rnd, SineFitResult s) {
        double l11 = Math.sqrt(s.varianceCosine());
        double l21 = s.covarianceCosineSine() / l11;
        double l22 = Math.sqrt(s.varianceSine() - l21 * l21);
        double g1 = rnd.nextGaussian();
        double g2 = rnd.nextGaussian();
        return new double[] {l11 * g1, l21 * g1 + l22 * g2};
    }
}
