package org.lrbench.analysis;

/**
 * Copper's resistance against temperature, linear about a reference:
 * R(T) = R_ref (1 + alpha (T - T_ref)), alpha = 0.00393 per kelvin for annealed copper at 20 C
 * (the IACS value, NBS Handbook 100).
 */
public final class CopperResistance {
    public static final double ALPHA_20C = 0.00393;

    private CopperResistance() {
    }

    /** The resistance at {@code temperature} of a winding that has {@code reference} at {@code referenceTemperature}. */
    public static double at(double reference, double referenceTemperature, double temperature) {
        return reference * (1 + ALPHA_20C * (temperature - referenceTemperature));
    }

    /** A resistance measured at {@code temperature}, corrected to {@code referenceTemperature}. */
    public static double toReference(double measured, double temperature, double referenceTemperature) {
        return measured / (1 + ALPHA_20C * (temperature - referenceTemperature));
    }
}
