package org.lrbench.store;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.List;
import java.util.Locale;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;

/**
 * The store's schema: its version read, refused when newer than this lrbench, and brought up to
 * date under a write lock (on PostgreSQL an advisory lock too), rows from before the chain sealed.
 */
final class StoreSchema {
    /** A constant key for PostgreSQL's advisory lock around migrations. */
    private static final long MIGRATION_LOCK = 0x6c7262656e6368L;
    private final StoreDb store;
    private final InspectionRows inspections;
    private final ChainRows chain;

    /** The schema of this store, read through its own inspection and chain rows. */
    static StoreSchema of(StoreDb store) {
        InspectionRows inspections = new InspectionRows(store);
        return new StoreSchema(store, inspections, new ChainRows(store, inspections));
    }

    StoreSchema(StoreDb store, InspectionRows inspections, ChainRows chain) {
        this.store = store;
        this.inspections = inspections;
        this.chain = chain;
    }

    /** The schema version this program writes. */
    static int latestVersion() {
        return Migrations.STEPS.size();
    }

    /** The schema version the store is at (0 for a new store). */
    int version() {
        try {
            return readVersion();
        } catch (SQLException e) {
            throw new StoreException("reading the schema version of " + store.where + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private int readVersion() throws SQLException {
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery("SELECT version FROM schema_version")) {
            return r.next() ? r.getInt(1) : 0;
        } catch (SQLException e) {
            if (String.valueOf(e.getMessage()).toLowerCase(Locale.ROOT).contains("no such table")
                    || "42P01".equals(e.getSQLState())) {
                return 0;
            }
            throw e;
        }
    }

    /**
     * Checks the schema and brings it up to date. The version is read and every missing step applied
     * inside one write transaction (and, on PostgreSQL, under an advisory lock), so stores opened by
     * several benches at the same moment are migrated exactly once.
     */
    void prepare() throws SQLException {
        if (store.postgres) {
            // a failed statement aborts a PostgreSQL transaction, so look before taking the lock
            store.db.setAutoCommit(true);
        }
        int at = readVersionIfAny();
        refuseNewer(at);
        if (at == latestVersion()) {
            return;
        }
        if (store.readOnly) {
            throw new StoreException("the results store " + store.where + " is at schema version " + at + " and this lrbench"
                    + " needs " + latestVersion() + "; it is read-only here, so it cannot be upgraded: open it once where"
                    + " it is writable", null);
        }
        store.inTransaction(() -> {
            try (Statement s = store.db.createStatement()) {
                if (store.postgres) {
                    s.execute("SELECT pg_advisory_xact_lock(" + MIGRATION_LOCK + ")");
                }
                s.execute("CREATE TABLE IF NOT EXISTS schema_version (version INTEGER NOT NULL)");
            }
            int now = readVersion();
            refuseNewer(now);
            for (int step = now; step < latestVersion(); step++) {
                try (Statement s = store.db.createStatement()) {
                    for (String sql : Migrations.STEPS.get(step)) {
                        s.execute(sql);
                    }
                }
            }
            if (now < 3) {
                sealEarlierRows();
            }
            if (now < latestVersion()) {
                try (Statement s = store.db.createStatement()) {
                    s.execute("DELETE FROM schema_version");
                    s.execute("INSERT INTO schema_version (version) VALUES (" + latestVersion() + ")");
                }
            }
            return null;
        });
    }

    /**
     * Rows moved over from schema 2 and older had no hashes: they get their links now, in the
     * migration's transaction, so the chain proves from here on that nothing changed.
     */
    private void sealEarlierRows() throws SQLException {
        List<Inspection> all = inspections.inspections(null);
        for (Inspection i : all) {
            store.chain.lock(i.lot());
            store.chain.append(i.lot(), "terms", i.round(), null, null, Canonical.sha256(Canonical.terms(i)));
            for (ChainRows.HashedAttempt h : chain.attemptsWithHashes(i.lot())) {
                Attempt a = h.attempt();
                store.chain.append(a.lot(), "attempt", a.round(), a.serial(), a.number(),
                        Canonical.sha256(Canonical.attempt(a, h.programVersion(), h.tracesSha256())));
            }
            if (i.decided()) {
                store.chain.append(i.lot(), "decision", i.round(), null, null, Canonical.sha256(Canonical.decision(i)));
            }
        }
    }

    /** The version, or 0 where there is no schema yet; never writes. */
    private int readVersionIfAny() throws SQLException {
        if (store.postgres) {
            try (Statement s = store.db.createStatement();
                 ResultSet r = s.executeQuery("SELECT to_regclass('schema_version') IS NOT NULL")) {
                if (!r.next() || !r.getBoolean(1)) {
                    return 0;
                }
            }
        }
        return readVersion();
    }

    private void refuseNewer(int at) {
        if (at > latestVersion()) {
            throw new StoreException("the results store " + store.where + " is at schema version " + at + ", newer than this"
                    + " lrbench knows (" + latestVersion() + "); it was written by a newer lrbench. Use that version;"
                    + " nothing was changed", null);
        }
    }
}
