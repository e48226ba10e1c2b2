package org.lrbench.uncertainty;

/**
 * How an input quantity's possible values are spread, and the standard uncertainty that follows
 * from its half-width a (JCGM 100:2008, GUM 4.3.7 and 4.3.9): rectangular u = a / sqrt(3),
 * triangular u = a / sqrt(6); a normal input is given by its standard uncertainty directly.
 */
public enum Distribution {
    NORMAL(1.0),
    RECTANGULAR(Math.sqrt(3)),
    TRIANGULAR(Math.sqrt(6));

    private final double divisor;

    Distribution(double divisor) {
        this.divisor = divisor;
    }

    /** Standard uncertainty of an input of half-width {@code a} (for NORMAL, a is already u). */
    public double standardUncertainty(double a) {
        return a / divisor;
    }
}
