package org.lrbench.yaml;

/** One problem found in an input file, printed as {@code file:line:column: key: message}. */
public record Problem(String file, int line, int column, String key, String message) {

    @Override
    public String toString() {
        return file + ":" + line + ":" + column + ": " + key + ": " + message;
    }
}
