package org.lrbench.run;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.Evaluation;
import org.lrbench.analysis.LumpedModel;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.judge.Limit;

/**
 * What each characteristic reads from the fitted lumped model. Inductance at a frequency is the
 * apparent (series-equivalent) inductance Im(Z) / w there, without one the model's L; winding
 * resistance is R_dc; Q at a frequency is Im(Z) / Re(Z); self-resonance is 1 / (2 pi sqrt(L C_p)).
 */
final class Readings {
    static final String INDUCTANCE = "inductance";
    static final String RESISTANCE = "series_resistance_dc";

    private Readings() {
    }

    /** The model's L and R_dc first, then one evaluation per limit (named after the limit). */
    static List<Evaluation> evaluations(List<Limit> limits) {
        List<Evaluation> out = new ArrayList<>();
        out.add(new Evaluation(INDUCTANCE, "H", p -> LumpedParameter.L.in(p)));
        out.add(new Evaluation(RESISTANCE, "ohm", p -> LumpedParameter.R_DC.in(p)));
        for (Limit l : limits) {
            out.add(of(l));
        }
        return out;
    }

    static Evaluation of(Limit limit) {
        Double at = limit.atFrequencyHz();
        return switch (limit.characteristic()) {
            case INDUCTANCE -> new Evaluation(limit.name(), "H",
                    at == null ? p -> LumpedParameter.L.in(p) : p -> LumpedModel.apparentInductance(p, at));
            case SERIES_RESISTANCE -> new Evaluation(limit.name(), "ohm", p -> LumpedParameter.R_DC.in(p));
            case QUALITY_FACTOR -> new Evaluation(limit.name(), "", p -> {
                Complex z = LumpedModel.impedance(p, at);
                return z.getImaginary() / z.getReal();
            });
            case SELF_RESONANCE -> new Evaluation(limit.name(), "Hz", p -> LumpedModel.selfResonanceHz(LumpedParameter.L.in(p), LumpedParameter.C_P.in(p)));
        };
    }
}
