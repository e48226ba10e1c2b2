package org.lrbench.measure;

import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.plan.SineSweep;

/**
 * How long to wait at a sweep point before capturing. With the plan's fixed rule, its settle.
 * With the circuit rule, the decay of the step a frequency change leaves in the loop: the part's
 * inductance (from the previous point) over the loop's resistance (sense resistor plus the part's
 * own; the generator's output resistance left out, which only lengthens the wait) gives the time
 * constant tau, and the wait is 14 tau, after which the step has decayed below 1e-6 of itself
 * (e^-14 = 8e-7), or the generator's declared settling if that is longer; never more than the plan's
 * settle, which is the ceiling. Before the first point, and above self-resonance, where the
 * previous point does not show an inductor, the plan's settle applies.
 */
public final class Settle {
    /** Time constants to wait: e^-14 < 1e-6 (common practice, no source). */
    static final double TIME_CONSTANTS = 14;

    private Settle() {
    }

    public static double seconds(SineSweep sweep, double senseOhm, ImpedancePoint previous, double generatorSettleSecond) {
        double ceiling = sweep.settleSecond();
        if (!sweep.settleFromCircuit()) {
            return ceiling;
        }
        if (previous == null || !(previous.reactanceOhm() > 0) || !Double.isFinite(previous.resistanceOhm())) {
            return ceiling;
        }
        double inductance = previous.inductanceHenry();
        double loop = senseOhm + Math.max(0, previous.resistanceOhm());
        double tau = inductance / loop;
        return Math.min(ceiling, Math.max(generatorSettleSecond, TIME_CONSTANTS * tau));
    }
}
