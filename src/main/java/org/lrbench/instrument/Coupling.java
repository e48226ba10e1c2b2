package org.lrbench.instrument;

/** Digitizer input coupling. */
public enum Coupling { DC, AC }
