package org.lrbench.plan;

import java.util.List;
import java.util.Set;
import org.lrbench.analysis.LumpedParameter;

/**
 * A sine sweep: the generator's open-circuit peak amplitude and offset, the frequencies in the
 * order measured, how many cycles each capture holds, the fewest samples per cycle, how long to
 * wait after a frequency change before capturing, the optional terms of the lumped model to try
 * (none: the series R + L model), and the current's total harmonic distortion above which a point
 * is flagged (core saturation).
 */
public record SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                        int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms,
                        double distortionLimit, boolean settleFromCircuit) {

    /** A sweep that waits its fixed settle at every point. */
    public SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                     int samplesPerCycle, double settleSecond, Set<LumpedParameter> modelTerms, double distortionLimit) {
        this(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms, distortionLimit,
                false);
    }

    /** The same sweep with the settle taken from the circuit (the plan's settle the ceiling) or fixed. */
    public SineSweep withSettleFromCircuit(boolean fromCircuit) {
        return new SineSweep(amplitudeVolt, offsetVolt, frequenciesHz, cycles, samplesPerCycle, settleSecond, modelTerms,
                distortionLimit, fromCircuit);
    }

    public double lowestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN);
    }

    public double highestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN);
    }
}
