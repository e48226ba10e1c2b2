package org.lrbench.scpi;

import java.util.ArrayList;
import java.util.List;

/** Splits a response message into its response message units (IEEE 488.2: separated by ';'). */
public final class ScpiReplies {

    private ScpiReplies() {
    }

    /** Splits at ';' outside double-quoted strings; units are trimmed. */
    public static List<String> split(String reply) {
        List<String> units = new ArrayList<>();
        StringBuilder current = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < reply.length(); i++) {
            char c = reply.charAt(i);
            if (c == '"') {
                quoted = !quoted;
            }
            if (c == ';' && !quoted) {
                units.add(current.toString().trim());
                current.setLength(0);
            } else {
                current.append(c);
            }
        }
        units.add(current.toString().trim());
        return units;
    }
}
