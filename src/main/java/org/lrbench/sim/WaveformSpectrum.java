package org.lrbench.sim;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.instrument.Waveform;

/**
 * The Fourier series of the generator's waveforms, peak value A, phase zero at the rising zero
 * crossing (textbook series, from memory):
 * sine A sin(wt); triangle (8A/pi^2) sum over odd k of (-1)^((k-1)/2) sin(kwt)/k^2;
 * square (4A/pi) sum over odd k of sin(kwt)/k. Lines above the band limit are left out.
 */
public final class WaveformSpectrum {

    private WaveformSpectrum() {
    }

    /** Lines of the waveform with peak {@code peak} at {@code frequency}, up to {@code bandLimit} Hz. */
    public static List<Harmonic> of(Waveform waveform, double peak, double offset, double frequency, double bandLimit) {
        List<Harmonic> lines = new ArrayList<>();
        if (offset != 0) {
            lines.add(new Harmonic(0, new Complex(offset, 0)));
        }
        int maxK = (int) Math.max(1, Math.floor(bandLimit / frequency));
        if (waveform == Waveform.SINE) {
            lines.add(sineLine(1, peak));
            return lines;
        }
        for (int k = 1; k <= maxK; k += 2) {
            double b = waveform == Waveform.TRIANGLE
                    ? 8 * peak / (Math.PI * Math.PI) * (((k - 1) / 2) % 2 == 0 ? 1 : -1) / ((double) k * k)
                    : 4 * peak / (Math.PI * k);
            lines.add(sineLine(k, b));
        }
        return lines;
    }

    /** b sin(k w t) = Re(-j b exp(j k w t)). */
    private static Harmonic sineLine(int k, double b) {
        return new Harmonic(k, new Complex(0, -b));
    }
}
