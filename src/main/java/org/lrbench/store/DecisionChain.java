package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/**
 * The decisions people record on suppliers' inspection schemes, each a link of one store-wide hash
 * chain: the row's {@code chain_seq}, the SHA-256 of its content and of the link before it; the chain's
 * length and head in the one row of {@code decision_chain}, which a writer takes first. Decisions stored
 * before the chain existed (schema 8 and older) have no link and are listed as unverifiable.
 */
final class DecisionChain {
    static final String ANCHOR_NAME = "~scheme-decisions";
    private static final String COLUMNS = "part_number, supplier, seq, decided_at, severity, reason, operator, override,"
            + " simulated";

    private final StoreDb store;

    DecisionChain(StoreDb store) {
        this.store = store;
    }

    /** The content a decision's link hashes: every column, in order, as text. */
    private static String content(ResultSet r) throws SQLException {
        return String.join("\n", "scheme-decision", r.getString(1), r.getString(2), Integer.toString(r.getInt(3)),
                r.getString(4), r.getString(5), r.getString(6), String.valueOf(r.getString(7)),
                Integer.toString(r.getInt(8)), Integer.toString(r.getInt(9)));
    }

    /** Links the decision just inserted (in the caller's transaction). */
    void link(String partNumber, String supplier, int seq) throws SQLException {
        try (Statement s = store.db.createStatement()) {
            s.executeUpdate("UPDATE decision_chain SET length = length WHERE id = 1");
        }
        ChainCheck.State st = state();
        String content;
        try (PreparedStatement q = store.db.prepareStatement("SELECT " + COLUMNS + " FROM scheme_decision"
                + " WHERE part_number = ? AND supplier = ? AND seq = ?")) {
            q.setString(1, partNumber);
            q.setString(2, supplier);
            q.setInt(3, seq);
            try (ResultSet r = q.executeQuery()) {
                r.next();
                content = Canonical.sha256(content(r));
            }
        }
        String link = Canonical.chain(st.head(), content);
        try (PreparedStatement p = store.db.prepareStatement("UPDATE scheme_decision SET chain_seq = ?, content_sha256 = ?,"
                + " previous_sha256 = ?, record_sha256 = ? WHERE part_number = ? AND supplier = ? AND seq = ?")) {
            p.setInt(1, st.length() + 1);
            p.setString(2, content);
            p.setString(3, st.head());
            p.setString(4, link);
            p.setString(5, partNumber);
            p.setString(6, supplier);
            p.setInt(7, seq);
            p.executeUpdate();
        }
        try (PreparedStatement p = store.db.prepareStatement(
                "UPDATE decision_chain SET length = ?, head_sha256 = ? WHERE id = 1")) {
            p.setInt(1, st.length() + 1);
            p.setString(2, link);
            p.executeUpdate();
        }
    }

    ChainCheck.State state() throws SQLException {
        try (Statement s = store.db.createStatement();
             ResultSet r = s.executeQuery("SELECT length, head_sha256 FROM decision_chain WHERE id = 1")) {
            return r.next() ? new ChainCheck.State(r.getInt(1), r.getString(2)) : null;
        }
    }

    /** The chain's breaks: a decision altered, removed, inserted or reordered, a head not its last link. */
    List<String> findings() {
        List<String> out = new ArrayList<>();
        String prefix = "store: scheme decisions: ";
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery("SELECT " + COLUMNS
                + ", chain_seq, content_sha256, previous_sha256, record_sha256 FROM scheme_decision"
                + " ORDER BY chain_seq, part_number, supplier, seq")) {
            String previous = Canonical.GENESIS;
            int expected = 1;
            int unlinked = 0;
            while (r.next()) {
                int seq = r.getInt(10);
                if (r.wasNull()) {
                    unlinked++;
                    continue;
                }
                String what = "decision " + r.getInt(3) + " on " + r.getString(1) + " / " + r.getString(2)
                        + " (link " + seq + ")";
                if (seq != expected) {
                    out.add(prefix + "link " + expected + " is missing (removed) before " + what);
                    expected = seq;
                }
                if (!r.getString(12).equals(previous)) {
                    out.add(prefix + what + " does not follow the link before it: a decision was removed, inserted or"
                            + " reordered");
                }
                if (!Canonical.sha256(content(r)).equals(r.getString(11))
                        || !Canonical.chain(r.getString(12), r.getString(11)).equals(r.getString(13))) {
                    out.add(prefix + what + ": the stored row was altered (its content no longer matches its hash)");
                }
                previous = r.getString(13);
                expected++;
            }
            if (unlinked > 0) {
                out.add(prefix + unlinked + " decision(s) stored before the decisions' chain existed (schema 8 or"
                        + " older): they cannot be verified");
            }
            ChainCheck.State st = state();
            if (st == null) {
                out.add(prefix + "the chain's head row is missing");
            } else if (st.length() != expected - 1 || !st.head().equals(previous)) {
                out.add(prefix + "the chain's head (" + st.length() + " link(s)) is not its last link (" + (expected - 1)
                        + "): decisions were removed or added outside lrbench");
            }
        } catch (SQLException e) {
            throw new StoreException("reading the scheme decisions failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    ChainAnchor anchor() {
        try {
            ChainCheck.State st = state();
            return st == null ? null : new ChainAnchor(ANCHOR_NAME, st.length(), st.head());
        } catch (SQLException e) {
            throw new StoreException("reading the decisions' chain failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Null when the link at the anchored length still has the anchored hash. */
    String anchorFinding(ChainAnchor a) {
        try (PreparedStatement q = store.db.prepareStatement(
                "SELECT record_sha256 FROM scheme_decision WHERE chain_seq = ?")) {
            q.setInt(1, a.length());
            try (ResultSet r = q.executeQuery()) {
                if (!r.next()) {
                    return "anchor: scheme decisions: anchored with " + a.length() + " link(s); the chain has fewer now:"
                            + " its tail was cut";
                }
                return r.getString(1).equals(a.head()) ? null : "anchor: scheme decisions: link " + a.length()
                        + " is not the one anchored: the chain up to it was rewritten";
            }
        } catch (SQLException e) {
            throw new StoreException("reading the decisions' chain failed: " + StoreErrors.describe(e), e);
        }
    }
}
