package org.lrbench.measure;

import java.util.concurrent.locks.LockSupport;

/** Waits for settling. Real benches sleep; the simulated bench is in steady state at once. */
@FunctionalInterface
public interface Sleeper {
    /**
     * Waits the time asked, to the microsecond: a settle of 0.3 ms (the circuit rule's, for a small
     * inductor) is not rounded to 0 or 1 ms.
     */
    Sleeper REAL = seconds -> {
        if (!(seconds > 0)) {
            return;
        }
        long deadline = System.nanoTime() + (long) (seconds * 1e9);
        long left;
        while ((left = deadline - System.nanoTime()) > 0) {
            LockSupport.parkNanos(left);
            if (Thread.interrupted()) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while settling");
            }
        }
    };
    Sleeper NONE = seconds -> { };

    void sleep(double seconds);
}
