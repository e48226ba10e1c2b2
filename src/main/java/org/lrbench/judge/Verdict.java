package org.lrbench.judge;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonValue;
import java.util.Locale;

/**
 * A part's verdict. ERROR means the measurement did not complete; it is never a pass. SKIPPED is a
 * position of the sample the operator passed over: nothing was measured and it never counts as
 * measured.
 */
public enum Verdict {
    PASS, FAIL, ERROR, SKIPPED;

    @JsonValue
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The verdict a record's word names; anything else is refused, naming the word. */
    @JsonCreator
    public static Verdict of(String word) {
        for (Verdict v : values()) {
            if (v.word().equals(word)) {
                return v;
            }
        }
        throw new IllegalArgumentException("verdict '" + word + "': one of pass, fail, error, skipped");
    }

    /** Whether the part was judged on a measurement (pass or fail), as the sample counts it. */
    public boolean judged() {
        return this == PASS || this == FAIL;
    }
}
