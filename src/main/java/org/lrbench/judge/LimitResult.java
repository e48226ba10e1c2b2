package org.lrbench.judge;

import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * One limit judged: the reading, its standard and expanded uncertainty, the acceptance limits the
 * decision rule drew, the zone the reading falls in, pass or fail, and the margin to the nearest
 * acceptance limit (negative outside).
 */
public record LimitResult(Limit limit, double value, double uncertainty, double expandedUncertainty,
                          double acceptanceLower, double acceptanceUpper, Zone zone, boolean pass, double margin,
                          String note) {

    /** "winding resistance 2.71 ohm > 2.60 ohm" style reason. */
    public String reason() {
        Dimension d = limit.characteristic().dimension();
        String v = Units.format(value, d);
        String guard = limit.rule() == DecisionRule.GUARDED ? " (guarded acceptance limit)" : "";
        if (note != null) {
            // a note qualifies the value (its temperature, a bound only): the value itself stays in the reason
            String reads = Double.isFinite(value) && !note.startsWith("above") ? " " + v : "";
            return limit.name() + " " + note + reads + (pass ? " (" + limit.describeBounds() + ")" : ", required "
                    + limit.describeBounds());
        }
        if (value < acceptanceLower) {
            return limit.name() + " " + v + " < " + Units.format(acceptanceLower, d) + guard;
        }
        if (value > acceptanceUpper) {
            return limit.name() + " " + v + " > " + Units.format(acceptanceUpper, d) + guard;
        }
        boolean twoSided = Double.isFinite(limit.lower()) && Double.isFinite(limit.upper());
        return limit.name() + " " + v + (twoSided ? " within " : " ") + limit.describeBounds()
                + (zone == Zone.MARGINAL ? ", marginal: within U = " + Units.format(expandedUncertainty, d)
                + " of the limit" : "");
    }
}
