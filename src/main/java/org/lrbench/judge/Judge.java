package org.lrbench.judge;

import java.util.ArrayList;
import java.util.List;

/**
 * Judges readings against limits under each limit's decision rule. Simple acceptance passes a
 * reading on or inside a tolerance limit; guarded acceptance (ILAC-G8:09/2019, w = U by default)
 * passes it only inside the acceptance limits, the tolerance limits moved inward by w.
 */
public final class Judge {

    private Judge() {
    }

    /** A reading of one limit's characteristic with its standard and expanded uncertainty. */
    public record Reading(double value, double uncertainty, double expandedUncertainty, String note) {

        public Reading(double value, double uncertainty, double expandedUncertainty) {
            this(value, uncertainty, expandedUncertainty, null);
        }
    }

    public static LimitResult judge(Limit limit, Reading reading) {
        double w = limit.rule() == DecisionRule.GUARDED
                ? (limit.guardBand() != null ? limit.guardBand() : reading.expandedUncertainty())
                : 0.0;
        double lo = limit.lower() + w;
        double hi = limit.upper() - w;
        double v = reading.value();
        boolean pass = Double.isFinite(v) && v >= lo && v <= hi;
        Zone zone;
        if (!pass) {
            zone = Zone.OUTSIDE;
        } else {
            double u = reading.expandedUncertainty();
            zone = (v - u < limit.lower() || v + u > limit.upper()) ? Zone.MARGINAL : Zone.CLEAR;
        }
        return new LimitResult(limit, v, reading.uncertainty(), reading.expandedUncertainty(), lo, hi, zone, pass,
                Math.min(v - lo, hi - v), reading.note());
    }

    public static List<LimitResult> judge(List<Limit> limits, List<Reading> readings) {
        List<LimitResult> out = new ArrayList<>();
        for (int i = 0; i < limits.size(); i++) {
            out.add(judge(limits.get(i), readings.get(i)));
        }
        return out;
    }

    /** Pass when every limit passes; fail otherwise. */
    public static Verdict verdict(List<LimitResult> results) {
        return results.stream().allMatch(LimitResult::pass) ? Verdict.PASS : Verdict.FAIL;
    }
}
