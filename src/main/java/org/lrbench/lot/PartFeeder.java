package org.lrbench.lot;

import java.util.Set;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.judge.Verdict;

/**
 * Brings the next part of a lot's sample to the fixture: an operator at the console or at the
 * service's page, a tray of simulated parts, or a tray behind a switch unit.
 */
public interface PartFeeder {

    /**
     * What the runner asks for: position {@code index} of {@code of}, and the serials already
     * measured (pass or fail) in this inspection, which may be measured again only on purpose,
     * with a reason.
     */
    record Prompt(int index, int of, Set<String> measured, int skipped) {

        public Prompt(int index, int of, Set<String> measured) {
            this(index, of, measured, 0);
        }

        /**
         * The prompt in words: which sample part is wanted and, after skips, that another part takes the
         * skipped position's place (so a skip visibly moves the prompt on).
         */
        public String words() {
            return "place part " + index + " of " + of + (skipped == 0 ? "" : " (" + skipped + " position"
                    + (skipped == 1 ? "" : "s") + " skipped: another part takes " + (skipped == 1 ? "its" : "their")
                    + " place)");
        }
    }

    /**
     * What to do next: measure a part (its serial, on the simulated bench its model, and the reason
     * when it was measured before), skip a position, or stop.
     */
    record Next(Action action, String serial, SimulatedPart simulated, String reason) {

        public static Next stop() {
            return new Next(Action.STOP, null, null, null);
        }

        public static Next measure(String serial, SimulatedPart simulated) {
            return new Next(Action.MEASURE, serial, simulated, null);
        }

        public static Next skip(String serial) {
            return new Next(Action.SKIP, serial, null, null);
        }
    }

    enum Action { MEASURE, SKIP, STOP }

    Next next(Prompt prompt);

    /**
     * Asked after each part: a reason to measure it again at once (the operator saw a bad
     * contact, say), or null to go on. The new measurement is a new attempt; both are kept.
     */
    default String again(String serial, Verdict verdict) {
        return null;
    }

    /** Told when the runner refuses what {@link #next} returned, with the reason. */
    default void refused(String message) {
    }
}
