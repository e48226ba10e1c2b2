package org.lrbench.store;

/** One lot of a part number's history: counts, yield, and mean and sample standard deviation of L and R. */
public record LotStatistics(String lot, String createdAt, String disposition, int measured, int passed,
                            double yield, Double meanInductanceH, Double sdInductanceH, Double meanResistanceOhm,
                            Double sdResistanceOhm) {
}
