package org.lrbench.plan;

/**
 * The rules for text people type or scan that reaches file names, reports and the store: a part
 * number, a plan's description. Checked where the text enters (plan, command line, service).
 */
public final class TextRules {

    private TextRules() {
    }

    /** The longest one-line free text kept (a description, a supplier's name). */
    public static final int LINE_LENGTH = 200;

    /** The longest part number: it reaches file names, reports and the store. */
    public static final int PART_NUMBER_LENGTH = 64;

    /**
     * Why {@code text} cannot be a part number, or null when it can: printable characters only (no
     * control characters), at most {@value #PART_NUMBER_LENGTH}, no path separator and no "..".
     */
    public static String partNumberProblem(String text) {
        if (text == null) {
            return null;
        }
        if (text.isBlank() || text.length() > PART_NUMBER_LENGTH) {
            return "'" + printable(text, 40) + "' (" + text.length() + " characters): a part number is 1 to "
                    + PART_NUMBER_LENGTH + " printable characters";
        }
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (Character.isISOControl(c) || c == '/' || c == '\\') {
                return String.format(java.util.Locale.ROOT, "'%s' holds %s at position %d: a part number is printable"
                        + " characters without a path separator", printable(text, 40), Character.isISOControl(c)
                        ? String.format(java.util.Locale.ROOT, "the control character U+%04X", (int) c) : "'" + c + "'",
                        i + 1);
            }
        }
        if (text.contains("..")) {
            return "'" + text + "' holds '..': a part number may not climb out of a folder";
        }
        return null;
    }

    /** Text safe to echo: control characters as '?', cut at {@code max} characters. */
    public static String printable(String text, int max) {
        String s = text.replaceAll("\\p{Cntrl}", "?");
        return s.length() > max ? s.substring(0, max) + "..." : s;
    }

    /** Why a one-line free text (a description) cannot be kept: control characters or over 200 characters. */
    public static String lineProblem(String what, String text) {
        if (text == null || text.length() <= LINE_LENGTH && text.chars().noneMatch(Character::isISOControl)) {
            return null;
        }
        return "'" + printable(text, 40) + "': " + what + " is one line of at most " + LINE_LENGTH
                + " printable characters";
    }

}
