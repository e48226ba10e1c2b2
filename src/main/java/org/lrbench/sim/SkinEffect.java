package org.lrbench.sim;

/**
 * Skin effect in a round copper wire. Skin depth delta = sqrt(rho / (pi f mu0)) (textbook
 * conductor theory); the simulator's AC resistance of a wire of radius a is the smooth
 * approximation R(f) = R_dc sqrt(1 + (a / (2 delta))^2), which is R_dc well below the corner and
 * R_dc a / (2 delta), growing as sqrt(f), well above it. In the fit's form
 * R_dc sqrt(1 + k f) this is k = pi mu0 a^2 / (4 rho).
 */
public final class SkinEffect {
    /** Resistivity of annealed copper at 20 C, ohm m (handbook value, about 1.68e-8). */
    public static final double COPPER_RESISTIVITY = 1.68e-8;
    /** Vacuum permeability, H/m (4 pi 1e-7 to the precision that matters here). */
    public static final double MU0 = 4e-7 * Math.PI;

    private SkinEffect() {
    }

    public static double skinDepth(double resistivity, double frequencyHz) {
        return Math.sqrt(resistivity / (Math.PI * frequencyHz * MU0));
    }

    /** The coefficient k of R_dc sqrt(1 + k f) for a copper wire of the given diameter (0: none). */
    public static double coefficient(double wireDiameter) {
        double a = wireDiameter / 2;
        return Math.PI * MU0 * a * a / (4 * COPPER_RESISTIVITY);
    }
}
