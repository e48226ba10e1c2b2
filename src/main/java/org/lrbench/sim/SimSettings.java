package org.lrbench.sim;

/**
 * How the simulated bench departs from ideal: the generator's output impedance, the digitizer's
 * input noise (RMS volts, white and Gaussian, per channel), its converter resolution in bits
 * (0 for an ideal converter with no quantization), the random seed that makes runs repeatable,
 * channel 2's gain error (relative) and time skew against channel 1, and the fixture's parasitics:
 * lead resistance and inductance in series with the part, stray capacitance across it; and the
 * resistance of each multimeter test lead; and which simulated digitizer and generator (their personalities:
 * dialect, range set, scaling, resolution, levels) the bench has, and how long its instruments take;
 * and how far the sense resistor is off its nominal value (relative: the plan's nominal is all lrbench
 * knows until a meter traces it); how far each digitizer channel's gain may differ from one front-end
 * stage to another ({@code rangeGainSpread}, the half-width each stage's error is drawn within); and how
 * far the multimeter's resistance readings are off (relative).
 */
public record SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                          double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                          double leadInductanceHenry, double strayCapacitanceFarad, double meterLeadOhm,
                          SimDigitizer.Personality digitizer, SimGenerator.Personality generator, SimTiming timing,
                          double senseError, double rangeGainSpread, double meterError, long errorSeed) {

    /** Each channel's gain the same on every range, and a meter that reads true. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                       double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                       double leadInductanceHenry, double strayCapacitanceFarad, double meterLeadOhm,
                       SimDigitizer.Personality digitizer, SimGenerator.Personality generator, SimTiming timing,
                       double senseError) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError, channel2SkewSecond,
                leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer, generator, timing,
                senseError, 0, 0, seed);
    }

    /** A sense resistor exactly at its nominal value. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                       double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                       double leadInductanceHenry, double strayCapacitanceFarad, double meterLeadOhm,
                       SimDigitizer.Personality digitizer, SimGenerator.Personality generator, SimTiming timing) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError, channel2SkewSecond,
                leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer, generator, timing, 0);
    }

    /** The same bench with its sense resistor off its nominal value by {@code e} (relative). */
    public SimSettings withSenseError(double e) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, timing, e, rangeGainSpread, meterError, errorSeed);
    }

    /** Instruments that answer at once. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                       double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                       double leadInductanceHenry, double strayCapacitanceFarad, double meterLeadOhm,
                       SimDigitizer.Personality digitizer, SimGenerator.Personality generator) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError, channel2SkewSecond,
                leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer, generator,
                SimTiming.NONE);
    }

    /** The generic digitizer. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                       double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                       double leadInductanceHenry, double strayCapacitanceFarad, double meterLeadOhm) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError, channel2SkewSecond,
                leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, SimDigitizer.Personality.GENERIC,
                SimGenerator.Personality.GENERIC);
    }

    /** 50 mohm per multimeter test lead. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed,
                       double channel2GainError, double channel2SkewSecond, double leadResistanceOhm,
                       double leadInductanceHenry, double strayCapacitanceFarad) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError, channel2SkewSecond,
                leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, 0.05);
    }

    /** An ideal fixture and matched channels. */
    public SimSettings(double sourceImpedanceOhm, double noiseVoltRms, int resolutionBits, long seed) {
        this(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, 0, 0, 0, 0, 0);
    }

    /** 50 ohm generator output (common practice, no source), 0.5 mV noise, 8 bits, seed 1, no imperfections. */
    public static SimSettings defaults() {
        return new SimSettings(50.0, 0.5e-3, 8, 1L);
    }

    /** The same bench with another seed for its noise (its drawn imperfections stay: {@link #errorSeed}). */
    public SimSettings withSeed(long newSeed) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, newSeed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, timing, senseError, rangeGainSpread, meterError, errorSeed);
    }

    /** The same bench with another simulated digitizer personality. */
    public SimSettings withDigitizer(SimDigitizer.Personality p) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, p, generator,
                timing, senseError, rangeGainSpread, meterError, errorSeed);
    }

    /** The same bench with another simulated generator personality. */
    public SimSettings withGenerator(SimGenerator.Personality p) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer, p,
                timing, senseError, rangeGainSpread, meterError, errorSeed);
    }

    /** The same bench with instruments that take this long. */
    public SimSettings withTiming(SimTiming t) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, t, senseError, rangeGainSpread, meterError, errorSeed);
    }

    /**
     * The same bench with each digitizer channel's gain on each of its front-end stages off by a
     * value drawn from the seed, uniformly within +/- {@code spread} (relative).
     */
    public SimSettings withRangeGainSpread(double spread) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, timing, senseError, spread, meterError, errorSeed);
    }

    /**
     * The same bench with its drawn imperfections (the stages' gains) drawn from {@code errorSeed}: a
     * bench keeps them when only its noise's seed changes ({@link #withSeed}).
     */
    public SimSettings withErrorSeed(long errorSeed) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, timing, senseError, rangeGainSpread, meterError, errorSeed);
    }

    /** The same bench with a multimeter whose resistance readings are off by {@code e} (relative). */
    public SimSettings withMeterError(double e) {
        return new SimSettings(sourceImpedanceOhm, noiseVoltRms, resolutionBits, seed, channel2GainError,
                channel2SkewSecond, leadResistanceOhm, leadInductanceHenry, strayCapacitanceFarad, meterLeadOhm, digitizer,
                generator, timing, senseError, rangeGainSpread, e, errorSeed);
    }
}
