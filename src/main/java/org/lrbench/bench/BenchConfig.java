package org.lrbench.bench;

import org.lrbench.sim.SimSettings;

/**
 * A bench: its name, the ceiling on the generator's peak open-circuit voltage that no plan may
 * exceed, its generator and digitizer, and how the simulated bench departs from ideal.
 */
public record BenchConfig(String source, String name, double maxAmplitudeVolt, InstrumentLink generator,
                          InstrumentLink digitizer, SimSettings simulation) {

    public BenchConfig withSimulation(SimSettings settings) {
        return new BenchConfig(source, name, maxAmplitudeVolt, generator, digitizer, settings);
    }
}
