package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Duration;
import java.time.Instant;

/**
 * The holds on lots (table {@code lot_hold}): one row per lot being measured. Taking a hold is one
 * transaction that inserts the row, or takes over a stale one by compare-and-set on its last renewal;
 * two runs starting one lot at one instant both reach the row's primary key, and the loser is told who
 * won, never shown a database error.
 */
final class LotHolds {
    private final StoreDb store;

    LotHolds(StoreDb store) {
        this.store = store;
    }

    /**
     * Takes the lot's hold for {@code mine}: null when taken (or already this run's), else the hold that
     * stands in its way. A hold not renewed for {@code stale}, or one of a process gone from this host, is
     * taken over.
     */
    LotHold take(LotHold mine, Duration stale) {
        for (int tries = 0; tries < 3; tries++) {
            try {
                LotHold other = store.inTransaction(() -> {
                    LotHold now = read(mine.lot());
                    if (now == null) {
                        insert(mine);
                        return null;
                    }
                    if (now.holder().equals(mine.holder())) {
                        return null;
                    }
                    if (!takeable(now, mine, stale)) {
                        return now;
                    }
                    try (PreparedStatement p = store.db.prepareStatement("UPDATE lot_hold SET holder = ?, bench = ?,"
                            + " host = ?, pid = ?, since = ?, renewed_at = ? WHERE lot = ? AND holder = ? AND renewed_at = ?")) {
                        p.setString(1, mine.holder());
                        p.setString(2, mine.bench());
                        p.setString(3, mine.host());
                        p.setLong(4, mine.pid());
                        p.setString(5, mine.since().toString());
                        p.setString(6, mine.renewedAt().toString());
                        p.setString(7, mine.lot());
                        p.setString(8, now.holder());
                        p.setString(9, now.renewedAt().toString());
                        return p.executeUpdate() == 1 ? null : read(mine.lot());
                    }
                });
                return other;
            } catch (SQLException e) {
                // another run inserted the row first (its primary key): read who, in a transaction of our own
                LotHold winner = readQuietly(mine.lot());
                if (winner != null && !winner.holder().equals(mine.holder())) {
                    return winner;
                }
                if (tries == 2) {
                    throw new StoreException("taking the hold on lot " + mine.lot() + " failed: " + StoreErrors.describe(e), e);
                }
            }
        }
        throw new IllegalStateException("unreachable");
    }

    /** A hold that may be taken over: stale, or its process gone from this very host. */
    private static boolean takeable(LotHold now, LotHold mine, Duration stale) {
        if (now.renewedAt().plus(stale).isBefore(mine.renewedAt())) {
            return true;
        }
        return now.host().equals(mine.host()) && now.pid() != mine.pid() && ProcessHandle.of(now.pid()).isEmpty();
    }

    /** Says the run is alive; false when the hold is no longer this run's (taken over). */
    boolean renew(LotHold mine, Instant at) {
        try {
            return store.inTransaction(() -> {
                try (PreparedStatement p = store.db.prepareStatement(
                        "UPDATE lot_hold SET renewed_at = ? WHERE lot = ? AND holder = ?")) {
                    p.setString(1, at.toString());
                    p.setString(2, mine.lot());
                    p.setString(3, mine.holder());
                    return p.executeUpdate() == 1;
                }
            });
        } catch (SQLException e) {
            throw new StoreException("renewing the hold on lot " + mine.lot() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Gives the hold back (nothing when it is no longer this run's). */
    void release(LotHold mine) {
        try {
            store.inTransaction(() -> {
                try (PreparedStatement p = store.db.prepareStatement("DELETE FROM lot_hold WHERE lot = ? AND holder = ?")) {
                    p.setString(1, mine.lot());
                    p.setString(2, mine.holder());
                    return p.executeUpdate();
                }
            });
        } catch (SQLException e) {
            throw new StoreException("giving back the hold on lot " + mine.lot() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** The lot's hold, or null. */
    LotHold held(String lot) {
        try {
            return read(lot);
        } catch (SQLException e) {
            throw new StoreException("reading the hold on lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private LotHold readQuietly(String lot) {
        try {
            return store.inTransaction(() -> read(lot));
        } catch (SQLException again) {
            return null;
        }
    }

    private LotHold read(String lot) throws SQLException {
        try (PreparedStatement p = store.db.prepareStatement(
                "SELECT holder, bench, host, pid, since, renewed_at FROM lot_hold WHERE lot = ?")) {
            p.setString(1, lot);
            try (ResultSet r = p.executeQuery()) {
                return r.next() ? new LotHold(lot, r.getString(1), r.getString(2), r.getString(3), r.getLong(4),
                        Instant.parse(r.getString(5)), Instant.parse(r.getString(6))) : null;
            }
        }
    }

    private void insert(LotHold h) throws SQLException {
        try (PreparedStatement p = store.db.prepareStatement("INSERT INTO lot_hold (lot, holder, bench, host, pid, since,"
                + " renewed_at) VALUES (?, ?, ?, ?, ?, ?, ?)")) {
            p.setString(1, h.lot());
            p.setString(2, h.holder());
            p.setString(3, h.bench());
            p.setString(4, h.host());
            p.setLong(5, h.pid());
            p.setString(6, h.since().toString());
            p.setString(7, h.renewedAt().toString());
            p.executeUpdate();
        }
    }
}
