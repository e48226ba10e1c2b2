package org.lrbench.instrument;

/** A digitizer time base as the instrument actually set it: sample interval and record length. */
public record Timing(double sampleIntervalSecond, int points) {
}
