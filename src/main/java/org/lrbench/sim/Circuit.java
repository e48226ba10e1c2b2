package org.lrbench.sim;

import org.apache.commons.math3.complex.Complex;

/**
 * The bench circuit: a Thevenin source (EMF E behind Rg) drives the sense resistor Rs in series
 * with the part Z to ground. By Ohm's law on the loop, I = E / (Rg + Rs + Z); the digitizer's
 * channel 1 sees I * Rs across the sense resistor, channel 2 sees I * Z across the part.
 */
public record Circuit(double sourceOhm, double senseOhm, PartModel part) {

    /** Current phasor for a source phasor at angular frequency omega. */
    public Complex current(Complex emf, double omega) {
        return emf.divide(part.impedance(omega).add(sourceOhm + senseOhm));
    }

    /** Channel 1 (sense resistor) voltage phasor. */
    public Complex senseVoltage(Complex emf, double omega) {
        return current(emf, omega).multiply(senseOhm);
    }

    /** Channel 2 (part) voltage phasor. */
    public Complex partVoltage(Complex emf, double omega) {
        return current(emf, omega).multiply(part.impedance(omega));
    }
}
