package org.lrbench.sim;

import org.apache.commons.math3.complex.Complex;

/**
 * The simulated part under test: a winding R(f) + j w L, its resistance rising with skin effect
 * above the corner its wire diameter sets, in parallel with a self-capacitance and an optional
 * loss resistance, the usual lumped model of a real inductor. A wire diameter of 0 means no skin
 * effect, a parallel resistance of 0 means none.
 */
public record PartModel(double inductanceHenry, double seriesResistanceOhm, double parallelCapacitanceFarad,
                        double wireDiameterMetre, double parallelResistanceOhm) {

    public PartModel {
        if (!(inductanceHenry > 0) || !(seriesResistanceOhm >= 0) || !(parallelCapacitanceFarad >= 0)
                || !(wireDiameterMetre >= 0) || !(parallelResistanceOhm >= 0)) {
            throw new IllegalArgumentException("part model needs L > 0 and R, C, wire diameter, parallel R >= 0; got L="
                    + inductanceHenry + " R=" + seriesResistanceOhm + " C=" + parallelCapacitanceFarad);
        }
    }

    public PartModel(double inductanceHenry, double seriesResistanceOhm, double parallelCapacitanceFarad) {
        this(inductanceHenry, seriesResistanceOhm, parallelCapacitanceFarad, 0, 0);
    }

    /** Winding resistance at a frequency, with skin effect. */
    public double windingResistance(double frequencyHz) {
        return seriesResistanceOhm * Math.sqrt(1 + SkinEffect.coefficient(wireDiameterMetre) * frequencyHz);
    }

    /** The impedance at angular frequency omega (rad/s). */
    public Complex impedance(double omega) {
        double f = omega / (2 * Math.PI);
        Complex branch = new Complex(windingResistance(f), omega * inductanceHenry);
        double g = parallelResistanceOhm > 0 ? 1 / parallelResistanceOhm : 0;
        if ((parallelCapacitanceFarad == 0 || omega == 0) && g == 0) {
            return branch;
        }
        return branch.reciprocal().add(new Complex(g, omega * parallelCapacitanceFarad)).reciprocal();
    }
}
