package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class FourParameterSineFitTests {

    @Test
    void convergesToTheExactSineFromANearbyStart() {
        // IEEE Std 1057 four-parameter fit, noise-free (from memory of a published example):
        // A = 2, f = 100 Hz, phase 1 rad in the sine form, offset 0.2, fs = 10 kHz for 1 s,
        // started at 100.2 Hz
        int n = 10_000;
        double dt = 1e-4;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = 2 * Math.sin(2 * Math.PI * 100 * i * dt + 1.0) + 0.2;
        }
        FourParameterSineFit.Result r = FourParameterSineFit.fit(y, dt, 100.2);
        assertThat(r.frequencyHz()).isCloseTo(100.0, within(1e-9));
        assertThat(r.fit().amplitude()).isCloseTo(2.0, within(1e-9));
        assertThat(r.fit().offset()).isCloseTo(0.2, within(1e-9));
        // sine-form phase 1 rad is cosine-form phase 1 - pi/2
        assertThat(r.fit().phase()).isCloseTo(1.0 - Math.PI / 2, within(1e-9));
        assertThat(r.iterations()).isLessThan(20);
    }

    @Test
    void spectrumPeakGivesAStartCloseEnoughToConverge() {
        int n = 3000;
        double dt = 1.0 / 48_000;
        double f = 1234.56;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = 0.7 * Math.cos(2 * Math.PI * f * i * dt + 0.3) - 0.05;
        }
        double start = FrequencyEstimate.peakHz(y, dt);
        // a Hann-window peak interpolation lands well inside one bin (48000/4096 = 11.7 Hz)
        assertThat(start).isCloseTo(f, within(2.0));
        assertThat(FourParameterSineFit.fit(y, dt, start).frequencyHz()).isCloseTo(f, within(1e-7));
    }

    @Test
    void triangleWaveHasTheThdOfItsFourierSeries() {
        // Triangle Fourier series (textbook, from memory): odd harmonics of relative amplitude 1/k^2,
        // so THD = sqrt(sum over odd k >= 3 of 1/k^4) = sqrt(pi^4/96 - 1) = 0.12115 for all harmonics;
        // a 15-harmonic fit of the band-limited series up to k = 15 gives the truncated sum
        int n = 20_000;
        double dt = 1e-6;
        double f = 1000;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i * dt;
            for (int k = 1; k <= 15; k += 2) {
                y[i] += ((k / 2) % 2 == 0 ? 1 : -1) * Math.sin(2 * Math.PI * k * f * t) / (k * k);
            }
        }
        double truncated = 0;
        for (int k = 3; k <= 15; k += 2) {
            truncated += 1.0 / Math.pow(k, 4);
        }
        HarmonicFit.Result r = HarmonicFit.fit(y, dt, f, 15);
        assertThat(r.thd()).isCloseTo(Math.sqrt(truncated), within(1e-9));
        assertThat(Math.sqrt(Math.pow(Math.PI, 4) / 96 - 1)).isCloseTo(0.12115, within(1e-5));
        assertThat(r.thd()).isCloseTo(0.12115, within(2e-4));
    }

    @Test
    void aCleanSineHasNoDistortion() {
        int n = 4000;
        double dt = 1e-5;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = Math.cos(2 * Math.PI * 1000 * i * dt);
        }
        assertThat(HarmonicFit.fit(y, dt, 1000, 9).thd()).isLessThan(1e-10);
    }
}
