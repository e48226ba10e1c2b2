package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SwitchingRules;

/** The switching rules' records: each supplier's scheme history and the decisions people recorded. */
final class SchemeRows {
    private final StoreDb store;

    SchemeRows(StoreDb store) {
        this.store = store;
    }

    /**
     * The history of one part number's scheme with one supplier ("" for none named): its original
     * inspections decided under the switching rules and the decisions people recorded, in time
     * order (a lot before a decision at the same instant).
     */
    public List<SwitchingRules.Event> schemeHistory(String partNumber, String supplier) {
        return schemeHistory(partNumber, supplier, false);
    }

    /**
     * A supplier's scheme of real lots, or of simulated ones: the two never mix (a simulated lot never
     * steers a real supplier's scheme; decisions people record are for real schemes only).
     */
    public List<SwitchingRules.Event> schemeHistory(String partNumber, String supplier, boolean simulated) {
        try {
            return schemeEvents(partNumber, supplier, simulated);
        } catch (SQLException e) {
            throw new StoreException("reading the inspection scheme of " + partNumber + " failed: "
                    + StoreErrors.describe(e), e);
        }
    }

    private List<SwitchingRules.Event> schemeEvents(String partNumber, String supplier, boolean simulated)
            throws SQLException {
        List<SwitchingRules.Event> lots = new ArrayList<>();
        try (PreparedStatement q = store.db.prepareStatement("SELECT lot, finished_at, severity, disposition, switching_step,"
                + " reinstates_normal FROM inspection WHERE part_number = ? AND supplier = ? AND round = 1"
                + " AND disposition IS NOT NULL AND severity IS NOT NULL AND simulated = ?")) {
            q.setString(1, partNumber);
            q.setString(2, supplier);
            q.setInt(3, simulated ? 1 : 0);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    Integer step = StoreDb.whole(r, 5);
                    Integer reinstates = StoreDb.whole(r, 6);
                    lots.add(new SwitchingRules.LotOutcome(r.getString(2), r.getString(1), Severity.of(r.getString(3)),
                            "accept".equals(r.getString(4)), step == null ? 0 : step, reinstates != null && reinstates != 0));
                }
            }
        }
        List<SwitchingRules.Event> decisions = new ArrayList<>();
        try (PreparedStatement q = store.db.prepareStatement("SELECT decided_at, severity, reason, operator, override"
                + " FROM scheme_decision WHERE part_number = ? AND supplier = ? AND simulated = ? ORDER BY seq")) {
            q.setInt(3, simulated ? 1 : 0);
            q.setString(1, partNumber);
            q.setString(2, supplier);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    decisions.add(new SwitchingRules.Decision(r.getString(1), Severity.of(r.getString(2)), r.getString(3),
                            r.getString(4), r.getInt(5) != 0));
                }
            }
        }
        List<SwitchingRules.Event> all = new ArrayList<>(lots);
        all.sort(Comparator.comparing((SwitchingRules.Event e) -> Instant.parse(e.at())));
        // decisions in their own order, each after every lot decided at or before its instant
        for (SwitchingRules.Event d : decisions) {
            Instant at = Instant.parse(d.at());
            int k = 0;
            while (k < all.size() && !Instant.parse(all.get(k).at()).isAfter(at)) {
                k++;
            }
            all.add(k, d);
        }
        return all;
    }

    private static final long SCHEME_LOCK = 0x6c72_6263_0000_0000L;

    /**
     * Records a decision on a supplier's scheme: the severity a person sets, why, and whether it
     * overrides the rules. Without override the rules must allow it ({@link SwitchingRules#refusal});
     * otherwise nothing is written and the reason is thrown. Decisions are never changed or removed.
     */
    public SwitchingRules.State decideScheme(String partNumber, String supplier, Severity to, String reason,
                                             String operator, boolean override, String now) {
        return decideScheme(partNumber, supplier, to, reason, operator, override, now, false);
    }

    /** As above, on the real scheme or on the simulated bench's (kept apart: one never moves the other). */
    public SwitchingRules.State decideScheme(String partNumber, String supplier, Severity to, String reason,
                                             String operator, boolean override, String now, boolean simulated) {
        if (reason == null || reason.isBlank()) {
            throw new IllegalArgumentException("a decision on the inspection scheme needs a reason");
        }
        String key = "scheme " + partNumber + " / " + supplier + (simulated ? " (simulated)" : "");
        try {
            return store.inTransaction(() -> {
                if (store.postgres) {
                    // two benches deciding on one scheme take turns (SQLite's writes are serialized already)
                    try (PreparedStatement l = store.db.prepareStatement("SELECT pg_advisory_xact_lock(?)")) {
                        l.setLong(1, SCHEME_LOCK ^ key.hashCode());
                        l.execute();
                    }
                }
                SwitchingRules.State before = SwitchingRules.replay(schemeEvents(partNumber, supplier, simulated));
                String refusal = SwitchingRules.refusal(before, to);
                if (refusal != null && !override) {
                    throw new IllegalArgumentException("not recorded: " + refusal);
                }
                int seq;
                try (PreparedStatement q = store.db.prepareStatement("SELECT COALESCE(MAX(seq), 0) + 1 FROM scheme_decision"
                        + " WHERE part_number = ? AND supplier = ?")) {
                    q.setString(1, partNumber);
                    q.setString(2, supplier);
                    try (ResultSet r = q.executeQuery()) {
                        r.next();
                        seq = r.getInt(1);
                    }
                }
                try (PreparedStatement p = store.db.prepareStatement("INSERT INTO scheme_decision (part_number, supplier, seq,"
                        + " decided_at, severity, reason, operator, override, simulated) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                    p.setInt(9, simulated ? 1 : 0);
                    p.setString(1, partNumber);
                    p.setString(2, supplier);
                    p.setInt(3, seq);
                    p.setString(4, now);
                    p.setString(5, to.word());
                    p.setString(6, reason);
                    p.setString(7, operator);
                    p.setInt(8, override ? 1 : 0);
                    p.executeUpdate();
                }
                new DecisionChain(store).link(partNumber, supplier, seq);
                return SwitchingRules.replay(schemeEvents(partNumber, supplier, simulated));
            });
        } catch (SQLException e) {
            throw new StoreException("recording a decision on " + key + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every (part number, supplier) with a scheme: inspections under the rules or decisions. */
    public List<String[]> schemes() {
        return schemes(false);
    }

    /** The schemes of real lots, or of simulated ones: {part number, supplier} each. */
    public List<String[]> schemes(boolean simulated) {
        List<String[]> out = new ArrayList<>();
        String sql = "SELECT part_number, supplier FROM inspection WHERE supplier IS NOT NULL AND simulated = "
                + (simulated ? 1 : 0) + " UNION SELECT part_number, supplier FROM scheme_decision WHERE simulated = "
                + (simulated ? 1 : 0) + " ORDER BY 1, 2";
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery(sql)) {
            while (r.next()) {
                out.add(new String[] {r.getString(1), r.getString(2)});
            }
        } catch (SQLException e) {
            throw new StoreException("listing inspection schemes failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }
}
