package org.lrbench.measure;

/** Waits for settling. Real benches sleep; the simulated bench is in steady state at once. */
@FunctionalInterface
public interface Sleeper {
    Sleeper REAL = seconds -> {
        try {
            Thread.sleep(Math.round(seconds * 1000));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while settling", e);
        }
    };
    Sleeper NONE = seconds -> { };

    void sleep(double seconds);
}
