package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import org.apache.commons.math3.stat.regression.OLSMultipleLinearRegression;
import org.junit.jupiter.api.Test;

/** The multisine's design and its multi-frequency least-squares fit. */
class MultisineTests {

    @Test
    void fitAgreesWithCommonsMathOrdinaryLeastSquares() {
        // Reference: Apache Commons Math OLSMultipleLinearRegression (QR decomposition) on the same
        // design, a record that holds no whole number of periods of any tone, with noise
        double[] f = {200, 431, 928, 2000, 4309};
        double dt = 1.0 / 97_000;
        int n = 3001;
        Random r = new Random(5);
        double[] y = new double[n];
        double[][] x = new double[n][2 * f.length];
        for (int i = 0; i < n; i++) {
            double t = i * dt;
            y[i] = 0.013 + r.nextGaussian() * 0.01;
            for (int k = 0; k < f.length; k++) {
                double w = 2 * Math.PI * f[k] * t;
                y[i] += (0.3 + 0.1 * k) * Math.cos(w + k) ;
                x[i][2 * k] = Math.cos(w);
                x[i][2 * k + 1] = Math.sin(w);
            }
        }
        OLSMultipleLinearRegression ols = new OLSMultipleLinearRegression();
        ols.newSampleData(y, x);
        double[] beta = ols.estimateRegressionParameters();
        double[][] cov = ols.estimateRegressionParametersVariance();
        double s2 = ols.estimateErrorVariance();
        SineFitResult[] fit = MultisineFit.fit(y, dt, f);
        for (int k = 0; k < f.length; k++) {
            assertThat(fit[k].cosineCoefficient()).isCloseTo(beta[1 + 2 * k], within(1e-10));
            assertThat(fit[k].sineCoefficient()).isCloseTo(beta[2 + 2 * k], within(1e-10));
            assertThat(fit[k].varianceCosine()).isCloseTo(s2 * cov[1 + 2 * k][1 + 2 * k], within(1e-12));
            assertThat(fit[k].covarianceCosineSine()).isCloseTo(s2 * cov[1 + 2 * k][2 + 2 * k], within(1e-12));
        }
        assertThat(fit[0].offset()).isCloseTo(beta[0], within(1e-10));
    }

    @Test
    void fitOfOneFrequencyIsTheThreeParameterFit() {
        // IEEE Std 1057 4.1.3.1: with one frequency the fit is the three-parameter sine fit
        double[] y = new double[2000];
        Random r = new Random(2);
        for (int i = 0; i < y.length; i++) {
            y[i] = 0.7 * Math.sin(2 * Math.PI * 1234.5 * i * 1e-5 + 0.3) + 0.05 * r.nextGaussian();
        }
        SineFitResult one = MultisineFit.fit(y, 1e-5, new double[] {1234.5})[0];
        SineFitResult three = SineFit.fit(y, 1e-5, 1234.5);
        assertThat(one.cosineCoefficient()).isCloseTo(three.cosineCoefficient(), within(1e-10));
        assertThat(one.sineCoefficient()).isCloseTo(three.sineCoefficient(), within(1e-10));
        assertThat(one.varianceSine()).isCloseTo(three.varianceSine(), within(1e-14));
    }

