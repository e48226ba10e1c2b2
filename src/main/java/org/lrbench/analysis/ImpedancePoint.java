package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;

/**
 * The part's impedance at one frequency with the covariance of its real and imaginary parts (ohm
 * squared), and the current through it.
 */
public record ImpedancePoint(double frequencyHz, Complex impedanceOhm, Complex currentAmpere, double varianceR,
                             double varianceX, double covarianceRX) {

    /** A point whose real and imaginary parts have the same standard uncertainty and do not correlate. */
    public ImpedancePoint(double frequencyHz, Complex impedanceOhm, double componentUncertaintyOhm,
                          Complex currentAmpere) {
        this(frequencyHz, impedanceOhm, currentAmpere, componentUncertaintyOhm * componentUncertaintyOhm,
                componentUncertaintyOhm * componentUncertaintyOhm, 0);
    }

    /** The two parts' mean standard uncertainty, sqrt((u(R)^2 + u(X)^2) / 2), for what takes them alike. */
    public double componentUncertaintyOhm() {
        return Math.sqrt((varianceR + varianceX) / 2);
    }

    /** The relative standard uncertainty of |Z|: the covariance's scatter along Z. */
    public double magnitudeRelativeUncertainty() {
        Complex unit = impedanceOhm.divide(impedanceOhm.abs());
        double v = unit.getReal() * unit.getReal() * varianceR + unit.getImaginary() * unit.getImaginary() * varianceX
                + 2 * unit.getReal() * unit.getImaginary() * covarianceRX;
        return Math.sqrt(Math.max(0, v)) / impedanceOhm.abs();
    }

    /** The standard uncertainty of Z's phase, radians: the covariance's scatter across Z over |Z|. */
    public double phaseUncertainty() {
        Complex unit = impedanceOhm.divide(impedanceOhm.abs());
        double v = unit.getImaginary() * unit.getImaginary() * varianceR + unit.getReal() * unit.getReal() * varianceX
                - 2 * unit.getReal() * unit.getImaginary() * covarianceRX;
        return Math.sqrt(Math.max(0, v)) / impedanceOhm.abs();
    }

    public double resistanceOhm() {
        return impedanceOhm.getReal();
    }

    public double reactanceOhm() {
        return impedanceOhm.getImaginary();
    }

    /** Inductance of the series model at this point, X / (2 pi f). */
    public double inductanceHenry() {
        return reactanceOhm() / (2 * Math.PI * frequencyHz);
    }

    /** Quality factor X / R (infinite for R = 0). */
    public double qualityFactor() {
        return reactanceOhm() / resistanceOhm();
    }

    /**
     * The impedance multiplied by {@code c} (a gain and a turn): the covariance goes through the
     * same linear map, [[Re c, -Im c], [Im c, Re c]].
     */
    public ImpedancePoint times(Complex c) {
        double[] v = turn(c, varianceR, varianceX, covarianceRX);
        return new ImpedancePoint(frequencyHz, impedanceOhm.multiply(c), currentAmpere, v[0], v[1], v[2]);
    }

    /**
     * The point carried through a correction whose derivative at this impedance is {@code slope}
     * (the correction is a function of the complex impedance), to {@code corrected}, with
     * {@code addedVariance} more on each part (the correction's own uncertainty).
     */
    public ImpedancePoint corrected(Complex corrected, Complex slope, double addedVariance) {
        double[] v = turn(slope, varianceR, varianceX, covarianceRX);
        return new ImpedancePoint(frequencyHz, corrected, currentAmpere, v[0] + addedVariance, v[1] + addedVariance,
                v[2]);
    }

    /** The same point at another frequency (a frequency scale error). */
    public ImpedancePoint atFrequency(double f) {
        return new ImpedancePoint(f, impedanceOhm, currentAmpere, varianceR, varianceX, covarianceRX);
    }

    /** M S M' for M = [[a, -b], [b, a]], c = a + j b, S = [[vr, k], [k, vx]]: {vr', vx', k'}. */
    static double[] turn(Complex c, double vr, double vx, double k) {
        double a = c.getReal();
        double b = c.getImaginary();
        return new double[] {a * a * vr - 2 * a * b * k + b * b * vx,
            b * b * vr + 2 * a * b * k + a * a * vx,
            a * b * vr + (a * a - b * b) * k - a * b * vx};
    }
}
