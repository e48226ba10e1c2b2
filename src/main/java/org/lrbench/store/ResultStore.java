package org.lrbench.store;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;

/**
 * The results store: an embedded SQLite file (xerial sqlite-jdbc) by default, or a PostgreSQL
 * database through a JDBC URL when several benches share one store. The SQL is the portable subset
 * both speak. Each part result is committed on its own as soon as it is complete, so a crash loses
 * at most the part being measured; the primary key (lot, serial) keeps a part from being stored
 * twice, even by two benches writing at once, and a lot cannot be continued with a plan other than
 * the one it was started with.
 */
public final class ResultStore implements AutoCloseable {
    private final Connection db;

    private ResultStore(Connection db) {
        this.db = db;
    }

    /** Opens (creating if needed) an SQLite store file and brings its schema up to date. */
    public static ResultStore open(Path file) {
        try {
            Files.createDirectories(file.toAbsolutePath().getParent());
            org.sqlite.SQLiteConfig cfg = new org.sqlite.SQLiteConfig();
            cfg.enforceForeignKeys(true);
            cfg.setJournalMode(org.sqlite.SQLiteConfig.JournalMode.WAL);
            cfg.setBusyTimeout(10_000);
            // a transaction takes the write lock when it begins: two writers then wait for each
            // other instead of failing when a read would have to turn into a write
            cfg.setTransactionMode(org.sqlite.SQLiteConfig.TransactionMode.IMMEDIATE);
            Connection c = DriverManager.getConnection("jdbc:sqlite:" + file, cfg.toProperties());
            ResultStore store = new ResultStore(c);
            store.migrate();
            return store;
        } catch (Exception e) {
            throw new StoreException("cannot open the results store " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Opens a store by JDBC URL: {@code jdbc:postgresql://HOST:PORT/DB?user=...} for a shared
     * PostgreSQL store, or {@code jdbc:sqlite:FILE}.
     */
    public static ResultStore openUrl(String url) {
        if (url.startsWith("jdbc:sqlite:")) {
            return open(Path.of(url.substring("jdbc:sqlite:".length())));
        }
        if (!url.startsWith("jdbc:postgresql:")) {
            throw new StoreException("store URL '" + url + "': use jdbc:postgresql://... or jdbc:sqlite:FILE", null);
        }
        try {
            Connection c = DriverManager.getConnection(url);
            ResultStore store = new ResultStore(c);
            store.migrate();
            return store;
        } catch (SQLException e) {
            throw new StoreException("cannot open the results store at " + url.replaceAll("password=[^&]*", "password=***")
                    + ": " + e.getMessage(), e);
        }
    }

    /** Work done inside one transaction. */
    @FunctionalInterface
    private interface Work {
        void run() throws SQLException;
    }

    /** Runs work as one transaction: committed whole, or rolled back whole on any failure. */
    private void inTransaction(Work work) throws SQLException {
        db.setAutoCommit(false);
        try {
            work.run();
            db.commit();
        } catch (SQLException | RuntimeException e) {
            db.rollback();
            throw e;
        } finally {
            db.setAutoCommit(true);
        }
    }

    /** The schema version the store is at. */
    public int version() {
        try (Statement s = db.createStatement(); ResultSet r = s.executeQuery("SELECT version FROM schema_version")) {
            return r.next() ? r.getInt(1) : 0;
        } catch (SQLException e) {
            throw new StoreException("reading the schema version failed: " + e.getMessage(), e);
        }
    }

    private void migrate() throws SQLException {
        try (Statement s = db.createStatement()) {
            s.execute("CREATE TABLE IF NOT EXISTS schema_version (version INTEGER NOT NULL)");
        }
        int at = version();
        for (int step = at; step < Migrations.STEPS.size(); step++) {
            int version = step + 1;
            List<String> statements = Migrations.STEPS.get(step);
            inTransaction(() -> {
                try (Statement s = db.createStatement()) {
                    for (String sql : statements) {
                        s.execute(sql);
                    }
                    s.execute("DELETE FROM schema_version");
                    s.execute("INSERT INTO schema_version (version) VALUES (" + version + ")");
                }
            });
        }
    }

    /** Records a lot, or checks that an existing one was started with the same plan. */
    public void beginLot(String lot, String partNumber, String planPath, String planSha256, String bench,
                         Integer lotSize, Integer sampleSize, String now) {
        try {
            try (PreparedStatement q = db.prepareStatement("SELECT plan_sha256, disposition FROM lot WHERE lot = ?")) {
                q.setString(1, lot);
                try (ResultSet r = q.executeQuery()) {
                    if (r.next()) {
                        if (!r.getString(1).equals(planSha256)) {
                            throw new StoreException("lot " + lot + " was started with another plan (content "
                                    + r.getString(1).substring(0, 12) + "..., this one " + planSha256.substring(0, 12)
                                    + "...); use another lot number or the original plan", null);
                        }
                        return;
                    }
                }
            }
            try (PreparedStatement p = db.prepareStatement("INSERT INTO lot (lot, part_number, plan_path, plan_sha256,"
                    + " bench, lot_size, sample_size, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?)")) {
                p.setString(1, lot);
                p.setString(2, partNumber);
                p.setString(3, planPath);
                p.setString(4, planSha256);
                p.setString(5, bench);
                p.setObject(6, lotSize);
                p.setObject(7, sampleSize);
                p.setString(8, now);
                p.executeUpdate();
            }
        } catch (SQLException e) {
            throw new StoreException("recording lot " + lot + " failed: " + e.getMessage(), e);
        }
    }

    /** Commits one part's result; an earlier error result of the same serial is replaced. */
    public void savePart(int position, PartResult result) {
        savePart(position, result, null, null);
    }

    /** Commits one part's result with the trace archive it references (or nulls without one). */
    public void savePart(int position, PartResult result, String tracesFile, Long tracesBytes) {
        try {
            String json = ResultFiles.JSON.writeValueAsString(result);
            inTransaction(() -> {
                try (PreparedStatement q = db.prepareStatement(
                        "SELECT verdict FROM part_result WHERE lot = ? AND serial = ?")) {
                    q.setString(1, result.lot());
                    q.setString(2, result.serial());
                    try (ResultSet r = q.executeQuery()) {
                        if (r.next() && !r.getString(1).equals("error")) {
                            throw new StoreException("serial " + result.serial() + " of lot " + result.lot()
                                    + " is already stored with verdict " + r.getString(1), null);
                        }
                    }
                }
                try (PreparedStatement d = db.prepareStatement(
                        "DELETE FROM part_result WHERE lot = ? AND serial = ? AND verdict = 'error'")) {
                    d.setString(1, result.lot());
                    d.setString(2, result.serial());
                    d.executeUpdate();
                }
                try (PreparedStatement p = db.prepareStatement("INSERT INTO part_result (lot, serial, position,"
                        + " verdict, inductance_h, series_resistance_ohm, measured_at, program_version, result_json,"
                        + " traces_file, traces_bytes) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                    p.setString(1, result.lot());
                    p.setString(2, result.serial());
                    p.setInt(3, position);
                    p.setString(4, result.verdict());
                    p.setObject(5, result.inductanceH());
                    p.setObject(6, result.seriesResistanceOhm());
                    p.setString(7, result.finishedAt());
                    p.setString(8, result.programVersion());
                    p.setString(9, json);
                    p.setString(10, tracesFile);
                    p.setObject(11, tracesBytes);
                    p.executeUpdate();
                }
            });
        } catch (SQLException | com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new StoreException("storing " + result.serial() + " of lot " + result.lot() + " failed: "
                    + e.getMessage(), e);
        }
    }

    /** Serials of a lot that need no measuring again (everything but errors). */
    public Set<String> completed(String lot) {
        Set<String> out = new LinkedHashSet<>();
        for (PartRow r : parts(lot)) {
            if (!r.verdict().equals("error")) {
                out.add(r.serial());
            }
        }
        return out;
    }

    /** Removes a lot and its parts (the demo starts its lot afresh; nothing else deletes). */
    public void deleteLot(String lot) {
        try {
            inTransaction(() -> {
                try (PreparedStatement a = db.prepareStatement("DELETE FROM part_result WHERE lot = ?");
                     PreparedStatement b = db.prepareStatement("DELETE FROM lot WHERE lot = ?")) {
                    a.setString(1, lot);
                    a.executeUpdate();
                    b.setString(1, lot);
                    b.executeUpdate();
                }
            });
        } catch (SQLException e) {
            throw new StoreException("removing lot " + lot + " failed: " + e.getMessage(), e);
        }
    }

    public void finishLot(String lot, String disposition, String reason, String now) {
        try (PreparedStatement p = db.prepareStatement(
                "UPDATE lot SET disposition = ?, disposition_reason = ?, finished_at = ? WHERE lot = ?")) {
            p.setString(1, disposition);
            p.setString(2, reason);
            p.setString(3, now);
            p.setString(4, lot);
            p.executeUpdate();
        } catch (SQLException e) {
            throw new StoreException("recording the disposition of lot " + lot + " failed: " + e.getMessage(), e);
        }
    }

    public List<PartRow> parts(String lot) {
        List<PartRow> out = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT lot, serial, position, verdict, inductance_h,"
                + " series_resistance_ohm, measured_at, result_json FROM part_result WHERE lot = ? ORDER BY position")) {
            q.setString(1, lot);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    out.add(new PartRow(r.getString(1), r.getString(2), r.getInt(3), r.getString(4),
                            real(r, 5), real(r, 6), r.getString(7), r.getString(8)));
                }
            }
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + e.getMessage(), e);
        }
        return out;
    }

