package org.lrbench.measure;

import org.lrbench.analysis.ImpedancePoint;

/**
 * Predicts both channels' peak voltages at the next sweep frequency from the last point, so the
 * digitizer is usually ranged right on the first acquisition. From the last point: the loop's
 * impedance magnitude is E / |I| (E the generator's open-circuit peak), its reactance is the part's
 * X, so the loop's resistance (source, sense resistor and winding) is sqrt(|Z_loop|^2 - X^2).
 * Scaling X with frequency (series R + L) gives the next current and hence
 * V1 = |I| Rs and V2 = |I| |R + jX|.
 */
final class RangePrediction {

    private RangePrediction() {
    }

    /** Predicted peak voltages {sense, part} at {@code nextHz}, or null when no prediction can be made. */
    static double[] next(ImpedancePoint last, double emfPeak, double senseOhm, double nextHz) {
        double current = last.currentAmpere().abs();
        if (!(current > 0) || !(emfPeak > 0)) {
            return null;
        }
        double loop = emfPeak / current;
        double x = last.reactanceOhm();
        double loopResistance2 = loop * loop - x * x;
        if (!(loopResistance2 > 0)) {
            return null;
        }
        double nextX = x * nextHz / last.frequencyHz();
        double nextCurrent = emfPeak / Math.sqrt(loopResistance2 + nextX * nextX);
        double r = last.resistanceOhm();
        return new double[] {nextCurrent * senseOhm, nextCurrent * Math.hypot(r, nextX)};
    }
}
