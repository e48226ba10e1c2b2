package org.lrbench.units;

/** The physical dimensions lrbench reads from plans and part files, each with its SI unit symbol. */
public enum Dimension {
    NONE(""),
    VOLTAGE("V"),
    CURRENT("A"),
    RESISTANCE("ohm"),
    INDUCTANCE("H"),
    CAPACITANCE("F"),
    FREQUENCY("Hz"),
    TIME("s"),
    LENGTH("m"),
    /** Temperature in degrees Celsius (not kelvin): the unit inspection records use. */
    TEMPERATURE("C");

    private final String symbol;

    Dimension(String symbol) {
        this.symbol = symbol;
    }

    /** The SI unit symbol, empty for a plain number. */
    public String symbol() {
        return symbol;
    }

    /** A name for messages: "voltage (V)", or "a plain number". */
    public String describe() {
        return this == NONE ? "a plain number" : name().toLowerCase() + " (" + symbol + ")";
    }
}
