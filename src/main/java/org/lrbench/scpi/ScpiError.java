package org.lrbench.scpi;

/** One entry of an instrument's error queue as {@code SYSTem:ERRor?} reports it: code and text. */
public record ScpiError(int code, String text) {

    /** Parses {@code -113,"Undefined header"}; a code of 0 means the queue is empty. */
    public static ScpiError parse(String reply) {
        String t = reply.trim();
        int comma = t.indexOf(',');
        String codeText = comma < 0 ? t : t.substring(0, comma).trim();
        String text = comma < 0 ? "" : t.substring(comma + 1).trim();
        if (text.length() >= 2 && text.startsWith("\"") && text.endsWith("\"")) {
            text = text.substring(1, text.length() - 1);
        }
        try {
            return new ScpiError(Integer.parseInt(codeText.startsWith("+") ? codeText.substring(1) : codeText), text);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("error query reply '" + t + "' does not start with an error number");
        }
    }

    public boolean isNoError() {
        return code == 0;
    }

    @Override
    public String toString() {
        return code + ",\"" + text + "\"";
    }
}