    public List<LotRecord> lots() {
        List<LotRecord> out = new ArrayList<>();
        String sql = "SELECT l.lot, l.part_number, l.plan_path, l.plan_sha256, l.bench, l.lot_size, l.sample_size,"
                + " l.created_at, l.disposition, l.disposition_reason, l.finished_at,"
                + " COUNT(p.serial), SUM(CASE WHEN p.verdict = 'pass' THEN 1 ELSE 0 END),"
                + " SUM(CASE WHEN p.verdict = 'fail' THEN 1 ELSE 0 END)"
                + " FROM lot l LEFT JOIN part_result p ON p.lot = l.lot GROUP BY l.lot, l.part_number, l.plan_path,"
                + " l.plan_sha256, l.bench, l.lot_size, l.sample_size, l.created_at, l.disposition,"
                + " l.disposition_reason, l.finished_at ORDER BY l.created_at";
        try (Statement s = db.createStatement(); ResultSet r = s.executeQuery(sql)) {
            while (r.next()) {
                out.add(new LotRecord(r.getString(1), r.getString(2), r.getString(3), r.getString(4), r.getString(5),
                        whole(r, 6), whole(r, 7), r.getString(8), r.getString(9),
                        r.getString(10), r.getString(11), r.getInt(12), r.getInt(13), r.getInt(14)));
            }
        } catch (SQLException e) {
            throw new StoreException("listing lots failed: " + e.getMessage(), e);
        }
        return out;
    }

