package org.lrbench.store;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.util.ArrayList;
import java.util.List;

/**
 * A lot's hash chain in the store: the table {@code lot_chain} holds each lot's length and head,
 * {@code chain_record} every link. Links are appended inside the caller's transaction, after
 * {@link #lock} has taken the lot's chain row, so writers of one lot take turns and no link is
 * lost or numbered twice.
 */
final class HashChain {
    private final Connection db;

    HashChain(Connection db) {
        this.db = db;
    }

    /**
     * Takes the lot's chain row for this transaction (creating it for a new lot): on PostgreSQL the
     * update locks the row until commit, so two benches appending to one lot take turns; SQLite's
     * immediate transactions already serialize writers.
     */
    void lock(String lot) throws SQLException {
        int n;
        try (PreparedStatement p = db.prepareStatement("UPDATE lot_chain SET length = length WHERE lot = ?")) {
            p.setString(1, lot);
            n = p.executeUpdate();
        }
        if (n == 0) {
            try (PreparedStatement p = db.prepareStatement(
                    "INSERT INTO lot_chain (lot, length, head_sha256) VALUES (?, 0, ?)")) {
                p.setString(1, lot);
                p.setString(2, Canonical.GENESIS);
                p.executeUpdate();
            }
        }
    }

    /** Appends the link of one record, given the SHA-256 of its canonical content. */
    void append(String lot, String kind, int round, String serial, Integer attempt, String content) throws SQLException {
        ChainCheck.State st = state(lot);
        if (st == null) {
            throw new StoreException("lot " + lot + " has no hash chain row", null);
        }
        String record = Canonical.chain(st.head(), content);
        try (PreparedStatement p = db.prepareStatement("INSERT INTO chain_record (lot, seq, kind, round, serial, attempt,"
                + " content_sha256, previous_sha256, record_sha256) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
            p.setString(1, lot);
            p.setInt(2, st.length() + 1);
            p.setString(3, kind);
            p.setInt(4, round);
            p.setString(5, serial);
            p.setObject(6, attempt);
            p.setString(7, content);
            p.setString(8, st.head());
            p.setString(9, record);
            p.executeUpdate();
        }
        try (PreparedStatement p = db.prepareStatement(
                "UPDATE lot_chain SET length = ?, head_sha256 = ? WHERE lot = ?")) {
            p.setInt(1, st.length() + 1);
            p.setString(2, record);
            p.setString(3, lot);
            p.executeUpdate();
        }
    }

    /** The lot's links in order. */
    List<ChainRecord> links(String lot) throws SQLException {
        List<ChainRecord> out = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT lot, seq, kind, round, serial, attempt, content_sha256,"
                + " previous_sha256, record_sha256 FROM chain_record WHERE lot = ? ORDER BY seq")) {
            q.setString(1, lot);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    int number = r.getInt(6);
                    Integer attempt = r.wasNull() ? null : number;
                    out.add(new ChainRecord(r.getString(1), r.getInt(2), r.getString(3), r.getInt(4), r.getString(5),
                            attempt, r.getString(7), r.getString(8), r.getString(9)));
                }
            }
        }
        return out;
    }

    /** The lot's chain row, or null when the lot has none. */
    ChainCheck.State state(String lot) throws SQLException {
        try (PreparedStatement q = db.prepareStatement("SELECT length, head_sha256 FROM lot_chain WHERE lot = ?")) {
            q.setString(1, lot);
            try (ResultSet r = q.executeQuery()) {
                return r.next() ? new ChainCheck.State(r.getInt(1), r.getString(2)) : null;
            }
        }
    }
}
