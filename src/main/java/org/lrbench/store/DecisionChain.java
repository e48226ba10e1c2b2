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
    private final LinkChain chain;

    DecisionChain(StoreDb store) {
        this.store = store;
        this.chain = new LinkChain(store, "decision_chain", "scheme decisions", ANCHOR_NAME);
    }

    /** The content a decision's link hashes: every column, in order, as text. */
    private static String content(ResultSet r) throws SQLException {
        return String.join("\n", "scheme-decision", r.getString(1), r.getString(2), Integer.toString(r.getInt(3)),
                r.getString(4), r.getString(5), r.getString(6), String.valueOf(r.getString(7)),
                Integer.toString(r.getInt(8)), Integer.toString(r.getInt(9)));
    }

    /** Links the decision just inserted (in the caller's transaction). */
    void link(String partNumber, String supplier, int seq) throws SQLException {
        ChainCheck.State st = chain.lock();
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
        chain.advance(st, link);
    }

    /** The chain's breaks: a decision altered, removed, inserted or reordered, a head not its last link. */
    List<String> findings() {
        List<LinkChain.Link> links = new ArrayList<>();
        int unlinked = 0;
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery("SELECT " + COLUMNS
                + ", chain_seq, content_sha256, previous_sha256, record_sha256 FROM scheme_decision"
                + " ORDER BY chain_seq, part_number, supplier, seq")) {
            while (r.next()) {
                int seq = r.getInt(10);
                if (r.wasNull()) {
                    unlinked++;
                    continue;
                }
                links.add(new LinkChain.Link(seq, "decision " + r.getInt(3) + " on " + r.getString(1) + " / "
                        + r.getString(2) + " (link " + seq + ")", Canonical.sha256(content(r)), r.getString(11),
                        r.getString(12), r.getString(13)));
            }
        } catch (SQLException e) {
            throw new StoreException("reading the scheme decisions failed: " + StoreErrors.describe(e), e);
        }
        List<String> out = new ArrayList<>(chain.findings(links));
        if (unlinked > 0) {
            out.add("store: scheme decisions: " + unlinked + " decision(s) stored before the decisions' chain existed"
                    + " (schema 8 or older): they cannot be verified");
        }
        return out;
    }

    ChainAnchor anchor() {
        return chain.anchor();
    }

    /** Null when the link at the anchored length still has the anchored hash. */
    String anchorFinding(ChainAnchor a) {
        return chain.anchorFinding(a, "scheme_decision", "chain_seq");
    }
}
