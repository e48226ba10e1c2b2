package org.lrbench.results;

import java.util.regex.Pattern;

/**
 * Lot numbers and serials become folder and file names of the records, so they are checked in one
 * place, wherever they come from (command line, scanner, service, tray and lot files): 1 to 64
 * letters, digits, '.', '_' or '-', starting with a letter or digit. No path separator, no '~'
 * (it marks attempt numbers in file names), nothing a shell or a SCPI message would read as syntax.
 */
public final class Names {
    private static final Pattern NAME = Pattern.compile("[A-Za-z0-9][A-Za-z0-9._-]{0,63}");
    public static final String RULE = "1 to 64 letters, digits, '.', '_' or '-', starting with a letter or digit";

    private Names() {
    }

    public static boolean valid(String name) {
        return name != null && NAME.matcher(name).matches();
    }

    /**
     * Why {@code name} cannot be a lot number or serial, or null when it can; the first character outside
     * the rule is named with its position (a control character by its code).
     */
    public static String problem(String what, String name) {
        if (valid(name)) {
            return null;
        }
        String shown = name == null ? "nothing" : "'" + org.lrbench.plan.TextRules.printable(name, 40) + "'";
        String where = "";
        if (name != null && name.length() > 64) {
            where = " (" + name.length() + " characters)";
        } else if (name != null && !name.isEmpty()) {
            for (int i = 0; i < name.length(); i++) {
                char c = name.charAt(i);
                boolean ok = Character.isLetterOrDigit(c) && c < 128 || i > 0 && (c == '.' || c == '_' || c == '-');
                if (!ok) {
                    where = String.format(java.util.Locale.ROOT, " (%s at position %d)", c >= 0x20 && c < 0x7f
                            ? "'" + c + "'" : String.format(java.util.Locale.ROOT, "U+%04X", (int) c), i + 1);
                    break;
                }
            }
        }
        return what + " " + shown + where + ": use " + RULE;
    }

    /** Why {@code name} cannot be an operator's name (one line of 1 to 64 printable characters), or null. */
    public static String operatorProblem(String name) {
        return keyed("operator", org.lrbench.plan.TextRules.oneLine("an operator's name", name,
                org.lrbench.plan.TextRules.OPERATOR_LENGTH));
    }

    /** Why {@code text} cannot be a reason kept with a record (one line of 1 to 200 printable characters), or null. */
    public static String reasonProblem(String key, String text) {
        return keyed(key, org.lrbench.plan.TextRules.oneLine("a reason", text, org.lrbench.plan.TextRules.LINE_LENGTH));
    }

    private static String keyed(String key, String problem) {
        return problem == null ? null : key + ": " + problem;
    }

    /** The longest supplier name kept. */
    public static final int SUPPLIER_LENGTH = 200;

    /** Why {@code name} cannot be a supplier's name (one line, at most 200 characters), or null when it can. */
    public static String supplierProblem(String name) {
        if (name != null && name.isBlank()) {
            return null; // no supplier named: the scheme of parts without one
        }
        return keyed("supplier", org.lrbench.plan.TextRules.oneLine("a supplier's name", name, SUPPLIER_LENGTH));
    }
}