    /**
     * A part number's lots in the order they were started, with yield (passed over passed and
     * failed) and the mean and sample standard deviation of the measured L and R.
     */
    public List<LotStatistics> history(String partNumber) {
        List<LotStatistics> out = new ArrayList<>();
        String sql = "SELECT l.lot, l.created_at, l.disposition, p.verdict, p.inductance_h, p.series_resistance_ohm"
                + " FROM lot l LEFT JOIN part_result p ON p.lot = l.lot AND p.verdict IN ('pass', 'fail')"
                + " WHERE l.part_number = ? ORDER BY l.created_at, l.lot, p.position";
        try (PreparedStatement q = db.prepareStatement(sql)) {
            q.setString(1, partNumber);
            try (ResultSet r = q.executeQuery()) {
                String lot = null;
                String created = null;
                String disposition = null;
                List<double[]> values = new ArrayList<>();
                int passed = 0;
                while (r.next()) {
                    if (!r.getString(1).equals(lot)) {
                        if (lot != null) {
                            out.add(stats(lot, created, disposition, values, passed));
                        }
                        lot = r.getString(1);
                        created = r.getString(2);
                        disposition = r.getString(3);
                        values = new ArrayList<>();
                        passed = 0;
                    }
                    if (r.getString(4) != null) {
                        passed += r.getString(4).equals("pass") ? 1 : 0;
                        Double l = real(r, 5);
                        Double res = real(r, 6);
                        values.add(new double[] {l == null ? Double.NaN : l, res == null ? Double.NaN : res});
                    }
                }
                if (lot != null) {
                    out.add(stats(lot, created, disposition, values, passed));
                }
            }
        } catch (SQLException e) {
            throw new StoreException("reading the history of " + partNumber + " failed: " + e.getMessage(), e);
        }
        return out;
    }

    private static LotStatistics stats(String lot, String created, String disposition, List<double[]> v, int passed) {
        double[] mean = new double[2];
        double[] sd = new double[2];
        for (int k = 0; k < 2; k++) {
            final int c = k;
            double[] xs = v.stream().mapToDouble(a -> a[c]).filter(Double::isFinite).toArray();
            if (xs.length > 0) {
                mean[k] = java.util.Arrays.stream(xs).average().orElse(Double.NaN);
                sd[k] = xs.length > 1 ? Math.sqrt(java.util.Arrays.stream(xs).map(x -> (x - mean[c]) * (x - mean[c])).sum()
                        / (xs.length - 1)) : Double.NaN;
            } else {
                mean[k] = Double.NaN;
                sd[k] = Double.NaN;
            }
        }
        int n = v.size();
        return new LotStatistics(lot, created, disposition, n, passed, n == 0 ? Double.NaN : (double) passed / n,
                finite(mean[0]), finite(sd[0]), finite(mean[1]), finite(sd[1]));
    }

    private static Double real(ResultSet r, int column) throws SQLException {
        double v = r.getDouble(column);
        return r.wasNull() ? null : v;
    }

    private static Integer whole(ResultSet r, int column) throws SQLException {
        int v = r.getInt(column);
        return r.wasNull() ? null : v;
    }

    private static Double finite(double x) {
        return Double.isFinite(x) ? x : null;
    }

    @Override
    public void close() {
        try {
            db.close();
        } catch (SQLException ignored) {
            // closing after use; nothing is pending
        }
    }
}
