package org.lrbench.run;

import org.lrbench.sim.PartModel;

/**
 * Brings the next part of a lot's sample to the fixture: an operator at the console, or a tray of
 * simulated parts measured unattended. Returns what to do with position {@code index} of {@code of}.
 */
public interface PartFeeder {

    /** What to do next: measure a part (its serial, and on the simulated bench its model), skip one, or stop. */
    record Next(Action action, String serial, PartModel simulated) {

        public static Next stop() {
            return new Next(Action.STOP, null, null);
        }
    }

    enum Action { MEASURE, SKIP, STOP }

    Next next(int index, int of);

    /** Whether to measure the part just measured again (the operator saw a bad contact, say). */
    default boolean redo(String serial, String verdict) {
        return false;
    }
}
