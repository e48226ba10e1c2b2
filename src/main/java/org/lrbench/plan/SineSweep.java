package org.lrbench.plan;

import java.util.List;
import java.util.Set;
import org.lrbench.analysis.LumpedParameter;

/**
 * A sine sweep: the generator's open-circuit peak amplitude and offset, the frequencies in the
 * order measured, how many cycles each capture holds, the fewest samples per cycle, how long to
 * wait after a frequency change before capturing, the optional terms of the lumped model to try
 * (none: the series R + L model), the current's total harmonic distortion above which a point
 * is flagged (core saturation), and the excitation: one frequency after another (stepped), or all
 * at once as a multisine whose tones lie within {@code multisineTolerance} (relative) of the
 * requested frequencies; a multisine capture holds {@code cycles} cycles of its lowest tone, in
 * whole periods, at {@code samplesPerCycle} samples per cycle of its lowest tone and no fewer than
 * ten per cycle of its highest. {@code excitationOpen}: the plan left the excitation to lrbench
 * ({@code excitation: auto}, or no excitation key); such a sweep is stepped until
 * {@code org.lrbench.rehearsal.ExcitationChoice} chooses for a bench.
 */
public record SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                        int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms,
                        double distortionLimit, boolean settleFromCircuit, boolean multisine,
                        double multisineTolerance, boolean excitationOpen) {

    /** A sweep whose excitation is given (stepped or multisine). */
    public SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                     int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms, double distortionLimit,
                     boolean settleFromCircuit, boolean multisine, double multisineTolerance) {
        this(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms, distortionLimit,
                settleFromCircuit, multisine, multisineTolerance, false);
    }

    /** The tolerance a multisine's tones keep from the requested frequencies when the plan gives none. */
    public static final double DEFAULT_MULTISINE_TOLERANCE = 0.02;

    /** A stepped sweep. */
    public SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                     int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms, double distortionLimit,
                     boolean settleFromCircuit) {
        this(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms, distortionLimit,
                settleFromCircuit, false, DEFAULT_MULTISINE_TOLERANCE);
    }

    /** A sweep that waits its fixed settle at every point. */
    public SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                     int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms, double distortionLimit) {
        this(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms, distortionLimit,
                false);
    }

    /** The same sweep with the settle taken from the circuit (the plan's settle the ceiling) or fixed. */
    public SineSweep withSettleFromCircuit(boolean fromCircuit) {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, fromCircuit, multisine, multisineTolerance, excitationOpen);
    }

    /** The same sweep with its multisine's tones within {@code tolerance} (relative) of their requests. */
    public SineSweep withMultisineTolerance(double tolerance) {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, settleFromCircuit, multisine, tolerance, excitationOpen);
    }

    /** The same sweep at other frequencies, in the order given. */
    public SineSweep withFrequencies(List<Double> frequencies) {
        return new SineSweep(amplitudeVolt, offsetVolt, List.copyOf(frequencies), cycles, samplesPerCycle, settleSecond,
                modelTerms, distortionLimit, settleFromCircuit, multisine, multisineTolerance, excitationOpen);
    }

    /** The same sweep with this many cycles in each capture. */
    public SineSweep withCycles(int count) {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, count, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, settleFromCircuit, multisine, multisineTolerance, excitationOpen);
    }

    /** The same sweep with its excitation left to lrbench, as {@code excitation: auto}: stepped until chosen. */
    public SineSweep withExcitationOpen() {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, settleFromCircuit, false, multisineTolerance, true);
    }

    /** The same sweep stepped, or as one multisine: the excitation given, no longer open. */
    public SineSweep withMultisine(boolean asMultisine) {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, settleFromCircuit, asMultisine, multisineTolerance, false);
    }

    /**
     * The generator's peak open-circuit voltage (EMF) this sweep asks for: amplitude plus |offset|.
     * The one place it is worked out; the bench's {@code max_amplitude} ceiling is on this value.
     */
    public double peakEmfVolt() {
        return amplitudeVolt + Math.abs(offsetVolt);
    }

    public double lowestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN);
    }

    public double highestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN);
    }
}
