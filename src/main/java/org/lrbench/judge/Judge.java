package org.lrbench.judge;

import java.util.ArrayList;
import java.util.List;
import org.lrbench.analysis.SeriesModel;

/**
 * Judges the plan's limits on the fitted sweep model (simple acceptance: a value on or inside a
 * bound passes). L and R come straight from the series model; Q is the model's 2 pi f L / R at the
 * limit's frequency.
 */
public final class Judge {

    private Judge() {
    }

    public static List<LimitResult> judge(List<Limit> limits, SeriesModel model) {
        List<LimitResult> out = new ArrayList<>();
        for (Limit limit : limits) {
            double value;
            double u;
            switch (limit.characteristic()) {
                case INDUCTANCE -> {
                    value = model.inductanceHenry();
                    u = model.inductanceUncertaintyHenry();
                }
                case SERIES_RESISTANCE -> {
                    value = model.resistanceOhm();
                    u = model.resistanceUncertaintyOhm();
                }
                case QUALITY_FACTOR -> {
                    value = model.qualityFactor(limit.atFrequencyHz());
                    double relL = model.inductanceUncertaintyHenry() / model.inductanceHenry();
                    double relR = model.resistanceUncertaintyOhm() / model.resistanceOhm();
                    u = Math.abs(value) * Math.hypot(relL, relR);
                }
                default -> throw new IllegalStateException(limit.characteristic().toString());
            }
            boolean pass = Double.isFinite(value) && limit.contains(value);
            out.add(new LimitResult(limit, value, u, pass, limit.margin(value)));
        }
        return out;
    }

    /** Pass when every limit passes; fail otherwise. */
    public static Verdict verdict(List<LimitResult> results) {
        return results.stream().allMatch(LimitResult::pass) ? Verdict.PASS : Verdict.FAIL;
    }
}
