package org.lrbench.measure;

import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;

/**
 * What every stage of one sweep shares: the instruments, the bench clock, what is remembered from
 * the part before on instruments kept open (null: nothing), whether the fixture is open, and whether
 * each stepped point's sines are fitted at the frequency its record shows (the corrections' long records).
 */
record SweepBench(Generator generator, Digitizer digitizer, BenchClock clock, RangeMemory memory, boolean openCircuit,
                  boolean frequencyFromRecord) {

    /** What is left of a settle that started at {@code since} (the bench clock's time). */
    double remaining(double settleSecond, long since) {
        return clock.remaining(settleSecond, since);
    }
}
