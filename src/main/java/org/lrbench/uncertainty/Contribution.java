package org.lrbench.uncertainty;

/**
 * One line of an uncertainty budget: the source, its distribution, the input's standard
 * uncertainty u(x_i) in the input's own unit, the sensitivity coefficient c_i = dy/dx_i, the
 * contribution |c_i| u(x_i) to the result's standard uncertainty, its degrees of freedom (infinite
 * for type B), and its share of the combined variance.
 */
public record Contribution(String source, String type, Distribution distribution, double inputUncertainty,
                           String inputUnit, double sensitivity, double contribution, double degreesOfFreedom,
                           double share) {

    Contribution withShare(double s) {
        return new Contribution(source, type, distribution, inputUncertainty, inputUnit, sensitivity, contribution,
                degreesOfFreedom, s);
    }
}
