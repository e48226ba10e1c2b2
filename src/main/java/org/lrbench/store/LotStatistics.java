package org.lrbench.store;

/**
 * One inspection of a part number's history: counts, yield, and mean and sample standard deviation
 * of L and R over the attempts that count.
 */
public record LotStatistics(String lot, int round, String createdAt, String disposition, int measured, int passed,
                            double yield, Double meanInductanceH, Double sdInductanceH, Double meanResistanceOhm,
                            Double sdResistanceOhm) {
}
