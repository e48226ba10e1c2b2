package org.lrbench.sim;

import org.apache.commons.math3.complex.Complex;

/**
 * One spectral line of a periodic signal: harmonic number {@code k} (0 for DC) and its complex
 * amplitude as a cosine phasor, the line contributing {@code Re(amplitude * exp(j k omega t))}.
 */
public record Harmonic(int k, Complex amplitude) {
}
