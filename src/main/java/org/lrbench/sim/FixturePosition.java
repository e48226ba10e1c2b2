package org.lrbench.sim;

/**
 * What the simulated fixture holds: the part ({@code PART}); both digitizer channels across the sense
 * resistor, for matching the channels ({@code CHANNEL_MATCH}); nothing in the part's place
 * ({@code OPEN}); a shorting bar in the part's place ({@code SHORT}).
 */
public enum FixturePosition { PART, CHANNEL_MATCH, OPEN, SHORT }
