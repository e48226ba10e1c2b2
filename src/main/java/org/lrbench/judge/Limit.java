package org.lrbench.judge;

import org.lrbench.units.Units;

/**
 * A limit of the purchase specification: a characteristic, the frequency it applies at (when it
 * depends on frequency), and the closed interval [lower, upper] that passes; a one-sided limit has
 * an infinite bound. {@code spec} keeps how the plan wrote it ("1 mH +/- 10 %"); {@code rule} is the
 * decision rule, {@code guardBand} its guard band w (null: w = U of the reading), and
 * {@code characteristicClass} the class of nonconformity its failure counts in for lot sampling.
 */
public record Limit(String name, Characteristic characteristic, Double atFrequencyHz,
                    double lower, double upper, String spec, DecisionRule rule, Double guardBand,
                    CharacteristicClass characteristicClass) {

    /** A major limit under simple acceptance. */
    public Limit(String name, Characteristic characteristic, Double atFrequencyHz, double lower, double upper,
                 String spec) {
        this(name, characteristic, atFrequencyHz, lower, upper, spec, DecisionRule.SIMPLE, null, CharacteristicClass.MAJOR);
    }

    /** A major limit under a decision rule. */
    public Limit(String name, Characteristic characteristic, Double atFrequencyHz, double lower, double upper,
                 String spec, DecisionRule rule, Double guardBand) {
        this(name, characteristic, atFrequencyHz, lower, upper, spec, rule, guardBand, CharacteristicClass.MAJOR);
    }

    public boolean contains(double value) {
        return value >= lower && value <= upper;
    }

    /** Distance to the nearest bound: positive inside, negative outside. */
    public double margin(double value) {
        return Math.min(value - lower, upper - value);
    }

    public String describeBounds() {
        String lo = Double.isInfinite(lower) ? null : Units.format(lower, characteristic.dimension());
        String hi = Double.isInfinite(upper) ? null : Units.format(upper, characteristic.dimension());
        if (lo != null && hi != null) {
            return lo + " .. " + hi;
        }
        return lo != null ? ">= " + lo : "<= " + hi;
    }
}
