package org.lrbench.measure;

import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.Quantization;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.instrument.Trace;

/**
 * One sweep point: the impedance, both channel fits, the ranges used and how many acquisitions
 * auto-ranging took, and the total harmonic distortion of the current (a distorted current reveals
 * core saturation), with the two traces it was computed from (for the trace archive).
 */
public record PointResult(ImpedancePoint impedance, SineFitResult senseFit, SineFitResult partFit,
                          double senseRangeVolt, double partRangeVolt, double sampleIntervalSecond,
                          int samples, int acquisitions, double currentThd, Trace senseTrace, Trace partTrace,
                          Quantization.Correction senseQuantization, Quantization.Correction partQuantization) {

    /** A point without quantization corrections (read back from a record that has none). */
    public PointResult(ImpedancePoint impedance, SineFitResult senseFit, SineFitResult partFit, double senseRangeVolt,
                       double partRangeVolt, double sampleIntervalSecond, int samples, int acquisitions,
                       double currentThd, Trace senseTrace, Trace partTrace) {
        this(impedance, senseFit, partFit, senseRangeVolt, partRangeVolt, sampleIntervalSecond, samples, acquisitions,
                currentThd, senseTrace, partTrace, Quantization.Correction.NONE, Quantization.Correction.NONE);
    }

    /**
     * The relative standard uncertainty of the impedance from the two channels' quantization
     * corrections: systematic, since the same signal on the same range gives the same correction.
     */
    public double quantizationRelativeUncertainty() {
        return Math.hypot(senseQuantization.gainUncertainty() / senseQuantization.gain(),
                partQuantization.gainUncertainty() / partQuantization.gain());
    }
}
