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

    /** Why {@code name} cannot be a lot number or serial, or null when it can. */
    public static String problem(String what, String name) {
        if (valid(name)) {
            return null;
        }
        String shown = name == null ? "nothing" : "'" + name.replace("\n", "\\n").replace("\r", "\\r") + "'";
        return what + " " + shown + ": use " + RULE;
    }

    /** The longest supplier name kept. */
    public static final int SUPPLIER_LENGTH = 200;

    /** Why {@code name} cannot be a supplier's name (one line, at most 200 characters), or null when it can. */
    public static String supplierProblem(String name) {
        if (name == null || (name.length() <= SUPPLIER_LENGTH && name.chars().noneMatch(Character::isISOControl))) {
            return null;
        }
        return "supplier: a supplier's name is one line of at most " + SUPPLIER_LENGTH + " characters";
    }
}
