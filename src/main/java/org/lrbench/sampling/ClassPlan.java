package org.lrbench.sampling;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.judge.CharacteristicClass;

/**
 * The sampling plan one class of a lot is inspected under, as a lot's terms keep it: the class, the
 * severity, and the plan (level, AQL, code letter, sample size, Ac, Re) the standard's table gave for
 * the lot size. Kept as data with the terms, so the report shows what was used without working it out
 * again from text.
 */
public record ClassPlan(CharacteristicClass characteristicClass, Severity severity, SamplingPlan plan) {

    /** The plan of every class the scheme names, for this lot size, in the classes' declared order. */
    public static List<ClassPlan> of(int lotSize, SamplingScheme scheme) {
        List<ClassPlan> out = new ArrayList<>();
        LotDisposition.plans(lotSize, scheme).forEach((c, p) -> out.add(new ClassPlan(c, scheme.severity(), p)));
        return List.copyOf(out);
    }

    /** The class as records write it: critical, major, minor. */
    public String classWord() {
        return characteristicClass.name().toLowerCase(Locale.ROOT);
    }
}
