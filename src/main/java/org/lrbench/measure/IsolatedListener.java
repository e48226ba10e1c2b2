package org.lrbench.measure;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * A listener whose failures stay its own: each is logged with the listener's name and the point it
 * failed at, and the sweep goes on as if it had not been there.
 */
final class IsolatedListener implements SweepListener {
    private static final Logger LOG = LoggerFactory.getLogger(SweepListener.class);
    private final SweepListener inner;

    IsolatedListener(SweepListener inner) {
        this.inner = inner;
    }

    @Override
    public void sweepStarted() {
        try {
            inner.sweepStarted();
        } catch (RuntimeException e) {
            failed("the sweep's start", e);
        }
    }

    @Override
    public void pointMeasured(int index, int count, PointResult point) {
        try {
            inner.pointMeasured(index, count, point);
        } catch (RuntimeException e) {
            failed("point " + (index + 1) + " of " + count, e);
        }
    }

    private void failed(String where, RuntimeException e) {
        LOG.warn("sweep observer {} failed at {} ({}); the measurement goes on without it", inner.getClass().getName(),
                where, e.toString());
        LOG.debug("the observer's failure", e);
    }
}
