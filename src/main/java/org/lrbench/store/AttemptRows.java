package org.lrbench.store;

import java.nio.file.Path;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;

/** The attempt table: every measurement, appended and never replaced, each a link of its lot's chain. */
final class AttemptRows {
    private final StoreDb store;
    private final InspectionRows inspections;

    AttemptRows(StoreDb store, InspectionRows inspections) {
        this.store = store;
        this.inspections = inspections;
    }

    /**
     * Commits one attempt and its link in the lot's hash store.chain. The attempt number must be the next
     * one of the serial: when another run stored that number first, the commit is refused and
     * nothing is written.
     */
    public void record(Attempt a, String programVersion, String tracesSha256) {
        try {
            store.inTransaction(() -> {
                store.chain.lock(a.lot());
                int next = nextAttempt(a.lot(), a.serial());
                if (a.number() != next) {
                    throw new StoreException("serial " + a.serial() + " of lot " + a.lot() + " already has attempt "
                            + a.number() + " (stored by another run meanwhile); this measurement was not stored", null);
                }
                Inspection open = inspections.latestInspection(a.lot()).orElseThrow(() -> new StoreException("lot " + a.lot()
                        + " is not stored; start it before storing parts", null));
                if (open.round() != a.round() || open.decided()) {
                    throw new StoreException("inspection " + a.round() + " of lot " + a.lot() + " is closed"
                            + " (decided or followed by a re-inspection); this measurement was not stored", null);
                }
                try (PreparedStatement p = store.db.prepareStatement("INSERT INTO attempt (lot, serial, attempt, round,"
                        + " position, verdict, inductance_h, series_resistance_ohm, measured_at, program_version,"
                        + " operator, reason, result_json, json_file, traces_file, traces_bytes, traces_sha256)"
                        + " VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                    p.setString(1, a.lot());
                    p.setString(2, a.serial());
                    p.setInt(3, a.number());
                    p.setInt(4, a.round());
                    p.setInt(5, a.position());
                    p.setString(6, a.verdict().word());
                    p.setObject(7, a.inductanceH());
                    p.setObject(8, a.seriesResistanceOhm());
                    p.setString(9, a.measuredAt());
                    p.setString(10, programVersion);
                    p.setString(11, a.operator());
                    p.setString(12, a.reason());
                    p.setString(13, a.resultJson());
                    p.setString(14, a.jsonFile());
                    p.setString(15, a.tracesFile());
                    p.setObject(16, a.tracesBytes());
                    p.setString(17, tracesSha256);
                    p.executeUpdate();
                }
                store.chain.append(a.lot(), "attempt", a.round(), a.serial(), a.number(),
                        Canonical.sha256(Canonical.attempt(a, programVersion, tracesSha256)));
                return null;
            });
        } catch (SQLException e) {
            throw new StoreException("storing " + a.serial() + " of lot " + a.lot() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** The number the serial's next attempt in the lot gets: 1 for a serial not yet stored. */
    public int nextAttempt(String lot, String serial) {
        try (PreparedStatement q = store.db.prepareStatement("SELECT MAX(attempt) FROM attempt WHERE lot = ? AND serial = ?")) {
            q.setString(1, lot);
            q.setString(2, serial);
            try (ResultSet r = q.executeQuery()) {
                return r.next() ? r.getInt(1) + 1 : 1;
            }
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    static final String ATTEMPT_COLUMNS = "lot, serial, attempt, round, position, verdict, inductance_h,"
            + " series_resistance_ohm, measured_at, operator, reason, result_json, json_file, traces_file, traces_bytes";

    /** Every attempt of a lot, by round, position and attempt number. */
    public List<Attempt> attempts(String lot) {
        List<Attempt> out = new ArrayList<>();
        try (PreparedStatement q = store.db.prepareStatement("SELECT " + ATTEMPT_COLUMNS + " FROM attempt WHERE lot = ?"
                + " ORDER BY round, position, attempt")) {
            q.setString(1, lot);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    out.add(attempt(r));
                }
            }
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** The attempts of one inspection round. */
    public List<Attempt> attempts(String lot, int round) {
        return attempts(lot).stream().filter(a -> a.round() == round).toList();
    }

    /** The counting attempts of the lot's latest inspection (empty for a lot not stored). */
    public List<Attempt> parts(String lot) {
        Optional<Inspection> i = inspections.latestInspection(lot);
        return i.isEmpty() ? List.of() : Attempt.counting(attempts(lot, i.get().round()));
    }

    private static Attempt attempt(ResultSet r) throws SQLException {
        String traces = r.getString(14);
        if (traces != null) {
            // stores before schema 3 kept the archive's whole path; records name files in the lot's folder
            traces = Path.of(traces).getFileName().toString();
        }
        Long bytes = r.getLong(15);
        if (r.wasNull()) {
            bytes = null;
        }
        return new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5), StoreDb.verdict(r, 6),
                StoreDb.real(r, 7), StoreDb.real(r, 8), r.getString(9), r.getString(10), r.getString(11), r.getString(12),
                r.getString(13), traces, bytes);
    }

    /** Removes a lot, its parts and its chain (the demo starts its lot afresh; nothing else deletes). */
    public void deleteLot(String lot) {
        try {
            store.inTransaction(() -> {
                for (String table : List.of("attempt", "chain_record", "lot_chain", "inspection")) {
                    try (PreparedStatement p = store.db.prepareStatement("DELETE FROM " + table + " WHERE lot = ?")) {
                        p.setString(1, lot);
                        p.executeUpdate();
                    }
                }
                return null;
            });
        } catch (SQLException e) {
            throw new StoreException("removing lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }
}
