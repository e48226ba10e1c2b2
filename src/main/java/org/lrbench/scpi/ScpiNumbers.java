package org.lrbench.scpi;

import java.util.Locale;

/**
 * Formats values for SCPI program messages as IEEE 488.2 decimal numeric data: NR1 (integers) and
 * NR3 (mantissa and exponent). Only finite numbers are accepted, so nothing but digits, a sign, a
 * point and an exponent can reach an instrument through a number.
 */
public final class ScpiNumbers {

    private ScpiNumbers() {
    }

    public static String nr1(long value) {
        return Long.toString(value);
    }

    public static String nr3(double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("cannot send " + value + " to an instrument: not a finite number");
        }
        return String.format(Locale.ROOT, "%.9E", value);
    }

    /** Parses a numeric reply (NR1, NR2 or NR3); throws with the reply text on anything else. */
    public static double parse(String reply) {
        String t = reply.trim();
        if (!t.matches("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?")) {
            throw new NumberFormatException("'" + t + "' is not a SCPI number");
        }
        return Double.parseDouble(t);
    }
}
