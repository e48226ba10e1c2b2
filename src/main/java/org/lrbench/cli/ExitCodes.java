package org.lrbench.cli;

import org.lrbench.judge.Verdict;

/** The process exit codes, as the README documents them. */
final class ExitCodes {
    static final int PASS = 0;
    static final int FAIL = 1;
    static final int BAD_INPUT = 2;
    static final int INSTRUMENT = 3;
    static final int INTERNAL = 4;
    static final int LOT_OPEN = 5;
    /** Another run holds the lot (it is measuring it now); nothing was measured. */
    static final int LOT_HELD = 6;

    private ExitCodes() {
    }

    static int of(Verdict verdict) {
        return switch (verdict) {
            case PASS -> PASS;
            case FAIL -> FAIL;
            case ERROR -> INSTRUMENT;
            // only a lot run skips a position, and a lot run exits with its disposition
            case SKIPPED -> throw new IllegalStateException("a skipped position is not a measurement of one part");
        };
    }
}
