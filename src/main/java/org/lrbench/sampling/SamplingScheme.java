package org.lrbench.sampling;

import java.math.BigDecimal;
import java.util.Locale;
import java.util.Map;
import org.lrbench.judge.CharacteristicClass;

/**
 * A plan's sampling: the inspection level and the AQL (percent nonconforming) of each class it
 * uses, and the severity a lot is inspected under with the table that gives its plans (null for
 * normal inspection, whose Table II-A is built in; the lab's transcription of Table II-B or II-C
 * otherwise).
 */
public record SamplingScheme(InspectionLevel level, Map<CharacteristicClass, Double> aql, Severity severity,
                             SeverityTable table) {

    public SamplingScheme {
        if (severity == Severity.DISCONTINUED) {
            throw new IllegalArgumentException("no lot is inspected while inspection is discontinued");
        }
        if (severity != Severity.NORMAL && (table == null || table.severity() != severity)) {
            throw new IllegalArgumentException(severity.word() + " inspection needs its own table");
        }
    }

    /** Normal inspection, as a plan states it. */
    public SamplingScheme(InspectionLevel level, Map<CharacteristicClass, Double> aql) {
        this(level, aql, Severity.NORMAL, null);
    }

    /** The same level and AQLs under another severity, with its table (null for normal). */
    public SamplingScheme under(Severity s, SeverityTable t) {
        return new SamplingScheme(level, aql, s, s == Severity.NORMAL ? null : t);
    }

    /**
     * The scheme as one line that is the same for the same scheme, for a lot's stored terms:
     * "level II; AQL critical 0.065, major 1.0" (classes in their declared order), followed by
     * "; tightened inspection" or "; reduced inspection" when not normal.
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
        if (severity != Severity.NORMAL) {
            s.append("; ").append(severity.word()).append(" inspection");
        }
        return s.toString();
    }
}
