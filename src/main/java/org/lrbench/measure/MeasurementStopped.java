package org.lrbench.measure;

/** A measurement ended between two points because a stop was requested: nothing of it is a result. */
public final class MeasurementStopped extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public MeasurementStopped() {
        super("stop requested", null, false, false);
    }
}
