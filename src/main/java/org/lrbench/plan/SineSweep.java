package org.lrbench.plan;

import java.util.List;

/**
 * A sine sweep: the generator's open-circuit peak amplitude and offset, the frequencies in the
 * order measured, how many cycles each capture holds, the fewest samples per cycle, and how long to
 * wait after a frequency change before capturing.
 */
public record SineSweep(double amplitudeVolt, double offsetVolt, List<Double> frequenciesHz, int cycles,
                        int samplesPerCycle, double settleSecond) {

    public double lowestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN);
    }

    public double highestHz() {
        return frequenciesHz.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN);
    }
}
