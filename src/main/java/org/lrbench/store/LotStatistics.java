package org.lrbench.store;

import org.lrbench.sampling.LotDisposition;

/**
 * One inspection of a part number's history: counts, yield, and mean and sample standard deviation
 * of L and R over the attempts that count.
 */
public record LotStatistics(String lot, int round, String createdAt, LotDisposition.State disposition, int measured, int passed,
                            double yield, Double meanInductanceH, Double sdInductanceH, Double meanResistanceOhm,
                            Double sdResistanceOhm) {
}
