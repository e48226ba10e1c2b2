package org.lrbench.measure;

/** Thrown when a point cannot be measured properly (it could not be ranged, no current flowed). */
public class MeasurementException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public MeasurementException(String message) {
        super(message);
    }
}
