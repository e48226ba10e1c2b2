package org.lrbench.calibration;

/**
 * The sense resistor traced by the bench's multimeter (4-wire, repeated): its nominal value (the
 * plan's), the mean reading and its standard uncertainty (the meter's specification as a rectangle,
 * and the readings' own scatter), how many readings, when, and with which plan.
 */
public record SenseTrace(String measuredAt, double nominalOhm, double valueOhm, double standardUncertaintyOhm,
                         int readings, String plan) {

    /** The relative standard uncertainty of the traced value. */
    public double relativeUncertainty() {
        return standardUncertaintyOhm / valueOhm;
    }
}
