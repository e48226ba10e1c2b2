package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;

/**
 * The lumped model of a real inductor: a winding R(f) + j w L, with R(f) = R_dc sqrt(1 + k f)
 * (R_dc at low frequency, growing as sqrt(f) above the skin-effect corner 1/k), in parallel with a
 * capacitance C_p and a loss conductance G_p:
 * Z = 1 / (1 / (R(f) + j w L) + j w C_p + G_p). Parameters in {@link LumpedParameter} order.
 */
public final class LumpedModel {

    private LumpedModel() {
    }

    public static Complex impedance(double[] p, double frequencyHz) {
        double omega = 2 * Math.PI * frequencyHz;
        Complex winding = new Complex(resistance(p, frequencyHz), omega * p[1]);
        return winding.reciprocal().add(new Complex(p[4], omega * p[2])).reciprocal();
    }

    /** Winding resistance at a frequency. */
    public static double resistance(double[] p, double frequencyHz) {
        return p[0] * Math.sqrt(Math.max(1e-12, 1 + p[3] * frequencyHz));
    }

    /** Apparent (series-equivalent) inductance Im(Z) / w at a frequency. */
    public static double apparentInductance(double[] p, double frequencyHz) {
        return impedance(p, frequencyHz).getImaginary() / (2 * Math.PI * frequencyHz);
    }

    /** Derivatives dZ/dp_j at a frequency: Z = 1/Y, dZ = -Z^2 dY. */
    public static Complex[] gradient(double[] p, double frequencyHz) {
        double omega = 2 * Math.PI * frequencyHz;
        double root = Math.sqrt(Math.max(1e-12, 1 + p[3] * frequencyHz));
        Complex winding = new Complex(p[0] * root, omega * p[1]);
        Complex inverseWinding2 = winding.multiply(winding).reciprocal();
        Complex z = impedance(p, frequencyHz);
        Complex minusZ2 = z.multiply(z).negate();
        Complex dYdR = inverseWinding2.multiply(-root);
        Complex dYdL = inverseWinding2.multiply(new Complex(0, -omega));
        Complex dYdC = new Complex(0, omega);
        Complex dYdK = inverseWinding2.multiply(-p[0] * frequencyHz / (2 * root));
        Complex dYdG = Complex.ONE;
        return new Complex[] {minusZ2.multiply(dYdR), minusZ2.multiply(dYdL), minusZ2.multiply(dYdC),
                              minusZ2.multiply(dYdK), minusZ2.multiply(dYdG)};
    }

    /** Self-resonant frequency 1 / (2 pi sqrt(L C)), infinite without capacitance. */
    public static double selfResonanceHz(double inductance, double capacitance) {
        return capacitance > 0 ? 1 / (2 * Math.PI * Math.sqrt(inductance * capacitance)) : Double.POSITIVE_INFINITY;
    }
}