    @Test
    void tonesTooCloseForTheRecordAreRefused() {
        double[] y = new double[100];
        assertThatThrownBy(() -> MultisineFit.fit(y, 1e-4, new double[] {1000, 1000}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("cannot separate");
    }

    @Test
    void tonesLieOnBinsWithinTheTolerance() {
        List<Double> asked = List.of(200.0, 430.9, 928.3, 2000.0, 4308.9, 9283.2, 20000.0);
        MultisineDesign.Design d = MultisineDesign.of(asked, 0.02, 65536);
        for (int i = 0; i < asked.size(); i++) {
            assertThat(d.frequenciesHz()[i]).isCloseTo(d.bins()[i] * d.baseHz(), within(1e-9));
            assertThat(Math.abs(d.frequenciesHz()[i] / asked.get(i) - 1)).isLessThanOrEqualTo(0.02);
        }
        assertThat(d.bins()).doesNotHaveDuplicates();
        // the largest base that works: a 1 % tolerance needs a base no larger than at 2 %
        assertThat(MultisineDesign.of(asked, 0.01, 65536).baseHz()).isLessThanOrEqualTo(d.baseHz());
        assertThat(d.playbackRateHz()).isCloseTo(d.samples().length * d.baseHz(), within(1e-6));
        double peak = 0;
        for (double v : d.samples()) {
            peak = Math.max(peak, Math.abs(v));
        }
        assertThat(peak).isCloseTo(1.0, within(1e-12));
    }

    @Test
    void schroederPhasesKeepTheCrestFactorLow() {
        // Schroeder (IEEE Trans. IT-16, 1970): his phases give a crest factor far below the sqrt(2K)
        // of K equal tones in phase; for consecutive harmonics it stays near 1.7 (from memory)
        List<Double> harmonics = new java.util.ArrayList<>();
        for (int k = 1; k <= 31; k++) {
            harmonics.add(100.0 * k);
        }
        MultisineDesign.Design d = MultisineDesign.of(harmonics, 0.001, 65536);
        assertThat(d.crestFactor()).isLessThan(2.0).isLessThan(Math.sqrt(2 * 31) / 3);
        // each tone's peak against the waveform's: the sum of K unit tones has RMS sqrt(K/2)
        assertThat(d.toneAmplitude()).isCloseTo(1 / (d.crestFactor() * Math.sqrt(31 / 2.0)), within(1e-9));
    }

    @Test
    void aWaveformLongerThanTheMemoryIsRefused() {
        assertThatThrownBy(() -> MultisineDesign.of(List.of(10.0, 1e6), 0.01, 65536))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("65536");
    }

    /**
     * The recurrences of a long record (Goertzel's for the data sums, the sampled sinusoid's for the
     * synthesis) against every sample's cosine and sine worked out directly (java.lang.Math), from a
     * step near zero to one near pi: rounding does not build up over 400 000 samples.
     */
    @Test
    void recurrencesOfALongRecordAgreeWithDirectSums() {
        int n = 400_000;
        double[] p = {5e-5, 2.2e-4, 0.01, 0.3, 1.7, 3.1, 3.14};
        Random r = new Random(3);
        double[] y = new double[n];
        double sumAbs = 0;
        for (int i = 0; i < n; i++) {
            y[i] = r.nextGaussian() + 0.5 * Math.cos(2.2e-4 * i);
            sumAbs += Math.abs(y[i]);
        }
        double[] sums = MultisineFit.dataSums(y, p);
        for (int k = 0; k < p.length; k++) {
            double c = 0;
            double s = 0;
            for (int i = 0; i < n; i++) {
                c += y[i] * Math.cos(p[k] * i);
                s += y[i] * Math.sin(p[k] * i);
            }
            assertThat(sums[2 * k]).as("cosine sum, step %f", p[k]).isCloseTo(c, within(1e-12 * sumAbs));
            assertThat(sums[2 * k + 1]).as("sine sum, step %f", p[k]).isCloseTo(s, within(1e-12 * sumAbs));
        }
        double dt = 1e-6;
        double[] tones = new double[p.length];
        SineFitResult[] fit = new SineFitResult[p.length];
        for (int k = 0; k < p.length; k++) {
            tones[k] = p[k] / (2 * Math.PI * dt);
            fit[k] = new SineFitResult(tones[k], 0.3 + 0.1 * k, -0.2 * k, 0.01, 0, 0, 0, 0, n);
        }
        double[] model = MultisineQuantization.synthesized(n, dt, tones, fit);
        for (int i = 0; i < n; i += 997) {
            double v = 0.01;
            // the phase w i as a double is itself off by up to w i 2^-53 (both ways of working out each
            // sample round it alike at the block's start): that, times each amplitude, is the tolerance
            double tolerance = 1e-13;
            for (int k = 0; k < p.length; k++) {
                double w = 2 * Math.PI * tones[k] * dt;
                v += fit[k].cosineCoefficient() * Math.cos(w * i) + fit[k].sineCoefficient() * Math.sin(w * i);
                tolerance += fit[k].amplitude() * w * i * 0x1p-52;
            }
            assertThat(model[i]).as("sample %d", i).isCloseTo(v, within(tolerance));
        }
    }
}
