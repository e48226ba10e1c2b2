package org.lrbench.store;

import java.time.Instant;

/**
 * Who holds a lot: the one run measuring it now. A run takes the hold before it measures and gives it
 * back when it ends; it renews it while it runs, so a hold left by a process that died is taken over once
 * it is stale (or at once, on the same host, when its process is gone).
 *
 * @param holder    this run's own token (unique per run)
 * @param bench     the bench's name
 * @param host      the computer the run is on
 * @param pid       its process id
 * @param since     when it took the hold
 * @param renewedAt when it last said it is alive
 */
public record LotHold(String lot, String holder, String bench, String host, long pid, Instant since, Instant renewedAt) {

    /** The holder in words, for a message: bench, process, host, since when, last seen. */
    public String describe() {
        return "bench " + bench + " (process " + pid + " on " + host + ") since " + since + ", last seen " + renewedAt;
    }
}
