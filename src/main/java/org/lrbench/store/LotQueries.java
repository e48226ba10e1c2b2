package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.lrbench.judge.Verdict;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;

/** Listings and statistics read from the store: every inspection with its counts, a part number's history. */
final class LotQueries {
    private final StoreDb store;
    private final InspectionRows inspections;

    LotQueries(StoreDb store, InspectionRows inspections) {
        this.store = store;
        this.inspections = inspections;
    }

    /** Every inspection of every lot, in the order they were started, with counts of their counting attempts. */
    public List<LotRecord> lots() {
        try {
            return records(inspections.inspections(null), summaries(null));
        } catch (SQLException e) {
            throw new StoreException("listing lots failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every inspection of one lot, first to latest. */
    public List<LotRecord> lot(String lot) {
        try {
            return records(inspections.inspections(lot), summaries(lot));
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private static List<LotRecord> records(List<Inspection> inspections, Map<String, List<Attempt>> byRound) {
        List<LotRecord> out = new ArrayList<>();
        for (Inspection i : inspections) {
            out.add(record(i, byRound.getOrDefault(i.lot() + "\n" + i.round(), List.of())));
        }
        return out;
    }

    /**
     * The attempts of one lot (or of every lot) without their JSON records, in one query, grouped by
     * lot and round ("LOT\nROUND"): what listings and histories count, without reading every record.
     */
    private Map<String, List<Attempt>> summaries(String lot) throws SQLException {
        Map<String, List<Attempt>> out = new LinkedHashMap<>();
        String sql = "SELECT lot, serial, attempt, round, position, verdict, inductance_h, series_resistance_ohm, measured_at"
                + " FROM attempt" + (lot == null ? "" : " WHERE lot = ?") + " ORDER BY lot, round, position, attempt";
        try (PreparedStatement q = store.db.prepareStatement(sql)) {
            if (lot != null) {
                q.setString(1, lot);
            }
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    Attempt a = new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5),
                            StoreDb.verdict(r, 6), StoreDb.real(r, 7), StoreDb.real(r, 8), r.getString(9), null, null, null, null, null, null);
                    out.computeIfAbsent(a.lot() + "\n" + a.round(), k -> new ArrayList<>()).add(a);
                }
            }
        }
        return out;
    }

    private static LotRecord record(Inspection i, List<Attempt> all) {
        List<Attempt> counting = Attempt.counting(all);
        int passed = count(counting, Verdict.PASS);
        int failed = count(counting, Verdict.FAIL);
        int errors = count(counting, Verdict.ERROR);
        int skipped = count(counting, Verdict.SKIPPED);
        LotTerms t = i.terms();
        return new LotRecord(t.lot(), i.round(), t.partNumber(), t.planPath(), t.planSha256(), t.bench(), t.lotSize(),
                t.sampleSize(), t.sampling(), t.operator(), i.reason(), i.createdAt(), i.disposition(),
                i.dispositionReason(), i.finishedAt(), passed + failed + errors, passed, failed, errors, skipped, all.size(),
                t.supplier(), t.severity(), t.severityReason(), t.classPlans(), t.simulated());
    }

    private static int count(List<Attempt> as, Verdict verdict) {
        return (int) as.stream().filter(a -> a.verdict() == verdict).count();
    }

    /**
     * A part number's inspections in the order they were started, with yield (passed over passed
     * and failed) and the mean and sample standard deviation of the measured L and R, over the
     * attempts that count.
     */
    public List<LotStatistics> history(String partNumber) {
        return history(partNumber, false);
    }

    /** As above, of real lots only, or of lots on the simulated bench only: the two are never mixed. */
    public List<LotStatistics> history(String partNumber, boolean simulated) {
        return history(partNumber, null, simulated);
    }

    /** As above, of one supplier's lots only ("" for lots without a supplier; null: every supplier's). */
    public List<LotStatistics> history(String partNumber, String supplier, boolean simulated) {
        List<LotStatistics> out = new ArrayList<>();
        try {
            Map<String, List<Attempt>> byRound = summaries(null);
            for (Inspection i : inspections.inspections(null)) {
                if (!i.terms().partNumber().equals(partNumber) || i.terms().simulated() != simulated) {
                    continue;
                }
                String theirs = i.terms().supplier() == null ? "" : i.terms().supplier();
                if (supplier != null && !supplier.equals(theirs)) {
                    continue;
                }
                List<Attempt> judged = Attempt.counting(byRound.getOrDefault(i.lot() + "\n" + i.round(), List.of()))
                        .stream().filter(Attempt::judged).toList();
                int passed = count(judged, Verdict.PASS);
                out.add(stats(i, judged, passed));
            }
        } catch (SQLException e) {
            throw new StoreException("reading the history of " + partNumber + " failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    private static LotStatistics stats(Inspection i, List<Attempt> judged, int passed) {
        double[] l = judged.stream().map(Attempt::inductanceH).filter(v -> v != null && Double.isFinite(v))
                .mapToDouble(Double::doubleValue).toArray();
        double[] r = judged.stream().map(Attempt::seriesResistanceOhm).filter(v -> v != null && Double.isFinite(v))
                .mapToDouble(Double::doubleValue).toArray();
        int n = judged.size();
        return new LotStatistics(i.lot(), i.round(), i.createdAt(), i.disposition(), n, passed,
                n == 0 ? Double.NaN : (double) passed / n, mean(l), sd(l), mean(r), sd(r));
    }

    private static Double mean(double[] xs) {
        return xs.length == 0 ? null : Arrays.stream(xs).average().orElseThrow();
    }

    private static Double sd(double[] xs) {
        if (xs.length < 2) {
            return null;
        }
        double m = mean(xs);
        return Math.sqrt(Arrays.stream(xs).map(x -> (x - m) * (x - m)).sum() / (xs.length - 1));
    }
}
