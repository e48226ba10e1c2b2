package org.lrbench.units;

/** Thrown when a text is not a number with a unit of the expected dimension. */
public class UnitException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public UnitException(String message) {
        super(message);
    }
}
