package org.lrbench.plan;

/**
 * The optional DC-resistance step: the winding measured by the bench's multimeter, 2-wire or
 * 4-wire, with the generator output off, at an entered temperature, corrected to the
 * specification's reference temperature.
 */
public record DcResistanceStep(boolean fourWire, double temperatureC, double referenceTemperatureC) {
}
