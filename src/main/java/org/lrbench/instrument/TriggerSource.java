package org.lrbench.instrument;

/** Where the digitizer takes its trigger from. */
public enum TriggerSource { CHANNEL1, CHANNEL2, EXTERNAL, IMMEDIATE }
