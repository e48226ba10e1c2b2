package org.lrbench.sim;

import org.apache.commons.math3.complex.Complex;

/**
 * The simulated part under test: a series R + L branch with an optional capacitance across it,
 * the usual lumped model of a real inductor's winding and its self-capacitance.
 */
public record PartModel(double inductanceHenry, double seriesResistanceOhm, double parallelCapacitanceFarad) {

    public PartModel {
        if (!(inductanceHenry > 0) || !(seriesResistanceOhm >= 0) || !(parallelCapacitanceFarad >= 0)) {
            throw new IllegalArgumentException("part model needs L > 0, R >= 0, C >= 0; got L=" + inductanceHenry
                    + " R=" + seriesResistanceOhm + " C=" + parallelCapacitanceFarad);
        }
    }

    /** The impedance at angular frequency omega (rad/s): (R + j omega L) parallel to 1/(j omega C). */
    public Complex impedance(double omega) {
        Complex branch = new Complex(seriesResistanceOhm, omega * inductanceHenry);
        if (parallelCapacitanceFarad == 0 || omega == 0) {
            return branch;
        }
        Complex admittance = branch.reciprocal().add(new Complex(0, omega * parallelCapacitanceFarad));
        return admittance.reciprocal();
    }
}
