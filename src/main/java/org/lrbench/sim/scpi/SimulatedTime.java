package org.lrbench.sim.scpi;

import java.util.concurrent.locks.LockSupport;

/**
 * The time simulated instruments take, passed on the calling thread. An instrument's processing
 * happens inside its declared time; the simulator's own computing of an answer (a record, a
 * response) is hidden inside the simulated time it stands for, so a benchmark sees the instrument's
 * time and not the simulator's. Only where the simulator computes longer than the time it stands
 * for does its computing show.
 */
public final class SimulatedTime {
    private static final ThreadLocal<long[]> SIMULATED = ThreadLocal.withInitial(() -> new long[1]);

    private SimulatedTime() {
    }

    /** Lets {@code seconds} of simulated time pass from {@code startNanos}; sleeps what remains. */
    public static void passSince(long startNanos, double seconds) {
        if (!(seconds > 0)) {
            return;
        }
        long nanos = (long) (seconds * 1e9);
        SIMULATED.get()[0] += nanos;
        until(startNanos + nanos);
    }

    /**
     * Waits until {@link System#nanoTime} reaches {@code deadline}. Parking has microsecond
     * resolution where {@code Thread.sleep(ms, ns)} rounds a fraction of a millisecond up to a whole
     * one (a 0.2 ms transfer would last 1.1 ms).
     */
    static void until(long deadline) {
        long left;
        while ((left = deadline - System.nanoTime()) > 0) {
            LockSupport.parkNanos(left);
            if (Thread.interrupted()) {
                Thread.currentThread().interrupt();
                return;
            }
        }
    }

    /** Simulated time passed on this thread so far (nanoseconds). */
    public static long simulatedNanos() {
        return SIMULATED.get()[0];
    }
}
