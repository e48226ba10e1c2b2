package org.lrbench.measure;

import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.instrument.Trace;

/**
 * One sweep point: the impedance, both channel fits, the ranges used and how many acquisitions
 * auto-ranging took, and the total harmonic distortion of the current (a distorted current reveals
 * core saturation), with the two traces it was computed from (for the trace archive).
 */
public record PointResult(ImpedancePoint impedance, SineFitResult senseFit, SineFitResult partFit,
                          double senseRangeVolt, double partRangeVolt, double sampleIntervalSecond,
                          int samples, int acquisitions, double currentThd, Trace senseTrace, Trace partTrace) {
}
