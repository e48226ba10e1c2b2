package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;

/**
 * The part's impedance at one frequency with the standard uncertainty of each of its components
 * (real and imaginary taken alike), and the current through it.
 */
public record ImpedancePoint(double frequencyHz, Complex impedanceOhm, double componentUncertaintyOhm,
                             Complex currentAmpere) {

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
}
