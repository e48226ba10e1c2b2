package org.lrbench.sim;

/**
 * How the simulated bench departs from ideal: the generator's output impedance, the digitizer's
 * input noise (RMS volts, white and Gaussian, per channel), its converter resolution in bits
 * (0 for an ideal converter with no quantization) and the random seed that makes runs repeatable.
 */
public record SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed) {

    /** 50 ohm generator output (common practice, no source), 0.5 mV noise, 8 bits, seed 1. */
    public static SimSettings defaults() {
        return new SimSettings(50.0, 0.5e-3, 8, 1L);
    }

    public SimSettings withSeed(long newSeed) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, newSeed);
    }
}
