package org.lrbench.driver;

/**
 * What a driver file declares its instrument can do, so a plan that asks more is refused before a
 * run (null: not declared). Sources: the frequency range and the highest peak open-circuit EMF
 * (amplitude plus the offset's magnitude) and the longest arbitrary waveform. Digitizers: the
 * shortest sample interval and the longest record.
 */
public record InstrumentLimits(Double minFrequencyHz, Double maxFrequencyHz, Double maxEmfPeakVolt,
                               Double minIntervalSecond, Integer maxRecordLength, Integer maxArbitrarySamples) {

    public static final InstrumentLimits NONE = new InstrumentLimits(null, null, null, null, null, null);
}
