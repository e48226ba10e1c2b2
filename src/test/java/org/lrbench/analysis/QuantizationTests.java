package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.apache.commons.math3.special.BesselJ;
import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class QuantizationTests {

    /**
     * A sine of amplitude A through a three-level quantizer (thresholds at +/- D/2) is the ideal
     * relay with dead zone, whose describing function is N(A) = (4 D / (pi A)) sqrt(1 - (D / 2A)^2)
     * (Gelb and Vander Velde, Multiple-Input Describing Functions and Nonlinear System Design, 1968,
     * from memory).
     */
    @Test
    void threeLevelQuantizerMatchesTheRelayWithDeadZone() {
        double d = 1;
        double a = 0.75;
        double expected = 4 * d / (Math.PI * a) * Math.sqrt(1 - Math.pow(d / (2 * a), 2));
        assertThat(Quantization.forwardGain(a, 0, d, 0, 0)).isCloseTo(expected, within(1e-12));
    }

    /**
     * Against brute force: the fundamental of the quantized sine by a dense Fourier sum over one
     * period (two million phases), rounding each sample to the grid, with no formula of ours.
     */
    @ParameterizedTest(name = "A={0} D, centre {1} D, grid origin {2} D")
    @CsvSource({"3.3, 0.0, 0.0", "17.61, 0.3, 0.0", "50.2, -0.17, 0.25", "120.45, 2.0, 0.5"})
    void gainMatchesADenseFourierSumOfTheStaircase(double a, double centre, double origin) {
        int m = 2_000_000;
        double sum = 0;
        for (int i = 0; i < m; i++) {
            double theta = 2 * Math.PI * (i + 0.5) / m;
            double v = centre + a * Math.cos(theta);
            double q = origin + Math.rint(v - origin);
            sum += q * Math.cos(theta);
        }
        double fundamental = 2 * sum / m;
        assertThat(Quantization.forwardGain(a, centre, 1, origin, 0)).isCloseTo(fundamental / a, within(2e-6));
    }

    /** With noise ahead of the quantizer: against Monte Carlo over noise and phase (a million draws). */
    @Test
    void ditheredGainMatchesMonteCarlo() {
        Random rnd = new Random(7);
        double a = 10.37;
        double sigma = 0.2;
        int m = 1_000_000;
        double sum = 0;
        for (int i = 0; i < m; i++) {
            double theta = 2 * Math.PI * (i + 0.5) / m;
            sum += Math.rint(a * Math.cos(theta) + sigma * rnd.nextGaussian()) * Math.cos(theta);
        }
        double fundamental = 2 * sum / m;
        // Monte Carlo standard error of the fundamental: about 2 sqrt(var / (2 m)) ~ 5e-4 here
        assertThat(Quantization.forwardGain(a, 0, 1, 0, sigma) * a).isCloseTo(fundamental, within(2e-3));
        // noise of half a step dithers the error nearly away (common practice, no source)
        assertThat(Math.abs(Quantization.forwardGain(a, 0, 1, 0, 0.6) - 1))
                .isLessThan(Math.abs(Quantization.forwardGain(a, 0, 1, 0, 0) - 1) / 100);
    }

    /** The two forms (staircase sum with quadrature, Fourier series) agree where both are accurate. */
    @ParameterizedTest(name = "A={0} D, centre {1} D")
    @CsvSource({"10.37, 0.0", "47.9, 0.31", "128.2, -0.4"})
    void staircaseAndFourierFormsAgree(double a, double centre) {
        for (double sigma : new double[] {0.03, 0.04}) {
            double fourier = Quantization.fourierGain(a, centre, 1, 0, sigma) - 1;
            assertThat(Quantization.staircaseGain(a, centre, 1, 0, sigma) - 1).isCloseTo(fourier, within(Math.max(0.01 * Math.abs(fourier), 2e-6)));
        }
    }

    /** Commons Math's J1 as the reference for the asymptotic form, where both hold. */
    @Test
    void besselJ1AsymptoticMatchesCommonsMath() {
        for (double x = 100; x < 5000; x += 37.3) {
            assertThat(Quantization.besselJ1(x)).isCloseTo(BesselJ.value(1, x), within(1e-9));
        }
    }

    /** Commons Math's erfc as the reference: fractional error under 1.2e-7 where it is claimed. */
    @Test
    void erfcMatchesCommonsMath() {
        for (double x = -4; x <= 9; x += 0.01) {
            double ref = Erf.erfc(x);
            assertThat(Quantization.erfc(x)).isCloseTo(ref, within(2e-7 * ref));
        }
    }

    @Test
    void readsTheCodeStepFromTheSamplesAndNoneFromUnquantizedData() {
        Random rnd = new Random(3);
        double step = 2.0 / 256;
        double[] coded = new double[1000];
        double[] raw = new double[1000];
        for (int i = 0; i < coded.length; i++) {
            double v = 0.9 * Math.sin(0.05 * i) + 1e-3 * rnd.nextGaussian();
            coded[i] = Math.rint(v / step) * step;
            raw[i] = v;
        }
        assertThat(Quantization.codeStep(coded)).isCloseTo(step, within(1e-12));
        assertThat(Quantization.codeStep(raw)).isNaN();
        assertThat(Quantization.of(raw, 1e-6, SineFit.fit(raw, 1e-6, 0.05 / (2 * Math.PI) / 1e-6)))
                .isEqualTo(Quantization.Correction.NONE);
    }

    /** The noise ahead of the quantizer is recovered from which codes the samples landed in. */
    @ParameterizedTest(name = "sigma = {0} step")
    @CsvSource({"0.05", "0.15", "0.4"})
    void estimatesTheNoiseAheadOfTheQuantizer(double sigma) {
        Random rnd = new Random(11);
        int n = 4000;
        double dt = 1e-6;
        double f = 1234.5;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double v = 60.3 * Math.cos(2 * Math.PI * f * i * dt + 0.4) + 0.2 + sigma * rnd.nextGaussian();
            y[i] = Math.rint(v);
        }
        Quantization.Correction c = Quantization.of(y, dt, SineFit.fit(y, dt, f));
        assertThat(c.codeStep()).isEqualTo(1.0);
        // within the factor of two either way that the correction's uncertainty allows for
        assertThat(c.noise()).isBetween(sigma / 1.5, sigma * 1.5);
    }

    /**
     * The point of the correction: the same undithered signal captured again and again (random
     * sample phase) gives a fitted amplitude biased by the staircase; corrected, the mean error is
     * within its own standard error. Reference: the true amplitude we generated.
     */
    @Test
    void correctedAmplitudeIsUnbiasedWhereTheRawFitIsNot() {
        Random rnd = new Random(5);
        double a = 31.27;
        double f = 1000;
        double dt = 1e-5 * (1 + Math.sqrt(2) / 1000);
        int n = 1000;
        int runs = 400;
        double rawSum = 0;
        double corrSum = 0;
        double corrSq = 0;
        for (int r = 0; r < runs; r++) {
            double phase = 2 * Math.PI * rnd.nextDouble();
            double[] y = new double[n];
            for (int i = 0; i < n; i++) {
                y[i] = Math.rint(a * Math.cos(2 * Math.PI * f * i * dt + phase) + 0.02 * rnd.nextGaussian());
            }
            SineFitResult fit = SineFit.fit(y, dt, f);
            Quantization.Correction c = Quantization.of(y, dt, fit);
            double raw = fit.amplitude() - a;
            double corrected = fit.amplitude() / c.gain() - a;
            rawSum += raw;
            corrSum += corrected;
            corrSq += corrected * corrected;
        }
        double rawMean = rawSum / runs;
        double mean = corrSum / runs;
        double se = Math.sqrt((corrSq / runs - mean * mean) / runs);
        assertThat(Math.abs(rawMean)).isGreaterThan(5 * se);
        assertThat(Math.abs(mean)).isLessThan(3 * se);
    }

    /**
     * A record whose sample rate is close to a multiple of the signal's frequency (100.5 samples
     * per cycle: the same 201 phases over and over) repeats its quantization error cycle after
     * cycle. Reference: the scatter of the corrected amplitude over 300 such records with random
     * phase (Monte Carlo against the truth we generated). The fit's white-noise variance
     * understates it; the bootstrap's matches it within the scatter of 300 draws.
     */
    @Test
    void theBootstrapSeesRepeatedQuantizationErrorThatTheResidualsHide() {
        Random rnd = new Random(17);
        double a = 88.3;
        double f = 1000;
        double dt = 1 / (100.5 * f);
        int n = 1013;
        int runs = 300;
        double sq = 0;
        double white = 0;
        double boot = 0;
        for (int r = 0; r < runs; r++) {
            double phase = 2 * Math.PI * rnd.nextDouble();
            double[] y = new double[n];
            for (int i = 0; i < n; i++) {
                y[i] = Math.rint(a * Math.cos(2 * Math.PI * f * i * dt + phase) + 0.05 * rnd.nextGaussian());
            }
            SineFitResult fit = SineFit.fit(y, dt, f);
            Quantization.Correction c = Quantization.of(y, dt, fit);
            SineFitResult corrected = c.apply(fit);
            double e = corrected.amplitude() - a;
            sq += e * e;
            // the amplitude's variance is the phasor's along its own direction
            double cp = Math.cos(fit.phase());
            double sp = Math.sin(fit.phase());
            white += fit.varianceCosine() * cp * cp + fit.varianceSine() * sp * sp - 2 * fit.covarianceCosineSine() * cp * sp;
            boot += corrected.varianceCosine() * cp * cp + corrected.varianceSine() * sp * sp
                    - 2 * corrected.covarianceCosineSine() * cp * sp;
        }
        double actual = sq / runs;
        assertThat(white / runs).isLessThan(actual / 2);
        // 300 draws: the variance itself is known to about 8 % (1 sigma); allow 3 sigma either way
        assertThat(boot / runs / actual).isBetween(0.75, 1.33);
    }
}
