package org.lrbench.sim.scpi;

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
        long left = startNanos + nanos - System.nanoTime();
        if (left <= 0) {
            return;
        }
        try {
            Thread.sleep(left / 1_000_000, (int) (left % 1_000_000));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Simulated time passed on this thread so far (nanoseconds). */
    public static long simulatedNanos() {
        return SIMULATED.get()[0];
    }
}
