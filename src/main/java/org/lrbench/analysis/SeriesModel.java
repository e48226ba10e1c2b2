package org.lrbench.analysis;

/**
 * The series R + L model fitted over a sweep, with standard uncertainties from the fit and the
 * reduced chi-square of its residuals (near 1 when the model explains the data within their
 * uncertainties).
 */
public record SeriesModel(double resistanceOhm, double inductanceHenry, double resistanceUncertaintyOhm,
                          double inductanceUncertaintyHenry, double reducedChiSquare, int points) {

    /** Quality factor of the model at a frequency: 2 pi f L / R. */
    public double qualityFactor(double frequencyHz) {
        return 2 * Math.PI * frequencyHz * inductanceHenry / resistanceOhm;
    }
}
