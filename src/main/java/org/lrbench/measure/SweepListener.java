package org.lrbench.measure;

/**
 * Hears a sweep as it runs. Each point is reported once, after it is measured, in sweep order; a
 * multisine's points come from the thread that fitted them (while the instruments go on), every
 * call before the sweep returns.
 * Every method is an empty default, so a listener implements only what it needs. A listener
 * observes and never steers: the sweep calls it through {@link #isolated}, so whatever it throws
 * is logged with its name and changes neither the measurement nor its result. Stopping is a
 * {@link StopToken}'s job.
 */
public interface SweepListener {
    SweepListener NONE = new SweepListener() { };

    /** Before the sweep's first command to an instrument. */
    default void sweepStarted() {
    }

    default void pointMeasured(int index, int count, PointResult point) {
    }

    /** This listener behind a guard that logs and drops anything it throws. */
    static SweepListener isolated(SweepListener listener) {
        return listener == NONE || listener instanceof IsolatedListener ? listener : new IsolatedListener(listener);
    }
}
