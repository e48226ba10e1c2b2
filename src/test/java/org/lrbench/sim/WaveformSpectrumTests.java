package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.instrument.Waveform;

class WaveformSpectrumTests {

    static double valueAt(List<Harmonic> lines, double f, double t) {
        double v = 0;
        for (Harmonic h : lines) {
            double th = 2 * Math.PI * h.k() * f * t;
            v += h.amplitude().getReal() * Math.cos(th) - h.amplitude().getImaginary() * Math.sin(th);
        }
        return v;
    }

    @Test
    void triangleSeriesReachesItsPeakAtAQuarterPeriod() {
        // Textbook Fourier series of a triangle wave (from memory): at t = T/4 the series is
        // (8A/pi^2) * sum over odd k of 1/k^2, and sum over odd k of 1/k^2 = pi^2/8, so it equals A.
        // Truncated after harmonic K the remainder is below (8A/pi^2) / (2 (K - 1)).
        double f = 1000;
        int maxK = 4001;
        List<Harmonic> lines = WaveformSpectrum.of(Waveform.TRIANGLE, 2.0, 0, f, maxK * f);
        assertThat(valueAt(lines, f, 0.25 / f)).isCloseTo(2.0, within(8 * 2.0 / (Math.PI * Math.PI) / (2.0 * (maxK - 1))));
        assertThat(valueAt(lines, f, 0.0)).isCloseTo(0.0, within(1e-12));
        assertThat(valueAt(lines, f, 0.75 / f)).isCloseTo(-2.0, within(1e-3));
    }

    @Test
    void squareSeriesAveragesToItsLevelsAwayFromTheEdges() {
        // Textbook square-wave series (4A/pi) sum sin(k w t)/k over odd k; at t = T/4 it is
        // (4A/pi)(1 - 1/3 + 1/5 - ...) = (4A/pi)(pi/4) = A by the Leibniz series
        double f = 50;
        List<Harmonic> lines = WaveformSpectrum.of(Waveform.SQUARE, 1.5, 0, f, 20001 * f);
        assertThat(valueAt(lines, f, 0.25 / f)).isCloseTo(1.5, within(1e-3));
        assertThat(valueAt(lines, f, 0.75 / f)).isCloseTo(-1.5, within(1e-3));
    }

    @Test
    void bandLimitDropsHarmonicsAboveIt() {
        List<Harmonic> lines = WaveformSpectrum.of(Waveform.SQUARE, 1, 0.1, 1000, 10_500);
        assertThat(lines).extracting(Harmonic::k).containsExactly(0, 1, 3, 5, 7, 9);
        assertThat(WaveformSpectrum.of(Waveform.SINE, 1, 0, 1000, 10)).hasSize(1);
    }
}
