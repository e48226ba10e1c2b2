package org.lrbench.analysis;

import org.apache.commons.math3.complex.Complex;

/**
 * The part's impedance from the two channel phasors: the current is the sense-resistor voltage over
 * its resistance, I = V1 / Rs, and Z = V2 / I = Rs * V2 / V1 (Ohm's law). The covariance of Z's real
 * and imaginary parts follows from first-order propagation of both phasors' covariances,
 * dZ = (Rs / V1) dV2 - (Z / V1) dV1 (JCGM 102:2011 for a bivariate quantity): the mean of its two
 * variances is |Z|^2 (u(V1)^2 / |V1|^2 + u(V2)^2 / |V2|^2) with u of a phasor the mean of its
 * components'.
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
        // dZ = (Rs / V1) dV2 - (Z / V1) dV1: each phasor's covariance (Re, Im) = (A, -B) through its
        // complex factor; the channels' errors are independent
        double[] s1 = ImpedancePoint.turn(z.divide(v1).negate(), sense.varianceCosine(), sense.varianceSine(),
                -sense.covarianceCosineSine());
        double[] s2 = ImpedancePoint.turn(new Complex(senseOhm, 0).divide(v1), part.varianceCosine(),
                part.varianceSine(), -part.covarianceCosineSine());
        return new ImpedancePoint(frequencyHz, z, v1.divide(senseOhm), s1[0] + s2[0], s1[1] + s2[1],
                s1[2] + s2[2]);
    }
}
