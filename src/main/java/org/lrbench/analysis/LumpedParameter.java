package org.lrbench.analysis;

/**
 * The parameters of the lumped model of a real inductor. The last three are optional: each has a
 * null value (no effect) that it is fixed at when the data cannot identify it.
 */
public enum LumpedParameter {
    /** Winding resistance at DC, ohm. */
    R_DC("series_resistance_dc", false),
    /** Inductance, H. */
    L("inductance", false),
    /** Parallel (self-)capacitance, F; null value 0. */
    C_P("parallel_capacitance", true),
    /** Skin-effect coefficient k, 1/Hz, in R(f) = R_dc sqrt(1 + k f); null value 0. */
    SKIN("skin_coefficient", true),
    /** Parallel loss conductance 1/R_p, S; null value 0. */
    G_P("parallel_conductance", true);

    private final String key;
    private final boolean optional;

    LumpedParameter(String key, boolean optional) {
        this.key = key;
        this.optional = optional;
    }

    public String key() {
        return key;
    }

    public boolean optional() {
        return optional;
    }

    /** This parameter's value in a model parameter vector (ordered as this enum, as the fit returns it). */
    public double in(double[] parameters) {
        return parameters[ordinal()];
    }
}
