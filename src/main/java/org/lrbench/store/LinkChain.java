package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/**
 * A store-wide hash chain over the rows of one table, its length and head in the one row of a head table
 * (taken first by a writer, so writers take turns): what the chains of single parts and of scheme
 * decisions share. Each link hashes its row's content and the link before it (see {@link Canonical#chain}).
 */
final class LinkChain {
    /** One link as stored: its place, its row in words, the row's content hash now and as linked, its hashes. */
    record Link(int seq, String what, String contentNow, String content, String previous, String record) {
    }

    private final StoreDb store;
    private final String headTable;
    private final String label;
    private final String anchorName;

    LinkChain(StoreDb store, String headTable, String label, String anchorName) {
        this.store = store;
        this.headTable = headTable;
        this.label = label;
        this.anchorName = anchorName;
    }

    /** Takes the head row for this transaction and returns it. */
    ChainCheck.State lock() throws SQLException {
        try (Statement s = store.db.createStatement()) {
            s.executeUpdate("UPDATE " + headTable + " SET length = length WHERE id = 1");
        }
        return state();
    }

    /** Moves the head to the link just written. */
    void advance(ChainCheck.State before, String link) throws SQLException {
        try (PreparedStatement p = store.db.prepareStatement(
                "UPDATE " + headTable + " SET length = ?, head_sha256 = ? WHERE id = 1")) {
            p.setInt(1, before.length() + 1);
            p.setString(2, link);
            p.executeUpdate();
        }
    }

    ChainCheck.State state() throws SQLException {
        try (Statement s = store.db.createStatement();
             ResultSet r = s.executeQuery("SELECT length, head_sha256 FROM " + headTable + " WHERE id = 1")) {
            return r.next() ? new ChainCheck.State(r.getInt(1), r.getString(2)) : null;
        }
    }

    /** The breaks of the chain whose links are {@code links}, in order: altered, removed, inserted, reordered, a stale head. */
    List<String> findings(List<Link> links) {
        List<String> out = new ArrayList<>();
        String prefix = "store: " + label + ": ";
        String previous = Canonical.GENESIS;
        int expected = 1;
        for (Link l : links) {
            if (l.seq() != expected) {
                out.add(prefix + "link " + expected + " is missing (removed) before " + l.what());
                expected = l.seq();
            }
            if (!l.previous().equals(previous)) {
                out.add(prefix + l.what() + " does not follow the link before it: a record was removed, inserted or"
                        + " reordered");
            }
            if (!l.contentNow().equals(l.content()) || !Canonical.chain(l.previous(), l.content()).equals(l.record())) {
                out.add(prefix + l.what() + ": the stored row was altered (its content no longer matches its hash)");
            }
            previous = l.record();
            expected++;
        }
        try {
            ChainCheck.State st = state();
            if (st == null) {
                out.add(prefix + "the chain's head row is missing");
            } else if (st.length() != expected - 1 || !st.head().equals(previous)) {
                out.add(prefix + "the chain's head (" + st.length() + " link(s)) is not its last link (" + (expected - 1)
                        + "): records were removed or added outside lrbench");
            }
        } catch (SQLException e) {
            throw new StoreException("reading the " + label + "' chain failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** The chain as an anchor keeps it (null without a head row). */
    ChainAnchor anchor() {
        try {
            ChainCheck.State st = state();
            return st == null ? null : new ChainAnchor(anchorName, st.length(), st.head());
        } catch (SQLException e) {
            throw new StoreException("reading the " + label + "' chain failed: " + StoreErrors.describe(e), e);
        }
    }

    /**
     * Against an anchor, the link at the anchored length read from {@code table}, whose {@code seqColumn}
     * numbers the links: null when it still has the anchored hash.
     */
    String anchorFinding(ChainAnchor a, String table, String seqColumn) {
        try (PreparedStatement q = store.db.prepareStatement(
                "SELECT record_sha256 FROM " + table + " WHERE " + seqColumn + " = ?")) {
            q.setInt(1, a.length());
            try (ResultSet r = q.executeQuery()) {
                return anchorFinding(a, r.next() ? r.getString(1) : null);
            }
        } catch (SQLException e) {
            throw new StoreException("reading the " + label + "' chain failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Against an anchor, given the record hash stored at the anchored length (null: no such link): null when kept. */
    String anchorFinding(ChainAnchor a, String recordAtLength) {
        if (a.length() == 0) {
            return null;
        }
        if (recordAtLength == null) {
            return "anchor: " + label + ": anchored with " + a.length() + " link(s); the chain has fewer now: its tail"
                    + " was cut";
        }
        return recordAtLength.equals(a.head()) ? null : "anchor: " + label + ": link " + a.length()
                + " is not the one anchored: the chain up to it was rewritten";
    }
}
