package org.lrbench.plan;

/**
 * The optional time-domain check: a triangle wave of this open-circuit peak amplitude and frequency,
 * captured over so many cycles at so many samples per cycle, the current fitted with so many
 * harmonics before R and L are regressed.
 */
public record TriangleCheck(double amplitudeVolt, double frequencyHz, int cycles, int samplesPerCycle, int harmonics) {
}
