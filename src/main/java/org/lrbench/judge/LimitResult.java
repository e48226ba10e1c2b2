package org.lrbench.judge;

/** One limit judged: the measured value, its standard uncertainty, pass or fail, and the margin. */
public record LimitResult(Limit limit, double value, double uncertainty, boolean pass, double margin) {

    /** "winding resistance 2.71 ohm > 2.60 ohm" style reason for a failed limit. */
    public String reason() {
        var d = limit.characteristic().dimension();
        String v = org.lrbench.units.Units.format(value, d);
        if (value < limit.lower()) {
            return limit.name() + " " + v + " < " + org.lrbench.units.Units.format(limit.lower(), d);
        }
        if (value > limit.upper()) {
            return limit.name() + " " + v + " > " + org.lrbench.units.Units.format(limit.upper(), d);
        }
        boolean twoSided = Double.isFinite(limit.lower()) && Double.isFinite(limit.upper());
        return limit.name() + " " + v + (twoSided ? " within " : " ") + limit.describeBounds();
    }
}
