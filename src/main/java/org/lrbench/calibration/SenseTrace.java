package org.lrbench.calibration;

/**
 * The sense resistor traced by the bench's multimeter (4-wire, repeated): its nominal value (the
 * plan's), the mean reading and its standard uncertainty (the meter's specification as a rectangle,
 * and the readings' own scatter), how many readings, when, with which plan, and the meter's
 * specification at that reading (the rectangle's half-width; 0 in traces kept before it was stored,
 * whose uncertainty is then taken as normal whole).
 */
public record SenseTrace(String measuredAt, double nominalOhm, double valueOhm, double standardUncertaintyOhm,
                         int readings, String plan, double meterLimitOhm) {

    /** The relative standard uncertainty of the traced value. */
    public double relativeUncertainty() {
        return standardUncertaintyOhm / valueOhm;
    }

    /** The meter specification's half-width, relative to the value (at most what the whole u allows). */
    public double meterRelativeHalfWidth() {
        return Math.min(meterLimitOhm, Math.sqrt(3) * standardUncertaintyOhm) / valueOhm;
    }

    /** The relative standard uncertainty other than the meter's specification: the readings' scatter. */
    public double scatterRelativeUncertainty() {
        double meter = meterRelativeHalfWidth() / Math.sqrt(3);
        double u = relativeUncertainty();
        return Math.sqrt(Math.max(0, u * u - meter * meter));
    }
}
