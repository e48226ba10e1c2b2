package org.lrbench.instrument;

/** The smallest and largest full-scale (peak-to-peak) vertical range a digitizer channel offers. */
public record RangeLimits(double minVolt, double maxVolt) {
}
