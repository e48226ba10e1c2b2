package org.lrbench.sampling;

import java.math.BigDecimal;
import java.util.Locale;
import java.util.Map;
import org.lrbench.judge.CharacteristicClass;

/** A plan's sampling: the inspection level and the AQL (percent nonconforming) of each class it uses. */
public record SamplingScheme(InspectionLevel level, Map<CharacteristicClass, Double> aql) {

    /**
     * The scheme as one line that is the same for the same scheme, for a lot's stored terms:
     * "level II; AQL critical 0.065, major 1.0" (classes in their declared order).
     */
    public String describe() {
        StringBuilder s = new StringBuilder("level ").append(level.name()).append("; AQL");
        String sep = " ";
        for (CharacteristicClass c : CharacteristicClass.values()) {
            Double a = aql.get(c);
            if (a != null) {
                s.append(sep).append(c.name().toLowerCase(Locale.ROOT)).append(' ')
                        .append(BigDecimal.valueOf(a).stripTrailingZeros().toPlainString());
                sep = ", ";
            }
        }
        return s.toString();
    }
}
