package org.lrbench.store;

import org.lrbench.sampling.LotDisposition;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Types;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;

/** The inspection table: a lot's terms, its rounds and their decisions, each a link of its chain. */
final class InspectionRows {
    private final StoreDb store;

    InspectionRows(StoreDb store) {
        this.store = store;
    }

    /**
     * The inspection a lot run works on. A new lot starts inspection 1 under the given terms. An
     * open inspection is continued only under the same terms ({@link LotTermsException} names every
     * difference). A decided inspection is returned as it is (closed: nothing more is measured), unless
     * {@code reinspectReason} is given, which opens the next round under the given terms.
     */
    public Inspection inspect(LotTerms given, String reinspectReason, String now) {
        try {
            return store.inTransaction(() -> {
                store.chain.lock(given.lot());
                Optional<Inspection> latest = latestInspection(given.lot());
                if (latest.isEmpty()) {
                    return insertInspection(new Inspection(given, 1, null, now, null, null, null));
                }
                Inspection cur = latest.get();
                if (!cur.decided()) {
                    if (reinspectReason != null) {
                        throw new LotTermsException("lot " + given.lot() + ": inspection " + cur.round() + " is still"
                                + " open; finish it (run without the re-inspection option) before re-inspecting", List.of());
                    }
                    List<String> diff = cur.terms().differences(given);
                    if (!diff.isEmpty()) {
                        throw new LotTermsException("lot " + given.lot() + " was started on " + cur.createdAt()
                                + " under other terms: " + String.join("; ", diff) + ". Continue it with its own terms,"
                                + " or use another lot number", diff);
                    }
                    return cur;
                }
                if (reinspectReason == null) {
                    return cur;
                }
                return insertInspection(new Inspection(given, cur.round() + 1, reinspectReason, now, null, null, null));
            });
        } catch (SQLException e) {
            throw new StoreException("recording lot " + given.lot() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private Inspection insertInspection(Inspection i) throws SQLException {
        LotTerms t = i.terms();
        try (PreparedStatement p = store.db.prepareStatement("INSERT INTO inspection (lot, round, part_number, plan_path,"
                + " plan_sha256, bench, lot_size, sample_size, sampling, operator, reason, created_at, supplier, severity,"
                + " severity_reason, class_plans, simulated) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
            p.setString(1, t.lot());
            p.setInt(2, i.round());
            p.setString(3, t.partNumber());
            p.setString(4, t.planPath());
            p.setString(5, t.planSha256());
            p.setString(6, t.bench());
            p.setObject(7, t.lotSize());
            p.setObject(8, t.sampleSize());
            p.setString(9, t.sampling());
            p.setString(10, t.operator());
            p.setString(11, i.reason());
            p.setString(12, i.createdAt());
            p.setString(13, t.supplier());
            p.setString(14, t.severity());
            p.setString(15, t.severityReason());
            p.setString(16, ClassPlansJson.text(t.classPlans()));
            p.setInt(17, t.simulated() ? 1 : 0);
            p.executeUpdate();
        }
        store.chain.append(t.lot(), "terms", i.round(), null, null, Canonical.sha256(Canonical.terms(i)));
        return i;
    }

    /** The lot's latest inspection, if the lot is stored. */
    public Optional<Inspection> latestInspection(String lot) {
        try {
            List<Inspection> all = inspections(lot);
            return all.isEmpty() ? Optional.empty() : Optional.of(all.get(all.size() - 1));
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private static final String INSPECTION_COLUMNS = "lot, round, part_number, plan_path, plan_sha256, bench, lot_size,"
            + " sample_size, sampling, operator, reason, created_at, disposition, disposition_reason, finished_at, supplier,"
            + " severity, severity_reason, switching_step, reinstates_normal, class_plans, simulated";

    List<Inspection> inspections(String lot) throws SQLException {
        String sql = "SELECT " + INSPECTION_COLUMNS + " FROM inspection" + (lot == null ? "" : " WHERE lot = ?")
                + " ORDER BY created_at, lot, round";
        List<Inspection> out = new ArrayList<>();
        try (PreparedStatement q = store.db.prepareStatement(sql)) {
            if (lot != null) {
                q.setString(1, lot);
            }
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    out.add(inspection(r));
                }
            }
        }
        return out;
    }

    /** A stored disposition (null: open); a word lrbench never writes is a store fault naming the lot. */
    private static LotDisposition.State disposition(String word, String lot) {
        if (word == null) {
            return null;
        }
        try {
            return LotDisposition.State.of(word);
        } catch (IllegalArgumentException e) {
            throw new StoreException("lot " + lot + ": the stored " + e.getMessage() + " (the store was changed outside"
                    + " lrbench; run lrbench verify)", e);
        }
    }

    private static Inspection inspection(ResultSet r) throws SQLException {
        LotTerms t = new LotTerms(r.getString(1), r.getString(3), r.getString(4), r.getString(5), r.getString(6),
                StoreDb.whole(r, 7), StoreDb.whole(r, 8), r.getString(9), r.getString(10), r.getString(16), r.getString(17),
                r.getString(18), ClassPlansJson.read(r.getString(21), r.getString(1)), r.getInt(22) != 0);
        Integer reinstates = StoreDb.whole(r, 20);
        return new Inspection(t, r.getInt(2), r.getString(11), r.getString(12), disposition(r.getString(13), t.lot()),
                r.getString(14),
                r.getString(15), StoreDb.whole(r, 19), reinstates == null ? null : reinstates != 0);
    }

    /**
     * Records the disposition of an open inspection, once. Returns false (and changes nothing) when
     * the inspection was already decided.
     */
    public boolean decide(String lot, int round, LotDisposition.State disposition, String reason, String now) {
        return decide(lot, round, disposition, reason, null, null, now);
    }

    /**
     * As above, with what the decision means for the switching rules (an original inspection under
     * a supplier's scheme): the switching score's step and whether it reinstates normal inspection.
     */
    public boolean decide(String lot, int round, LotDisposition.State disposition, String reason, Integer switchingStep,
                          Boolean reinstatesNormal, String now) {
        try {
            return store.inTransaction(() -> {
                store.chain.lock(lot);
                int n;
                try (PreparedStatement p = store.db.prepareStatement("UPDATE inspection SET disposition = ?,"
                        + " disposition_reason = ?, finished_at = ?, switching_step = ?, reinstates_normal = ?"
                        + " WHERE lot = ? AND round = ? AND disposition IS NULL")) {
                    p.setString(1, disposition.word());
                    p.setString(2, reason);
                    p.setString(3, now);
                    setWhole(p, 4, switchingStep);
                    setWhole(p, 5, reinstatesNormal == null ? null : reinstatesNormal ? 1 : 0);
                    p.setString(6, lot);
                    p.setInt(7, round);
                    n = p.executeUpdate();
                }
                if (n == 0) {
                    return false;
                }
                Inspection i = inspections(lot).stream().filter(x -> x.round() == round).findFirst().orElseThrow();
                store.chain.append(lot, "decision", round, null, null, Canonical.sha256(Canonical.decision(i)));
                return true;
            });
        } catch (SQLException e) {
            throw new StoreException("recording the disposition of lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private static void setWhole(PreparedStatement p, int column, Integer v) throws SQLException {
        if (v == null) {
            p.setNull(column, Types.INTEGER);
        } else {
            p.setInt(column, v);
        }
    }
}
