package org.lrbench.measure;

/**
 * A request to stop, asked from outside the measuring thread (a signal, the service's stop) and
 * checked by the sweep itself between points: never thrown from inside an observer. A stopped
 * sweep ends with {@link MeasurementStopped}; the caller's guard switches the output off.
 */
@FunctionalInterface
public interface StopToken {
    StopToken NEVER = () -> false;

    boolean stopRequested();

    /** Ends the measurement here with {@link MeasurementStopped} when a stop was requested. */
    default void checkpoint() {
        if (stopRequested()) {
            throw new MeasurementStopped();
        }
    }
}
