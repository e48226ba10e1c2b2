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
        return oneLine(what, text, LINE_LENGTH);
    }

    /** The longest operator's name kept. */
    public static final int OPERATOR_LENGTH = 64;

    /**
     * Why {@code text} cannot be kept as {@code what}, one line of 1 to {@code max} printable characters,
     * or null when it can (null text is for the caller to require). The message names the offending
     * character and its position, as a control character's code (it would not show).
     */
    public static String oneLine(String what, String text, int max) {
        if (text == null) {
            return null;
        }
        if (text.isBlank() || text.length() > max) {
            return "'" + printable(text, 40) + "' (" + text.length() + " characters): " + what + " is one line of 1 to "
                    + max + " printable characters";
        }
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (Character.isISOControl(c) || Character.getType(c) == Character.LINE_SEPARATOR
                    || Character.getType(c) == Character.PARAGRAPH_SEPARATOR) {
                return String.format(java.util.Locale.ROOT, "'%s' holds the control character U+%04X at position %d: %s"
                        + " is one line of printable characters", printable(text, 40), (int) c, i + 1, what);
            }
        }
        return null;
    }
}
