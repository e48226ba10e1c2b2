package org.lrbench.measure;

import java.util.concurrent.locks.LockSupport;

/**
 * The time a sweep keeps: when things happened and the waits for settling. Real benches read the
 * monotonic clock and sleep; the simulated bench is in steady state at once ({@link #NONE}); tests
 * give a clock of their own, so that the settling rules are checked without real time.
 */
@FunctionalInterface
public interface BenchClock {
    /**
     * Waits the time asked, to the microsecond: a settle of 0.3 ms (the circuit rule's, for a small
     * inductor) is not rounded to 0 or 1 ms.
     */
    BenchClock REAL = seconds -> {
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
    /** No waits: the simulated bench settles at once. */
    BenchClock NONE = seconds -> { };

    /** Waits {@code seconds} (nothing for zero, negative or NaN). */
    void sleep(double seconds);

    /** The monotonic time in nanoseconds, as {@link System#nanoTime}: only differences mean anything. */
    default long nanoTime() {
        return System.nanoTime();
    }

    /** What is left of a settle of {@code settleSecond} that started at {@code since} (this clock's time). */
    default double remaining(double settleSecond, long since) {
        return Math.max(0, settleSecond - (nanoTime() - since) / 1e9);
    }
}
