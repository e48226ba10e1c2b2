package org.lrbench.lot;

import java.io.IOException;
import org.lrbench.measure.StopToken;

/**
 * A request to stop a lot run from outside its thread (SIGTERM, Ctrl-C). The part in progress is
 * dropped (the sweep checks this token before each point and ends there, the output goes off, nothing of it is stored); a part
 * being committed is committed whole first. While the runner waits for the operator nothing is in
 * progress, so the one who asked may end the process at once.
 */
public final class LotStop implements StopToken {
    private boolean requested;
    private boolean waiting;
    private int done;
    private int of;

    /**
     * Asks the run to stop; waits for a commit in progress. Returns true when the runner is
     * waiting for the next part (nothing in progress, nothing half-committed).
     */
    public synchronized boolean request() {
        requested = true;
        return waiting;
    }

    public synchronized boolean requested() {
        return requested;
    }

    /** "N of M parts": the judged parts of the sample so far. */
    public synchronized String progress() {
        return done + " of " + of + " parts";
    }

    synchronized void waiting(int judged, int sample) {
        waiting = true;
        done = judged;
        of = sample;
    }

    synchronized void working() {
        waiting = false;
    }

    @Override
    public boolean stopRequested() {
        return requested();
    }

    /** Work that must not be cut in half by a stop: a commit and what follows it. */
    @FunctionalInterface
    interface Whole<T> {
        T run() throws IOException;
    }

    /** Runs {@code work} unless a stop was requested first (then returns null and does nothing). */
    synchronized <T> T unlessStopped(Whole<T> work) throws IOException {
        return requested ? null : work.run();
    }
}
