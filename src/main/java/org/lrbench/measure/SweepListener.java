package org.lrbench.measure;

/**
 * Hears a sweep as it runs. Each point is reported once, after it is measured, in sweep order.
 * Every method is an empty default, so a listener implements only what it needs.
 */
public interface SweepListener {
    SweepListener NONE = new SweepListener() { };

    /** Before the sweep's first command to an instrument. */
    default void sweepStarted() {
    }

    default void pointMeasured(int index, int count, PointResult point) {
    }
}
