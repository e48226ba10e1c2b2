package org.lrbench.instrument;

import java.util.List;

/**
 * The smallest and largest full-scale (peak-to-peak) vertical range a digitizer channel offers, and its
 * ranges when the instrument has a known set of them (ascending; empty: continuous, or not known).
 */
public record RangeLimits(double minVolt, double maxVolt, List<Double> steps) {

    public RangeLimits(double minVolt, double maxVolt) {
        this(minVolt, maxVolt, List.of());
    }

    public RangeLimits {
        steps = steps == null ? List.of() : steps.stream().sorted().toList();
    }

    /** The smallest of the known ranges that is at least {@code volt}, the largest if none is; {@code volt} without steps. */
    public double stepAtLeast(double volt) {
        for (double s : steps) {
            if (s >= volt * (1 - 1e-9)) {
                return s;
            }
        }
        return steps.isEmpty() ? volt : steps.get(steps.size() - 1);
    }
}
