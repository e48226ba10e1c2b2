package org.lrbench.sampling;

import java.util.Locale;

/**
 * How strictly a supplier's lots are inspected under ISO 2859-1 (clause 9): normal inspection
 * (Table II-A), tightened (Table II-B), reduced (Table II-C), or discontinued (no lot is inspected
 * until a recorded decision restarts inspection, at tightened).
 */
public enum Severity {
    NORMAL, TIGHTENED, REDUCED, DISCONTINUED;

    /** The lower-case word records and pages use: normal, tightened, reduced, discontinued. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The severity a word names, or null. */
    public static Severity of(String word) {
        if (word == null) {
            return null;
        }
        for (Severity s : values()) {
            if (s.word().equals(word.trim().toLowerCase(Locale.ROOT))) {
                return s;
            }
        }
        return null;
    }
}
