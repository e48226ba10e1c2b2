package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;

/**
 * The part's impedance from the two channel phasors: the current is the sense-resistor voltage over
 * its resistance, I = V1 / Rs, and Z = V2 / I = Rs * V2 / V1 (Ohm's law). The component uncertainty
 * follows from first-order propagation of both phasors' noise: relative errors add in quadrature,
 * u(Z)^2 = |Z|^2 (u(V1)^2 / |V1|^2 + u(V2)^2 / |V2|^2).
 */
public final class PhasorImpedance {

    private PhasorImpedance() {
    }

    public static ImpedancePoint of(double frequencyHz, SineFitResult sense, SineFitResult part, double senseOhm) {
        Complex v1 = SineFit.phasor(sense);
        Complex v2 = SineFit.phasor(part);
        if (v1.abs() == 0) {
            throw new IllegalArgumentException("no current: the sense-resistor voltage at " + frequencyHz + " Hz is zero");
        }
        Complex z = v2.divide(v1).multiply(senseOhm);
        double rel2 = sense.componentVariance() / (v1.abs() * v1.abs())
                + (v2.abs() > 0 ? part.componentVariance() / (v2.abs() * v2.abs()) : 0);
        double u = z.abs() * Math.sqrt(rel2);
        return new ImpedancePoint(frequencyHz, z, u, v1.divide(senseOhm));
    }
}
