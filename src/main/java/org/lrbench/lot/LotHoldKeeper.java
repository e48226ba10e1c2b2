package org.lrbench.lot;

import java.net.InetAddress;
import java.time.Duration;
import java.time.Instant;
import java.util.UUID;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Supplier;
import org.lrbench.store.LotHold;
import org.lrbench.store.ResultStore;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * This run's hold on its lot, for as long as the run lasts: taken before anything is measured (refused,
 * naming the holder, when another run holds the lot), renewed every {@link #RENEW} on a connection of its
 * own, given back on close (every exit path). A hold not renewed for {@link #STALE} (its run died, its
 * computer went off) is taken over by the next run, as is one whose process is gone from this host.
 */
public final class LotHoldKeeper implements AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(LotHoldKeeper.class);
    /** How often a run says it is alive. */
    static final Duration RENEW = Duration.ofSeconds(30);
    /** How long a hold lasts without a sign of life: ten renewals missed. */
    public static final Duration STALE = Duration.ofMinutes(5);

    private final LotHold mine;
    private final Supplier<ResultStore> opener;
    private final ScheduledExecutorService renewer;
    private ResultStore own;

    private LotHoldKeeper(LotHold mine, Supplier<ResultStore> opener) {
        this.mine = mine;
        this.opener = opener;
        this.renewer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "lot-hold-" + mine.lot());
            t.setDaemon(true);
            return t;
        });
        renewer.scheduleWithFixedDelay(this::renew, RENEW.toMillis(), RENEW.toMillis(), TimeUnit.MILLISECONDS);
    }

    /**
     * Takes the hold on {@code lot} in {@code store}, or refuses with {@link LotRefused.Kind#HELD}, naming
     * the run that holds it. {@code opener} opens another connection to the same store, for the renewals.
     */
    public static LotHoldKeeper take(ResultStore store, Supplier<ResultStore> opener, String lot, String bench) {
        Instant now = Instant.now();
        LotHold mine = new LotHold(lot, UUID.randomUUID().toString(), bench, host(), ProcessHandle.current().pid(),
                now, now);
        LotHold other = store.holdLot(mine, STALE);
        if (other != null) {
            throw new LotRefused(LotRefused.Kind.HELD, "lot " + lot + " is being measured by another run: "
                    + other.describe() + ". Nothing was measured here. Wait for that run to end; if its process is"
                    + " gone, the lot is taken over when its hold is " + STALE.toMinutes() + " minutes old (at once on"
                    + " the same computer)");
        }
        return new LotHoldKeeper(mine, opener);
    }

    private synchronized void renew() {
        try {
            if (own == null) {
                own = opener.get();
            }
            if (!own.renewHold(mine, Instant.now())) {
                LOG.warn("the hold on lot {} was taken over by another run", mine.lot());
            }
        } catch (RuntimeException e) {
            // the next renewal tries again; a hold left unrenewed only becomes takeable after STALE
            LOG.warn("renewing the hold on lot {} failed: {}", mine.lot(), e.getMessage());
        }
    }

    /** Gives the hold back (on the store of the renewals, or one opened for it). */
    @Override
    public synchronized void close() {
        renewer.shutdownNow();
        try {
            if (own == null) {
                own = opener.get();
            }
            own.releaseHold(mine);
        } catch (RuntimeException e) {
            LOG.warn("giving back the hold on lot {} failed (it is taken over when stale): {}", mine.lot(), e.getMessage());
        } finally {
            if (own != null) {
                own.close();
                own = null;
            }
        }
    }

    private static String host() {
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (java.io.IOException e) {
            return "this computer";
        }
    }
}
