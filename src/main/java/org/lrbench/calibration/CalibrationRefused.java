package org.lrbench.calibration;

import java.util.List;

/**
 * Corrections that the bench cannot physically have (channels whose gains or timing differ more than
 * their accuracies allow, a "short" or "open" that is a part): refused with the values found and what
 * was probably not rewired; nothing is stored.
 */
public final class CalibrationRefused extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public CalibrationRefused(String what, List<String> problems, String hint) {
        super(what + " refused, nothing stored: " + String.join("; ", problems) + ". " + hint);
    }
}
