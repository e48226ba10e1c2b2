package org.lrbench.judge;

import java.util.Locale;

/** A part's verdict. ERROR means the measurement did not complete; it is never a pass. */
public enum Verdict {
    PASS, FAIL, ERROR;

    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }
}
