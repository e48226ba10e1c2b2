package org.lrbench.instrument;

/** Generator waveforms. */
public enum Waveform { SINE, TRIANGLE, SQUARE }
