package org.lrbench.sim.scpi;

/**
 * Thrown inside a simulated instrument when a command cannot be executed; it becomes an entry in
 * the error queue. Codes and texts are the standard ones of SCPI-1999 Volume 2, chapter 21 (from
 * memory of the standard's error list).
 */
public final class ScpiFault extends Exception {
    private static final long serialVersionUID = 1L;

    private final int code;

    public ScpiFault(int code, String text) {
        super(text);
        this.code = code;
    }

    public int code() {
        return code;
    }

    public static ScpiFault syntax(String detail) {
        return new ScpiFault(-102, "Syntax error;" + detail);
    }

    public static ScpiFault dataType(String detail) {
        return new ScpiFault(-104, "Data type error;" + detail);
    }

    public static ScpiFault parameterNotAllowed(String detail) {
        return new ScpiFault(-108, "Parameter not allowed;" + detail);
    }

    public static ScpiFault missingParameter(String detail) {
        return new ScpiFault(-109, "Missing parameter;" + detail);
    }

    public static ScpiFault undefinedHeader(String header) {
        return new ScpiFault(-113, "Undefined header;" + header);
    }

    public static ScpiFault suffixOutOfRange(String header) {
        return new ScpiFault(-114, "Header suffix out of range;" + header);
    }

    public static ScpiFault invalidSuffix(String detail) {
        return new ScpiFault(-131, "Invalid suffix;" + detail);
    }

    public static ScpiFault settingsConflict(String detail) {
        return new ScpiFault(-221, "Settings conflict;" + detail);
    }

    public static ScpiFault outOfRange(String detail) {
        return new ScpiFault(-222, "Data out of range;" + detail);
    }

    public static ScpiFault illegalValue(String detail) {
        return new ScpiFault(-224, "Illegal parameter value;" + detail);
    }

    /** SCPI-1999 -161, invalid block data. */
    public static ScpiFault invalidBlock(String detail) {
        return new ScpiFault(-161, "Invalid block data;" + detail);
    }

    public static ScpiFault stale(String detail) {
        return new ScpiFault(-230, "Data corrupt or stale;" + detail);
    }
}
