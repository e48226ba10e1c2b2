package org.lrbench.instrument;

/** Generator waveforms; {@code ARBITRARY} plays the samples last loaded with {@link Generator#loadArbitrary}. */
public enum Waveform { SINE, TRIANGLE, SQUARE, ARBITRARY }
