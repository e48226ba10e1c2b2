package org.lrbench.store;

import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import org.lrbench.judge.Verdict;

/**
 * One open store: its connection, where it is (for messages), its dialect (SQLite or PostgreSQL),
 * whether it may be written, its hash chain, and work run as one transaction.
 */
final class StoreDb {
    final Connection db;
    final String where;
    final boolean postgres;
    final boolean readOnly;
    final HashChain chain;

    StoreDb(Connection db, String where, boolean postgres, boolean readOnly) {
        this.db = db;
        this.chain = new HashChain(db);
        this.where = where;
        this.postgres = postgres;
        this.readOnly = readOnly;
    }

    /** Work done inside one transaction. */
    @FunctionalInterface
    interface Work<T> {
        T run() throws SQLException;
    }

    /** Runs work as one transaction: committed whole, or rolled back whole on any failure. */
    <T> T inTransaction(Work<T> work) throws SQLException {
        if (readOnly) {
            throw new StoreException("the results store " + where + " is open for reading only (the file is not"
                    + " writable here); nothing was written", null);
        }
        db.setAutoCommit(false);
        try {
            T out = work.run();
            db.commit();
            return out;
        } catch (SQLException | RuntimeException e) {
            try {
                db.rollback();
            } catch (SQLException afterFailure) {
                e.addSuppressed(afterFailure);
            }
            throw e;
        } finally {
            try {
                db.setAutoCommit(true);
            } catch (SQLException afterFailure) {
                // the connection is unusable; the original failure is what the caller reports
            }
        }
    }

    /** A stored verdict; a word no lrbench writes is a store fault naming it, never a guess. */
    static Verdict verdict(ResultSet r, int column) throws SQLException {
        String word = r.getString(column);
        try {
            return Verdict.of(word);
        } catch (IllegalArgumentException e) {
            throw new StoreException("an attempt's stored " + e.getMessage() + " (the store was changed outside lrbench;"
                    + " run lrbench verify)", e);
        }
    }

    static Double real(ResultSet r, int column) throws SQLException {
        double v = r.getDouble(column);
        return r.wasNull() ? null : v;
    }

    static Integer whole(ResultSet r, int column) throws SQLException {
        int v = r.getInt(column);
        return r.wasNull() ? null : v;
    }

    static void closeQuietly(Connection c) {
        if (c != null) {
            try {
                c.close();
            } catch (SQLException ignored) {
                // already failing; the first error is the one reported
            }
        }
    }

    void close() {
        try {
            db.close();
        } catch (SQLException ignored) {
            // closing after use; nothing is pending
        }
    }
}
