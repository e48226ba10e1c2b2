package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.lrbench.results.Attempt;

/** The hash chain as the store keeps it: heads, findings, and the rows as stored for hashing. */
final class ChainRows {
    private final StoreDb store;
    private final InspectionRows inspections;

    ChainRows(StoreDb store, InspectionRows inspections) {
        this.store = store;
        this.inspections = inspections;
    }

    /** The lots that have rows anywhere in the store (inspections, attempts or chain links). */
    public List<String> lotNames() {
        List<String> out = new ArrayList<>();
        String sql = "SELECT lot FROM inspection UNION SELECT lot FROM attempt UNION SELECT lot FROM lot_chain"
                + " UNION SELECT lot FROM chain_record ORDER BY 1";
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery(sql)) {
            while (r.next()) {
                out.add(r.getString(1));
            }
        } catch (SQLException e) {
            throw new StoreException("listing lots failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** The lot's chain head (hash of its last record), or null for a lot without a store.chain. */
    public String chainHead(String lot) {
        try {
            ChainCheck.State st = store.chain.state(lot);
            return st == null ? null : st.head();
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /**
     * Re-reads a lot's rows and its hash chain and names every row altered, removed or added
     * outside lrbench, every broken or missing link, and every row stored before the chain existed
     * (schema 2 and older: unverifiable, listed as such). Empty when the lot is intact.
     */
    public List<String> chainFindings(String lot) {
        try {
            return ChainCheck.findings(lot, inspections.inspections(lot), attemptsWithHashes(lot), store.chain.links(lot), store.chain.state(lot));
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every lot's chain as it stands, by lot. */
    public List<ChainAnchor> anchors() {
        List<ChainAnchor> out = new ArrayList<>();
        try (Statement s = store.db.createStatement();
             ResultSet r = s.executeQuery("SELECT lot, length, head_sha256 FROM lot_chain ORDER BY lot")) {
            while (r.next()) {
                out.add(new ChainAnchor(r.getString(1), r.getInt(2), r.getString(3)));
            }
        } catch (SQLException e) {
            throw new StoreException("reading the chain heads failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /**
     * What the store's chains say against anchors taken earlier and kept outside the store: each anchored
     * lot must still have its chain, at least as long as it was, with the anchored hash at the anchored
     * link (the links are read, not the head row, which can be rewritten with them). A chain cut back and
     * re-pointed at an earlier link, or a lot deleted with its chain, is found here and only here.
     */
    public List<String> anchorFindings(List<ChainAnchor> anchored) {
        List<String> out = new ArrayList<>();
        try {
            for (ChainAnchor a : anchored) {
                List<ChainRecord> links = store.chain.links(a.lot());
                String prefix = "anchor: lot " + a.lot() + ": ";
                if (links.isEmpty()) {
                    out.add(prefix + "anchored with " + a.length() + " link(s), and it has no chain in the store now"
                            + " (the lot was deleted)");
                    continue;
                }
                ChainRecord at = links.stream().filter(c -> c.seq() == a.length()).findFirst().orElse(null);
                if (at == null) {
                    out.add(prefix + "anchored with " + a.length() + " link(s); the chain has " + links.size()
                            + " now: its tail was cut");
                } else if (!at.recordSha256().equals(a.head())) {
                    out.add(prefix + "link " + a.length() + " is not the one anchored (hash " + at.recordSha256()
                            + ", anchored " + a.head() + "): the chain up to it was rewritten");
                }
            }
        } catch (SQLException e) {
            throw new StoreException("reading the chains failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** An attempt as stored with the two columns its content hash covers besides the record. */
    record HashedAttempt(Attempt attempt, String programVersion, String tracesSha256) {
    }

    List<HashedAttempt> attemptsWithHashes(String lot) throws SQLException {
        List<HashedAttempt> out = new ArrayList<>();
        try (PreparedStatement q = store.db.prepareStatement("SELECT " + AttemptRows.ATTEMPT_COLUMNS + ", program_version, traces_sha256"
                + " FROM attempt WHERE lot = ? ORDER BY round, position, attempt")) {
            q.setString(1, lot);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    out.add(new HashedAttempt(attemptRaw(r), r.getString(16), r.getString(17)));
                }
            }
        }
        return out;
    }

    /** The attempt exactly as stored (the trace file column unchanged), for hashing. */
    private static Attempt attemptRaw(ResultSet r) throws SQLException {
        Long bytes = r.getLong(15);
        if (r.wasNull()) {
            bytes = null;
        }
        return new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5), StoreDb.verdict(r, 6),
                StoreDb.real(r, 7), StoreDb.real(r, 8), r.getString(9), r.getString(10), r.getString(11), r.getString(12),
                r.getString(13), r.getString(14), bytes);
    }

    /** The traces SHA-256 recorded for each attempt of a lot, keyed "serial~attempt". */
    public Map<String, String> tracesHashes(String lot) {
        Map<String, String> out = new LinkedHashMap<>();
        try {
            for (HashedAttempt h : attemptsWithHashes(lot)) {
                out.put(h.attempt().serial() + "~" + h.attempt().number(), h.tracesSha256());
            }
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }
}
