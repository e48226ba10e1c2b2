package org.lrbench.sim;

import java.util.List;

/** What the simulated digitizer's inputs are wired to: the spectral lines each channel sees. */
public interface AnalogInputs {

    /** Fundamental frequency of the periodic steady state, Hz. */
    double fundamentalHz();

    /** The lines of a channel's voltage up to {@code bandLimit} Hz; empty when nothing drives it. */
    List<Harmonic> channel(int channel, double bandLimit);
}
