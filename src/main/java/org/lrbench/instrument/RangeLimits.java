package org.lrbench.instrument;

import java.util.List;

/**
 * The smallest and largest full-scale (peak-to-peak) vertical range a digitizer channel offers, its
 * ranges when the instrument has a known set of them (ascending; empty: continuous, or not known), and
 * how it rounds a request to one of its ranges when that is declared (null: not known).
 */
public record RangeLimits(double minVolt, double maxVolt, List<Double> steps, Rounding rounding) {

    /** How an instrument turns a requested range into one of its own. */
    public enum Rounding {
        /** to the smallest range at least the request: a request is always held */
        UP,
        /** to the largest range at most the request */
        DOWN,
        /** to the range nearest the request, above or below */
        NEAREST;

        /** Whether a range granted for a request agrees with this rounding (to a part in 1e-6). */
        public boolean allows(double asked, double granted) {
            return switch (this) {
                case UP -> granted >= asked * (1 - 1e-6);
                case DOWN -> granted <= asked * (1 + 1e-6);
                case NEAREST -> true;
            };
        }
    }

    public RangeLimits(double minVolt, double maxVolt) {
        this(minVolt, maxVolt, List.of(), null);
    }

    public RangeLimits(double minVolt, double maxVolt, List<Double> steps) {
        this(minVolt, maxVolt, steps, null);
    }

    /** The same limits with the rounding the driver declares. */
    public RangeLimits withRounding(Rounding r) {
        return new RangeLimits(minVolt, maxVolt, steps, r);
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
