package org.lrbench.units;

/**
 * A number in SI base units with its dimension. {@code relative} marks a value written in percent
 * (a fraction of something else, such as a tolerance of a nominal value).
 */
public record Quantity(double value, Dimension dimension, boolean relative) {

    public static Quantity of(double value, Dimension dimension) {
        return new Quantity(value, dimension, false);
    }

    @Override
    public String toString() {
        return relative ? (value * 100) + " %" : Units.format(value, dimension);
    }
}
