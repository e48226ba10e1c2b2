package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.transform.DftNormalization;
import org.apache.commons.math3.transform.FastFourierTransformer;
import org.apache.commons.math3.transform.TransformType;

/**
 * A first frequency estimate for the four-parameter fit when none is known: the peak of the
 * record's Hann-windowed spectrum (Apache Commons Math FFT, record zero-padded to a power of two),
 * refined by parabolic interpolation of the log magnitudes of the peak bin and its neighbours.
 */
public final class FrequencyEstimate {

    private FrequencyEstimate() {
    }

    public static double peakHz(double[] y, double intervalSecond) {
        int n = y.length;
        if (n < 16) {
            throw new IllegalArgumentException("a spectrum peak needs at least 16 samples, got " + n);
        }
        int size = Integer.highestOneBit(n - 1) << 1;
        double mean = 0;
        for (double v : y) {
            mean += v;
        }
        mean /= n;
        double[] windowed = new double[size];
        for (int i = 0; i < n; i++) {
            double w = 0.5 - 0.5 * Math.cos(2 * Math.PI * i / (n - 1));
            windowed[i] = (y[i] - mean) * w;
        }
        Complex[] spectrum = new FastFourierTransformer(DftNormalization.STANDARD).transform(windowed, TransformType.FORWARD);
        int peak = 1;
        for (int k = 2; k < size / 2; k++) {
            if (spectrum[k].abs() > spectrum[peak].abs()) {
                peak = k;
            }
        }
        double a = Math.log(spectrum[peak - 1].abs() + 1e-300);
        double b = Math.log(spectrum[peak].abs() + 1e-300);
        double c = Math.log(spectrum[peak + 1].abs() + 1e-300);
        double shift = 0.5 * (a - c) / (a - 2 * b + c);
        return (peak + shift) / (size * intervalSecond);
    }
}
