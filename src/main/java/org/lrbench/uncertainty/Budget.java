package org.lrbench.uncertainty;

import java.util.ArrayList;
import java.util.List;

/**
 * The uncertainty budget of one reported quantity by the law of propagation of uncertainty for
 * uncorrelated inputs (JCGM 100:2008, GUM 5.1.2): u_c^2 = sum (c_i u(x_i))^2; effective degrees of
 * freedom by the Welch-Satterthwaite formula (GUM G.4.1, equation G.2b):
 * nu_eff = u_c^4 / sum (u_i^4 / nu_i); expanded uncertainty U = k u_c with k from the output's
 * distribution ({@link CoverageFactor}): the half-width of the interval holding 95.45 % of it, k = 2
 * for a normal output, less where rectangular or two-point lines dominate. The normal lines are taken
 * as normal whatever their degrees of freedom (nu_eff is reported, not used for k).
 */
public record Budget(String quantity, double value, List<Contribution> contributions, double standardUncertainty,
                     double effectiveDegreesOfFreedom, double coverageFactor, double expandedUncertainty) {

    /** The coverage factor of a normal output at {@link CoverageFactor#PROBABILITY}. */
    public static final double K = 2.0;

    /** Combines contributions (shares are filled in). */
    public static Budget of(String quantity, double value, List<Contribution> contributions) {
        double variance = 0;
        double fourth = 0;
        for (Contribution c : contributions) {
            double u2 = c.contribution() * c.contribution();
            variance += u2;
            if (Double.isFinite(c.degreesOfFreedom())) {
                fourth += u2 * u2 / c.degreesOfFreedom();
            }
        }
        double u = Math.sqrt(variance);
        double nu = effectiveDegreesOfFreedom(u, fourth);
        List<Contribution> shared = new ArrayList<>();
        for (Contribution c : contributions) {
            shared.add(c.withShare(variance > 0 ? c.contribution() * c.contribution() / variance : 0));
        }
        double k = CoverageFactor.of(contributions);
        return new Budget(quantity, value, List.copyOf(shared), u, nu, k, k * u);
    }

    /** GUM G.2b; infinite when every contribution is type B (or u is 0). */
    static double effectiveDegreesOfFreedom(double combined, double sumFourthOverDof) {
        return sumFourthOverDof > 0 ? Math.pow(combined, 4) / sumFourthOverDof : Double.POSITIVE_INFINITY;
    }

    /** Welch-Satterthwaite for given contributions u_i and degrees of freedom nu_i (GUM G.2b). */
    public static double welchSatterthwaite(double[] u, double[] nu) {
        double variance = 0;
        double fourth = 0;
        for (int i = 0; i < u.length; i++) {
            variance += u[i] * u[i];
            if (Double.isFinite(nu[i])) {
                fourth += Math.pow(u[i], 4) / nu[i];
            }
        }
        return effectiveDegreesOfFreedom(Math.sqrt(variance), fourth);
    }
}
