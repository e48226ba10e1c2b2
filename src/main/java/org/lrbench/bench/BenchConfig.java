package org.lrbench.bench;

import org.lrbench.sim.SimSettings;
import org.lrbench.transport.Address;
import org.lrbench.uncertainty.BenchAccuracy;

/**
 * A bench: its name, the ceiling on the generator's peak open-circuit voltage that no plan may
 * exceed, its generator and digitizer, how the simulated bench departs from ideal, the accuracy
 * specifications that enter every uncertainty budget, and its check standard (null: none).
 */
public record BenchConfig(String source, String name, double maxAmplitudeVolt, InstrumentLink generator,
                          InstrumentLink digitizer, InstrumentLink switchUnit, InstrumentLink meter,
                          SimSettings simulation, BenchAccuracy accuracy, CheckStandard checkStandard) {

    /** A bench without a check standard. */
    public BenchConfig(String source, String name, double maxAmplitudeVolt, InstrumentLink generator,
                       InstrumentLink digitizer, InstrumentLink switchUnit, InstrumentLink meter,
                       SimSettings simulation, BenchAccuracy accuracy) {
        this(source, name, maxAmplitudeVolt, generator, digitizer, switchUnit, meter, simulation, accuracy, null);
    }

    /** A bench without a switch unit. */
    public BenchConfig(String source, String name, double maxAmplitudeVolt, InstrumentLink generator,
                       InstrumentLink digitizer, SimSettings simulation, BenchAccuracy accuracy) {
        this(source, name, maxAmplitudeVolt, generator, digitizer, null, null, simulation, accuracy);
    }

    /** The same bench with other instrument addresses (null keeps an address). */
    public BenchConfig withAddresses(Address generatorAddress,
                                     Address digitizerAddress) {
        return new BenchConfig(source, name, maxAmplitudeVolt,
                generatorAddress == null ? generator : new InstrumentLink(generator.driver(), generatorAddress),
                digitizerAddress == null ? digitizer : new InstrumentLink(digitizer.driver(), digitizerAddress),
                switchUnit, meter, simulation, accuracy, checkStandard);
    }

    /**
     * Successive simulated measurements of one kind (check-standard readings, rehearsal cases) draw
     * their noise this many seeds apart: 7919, the 1000th prime, so that the series of different
     * kinds seldom land on each other's seeds.
     */
    public static final long SEED_STEP = 7919L;

    /** The bench of the {@code n}th simulated measurement of a series ({@link #SEED_STEP} apart). */
    public BenchConfig nthDraw(long n) {
        return withSeedOffset(SEED_STEP * n);
    }

    /**
     * The generator's output impedance, the source the fixture's current also flows through: the
     * simulated bench's own on the simulator, else the bench file's {@code generator.output_impedance},
     * else 50 ohm, the output of nearly every laboratory function generator (common practice, no source).
     */
    public double generatorOutputOhm() {
        boolean simulated = generator == null || "sim".equals(generator.address().scheme());
        if (simulated && simulation != null) {
            return simulation.sourceImpedanceOhm();
        }
        return generator != null && generator.outputOhm() != null ? generator.outputOhm() : 50.0;
    }

    /** The same bench with its simulation's seed moved by {@code offset} (its own noise per measurement). */
    public BenchConfig withSeedOffset(long offset) {
        return withSimulation(simulation().withSeed(simulation().seed() + offset));
    }

    public BenchConfig withSimulation(SimSettings settings) {
        return new BenchConfig(source, name, maxAmplitudeVolt, generator, digitizer, switchUnit, meter, settings, accuracy,
                checkStandard);
    }
}
