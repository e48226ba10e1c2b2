package org.lrbench.store;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.sql.Types;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.lrbench.judge.Verdict;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SwitchingRules;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteOpenMode;

/**
 * The results store: an embedded SQLite file (xerial sqlite-jdbc) by default, or a PostgreSQL
 * database through a JDBC URL when several benches share one store. The SQL is the portable subset
 * both speak.
 * <ul>
 * <li>A lot is inspected under fixed terms ({@link LotTerms}); continuing it with other terms is
 * refused, a decided inspection is closed, and a re-inspection is a new round with its reason.</li>
 * <li>Every measurement is an {@link Attempt}, committed on its own as soon as it is complete and
 * never replaced; the attempt that counts for a part is its latest one in the round.</li>
 * <li>Every record (terms, attempt, decision) is a link of the lot's SHA-256 hash chain
 * ({@link Canonical}), so {@link #chainFindings} names a row altered, removed or added behind
 * lrbench's back.</li>
 * <li>The schema is migrated under a write lock, so benches opening one new store at once agree;
 * a store of a newer schema is refused and never written; a read-only store can be read.</li>
 * </ul>
 */
public final class ResultStore implements AutoCloseable {
    /** A constant key for PostgreSQL's advisory lock around migrations. */
    private static final long MIGRATION_LOCK = 0x6c7262656e6368L;
    private final Connection db;
    private final String where;
    private final boolean postgres;
    private final boolean readOnly;
    private final HashChain chain;

    private ResultStore(Connection db, String where, boolean postgres, boolean readOnly) {
        this.db = db;
        this.chain = new HashChain(db);
        this.where = where;
        this.postgres = postgres;
        this.readOnly = readOnly;
    }

    /** The schema version this program writes. */
    public static int latestVersion() {
        return Migrations.STEPS.size();
    }

    /**
     * Opens (creating if needed) an SQLite store file and brings its schema up to date. A file this
     * process may not write is opened read-only: it can be read if its schema is current.
     */
    public static ResultStore open(Path file) {
        boolean readOnly = Files.exists(file) && !Files.isWritable(file);
        return open(file, readOnly);
    }

    /** Opens an existing SQLite store for reading only: nothing is migrated or written. */
    public static ResultStore openForReading(Path file) {
        if (!Files.isRegularFile(file)) {
            throw new StoreException("no results store at " + file, null);
        }
        return open(file, true);
    }

    private static ResultStore open(Path file, boolean readOnly) {
        Connection c = null;
        try {
            if (!readOnly) {
                Files.createDirectories(file.toAbsolutePath().getParent());
            }
            SQLiteConfig cfg = new SQLiteConfig();
            cfg.enforceForeignKeys(true);
            cfg.setBusyTimeout(10_000);
            if (readOnly) {
                cfg.setReadOnly(true);
            } else {
                cfg.setJournalMode(SQLiteConfig.JournalMode.WAL);
                // a transaction takes the write lock when it begins: two writers then wait for each
                // other instead of failing when a read would have to turn into a write
                cfg.setTransactionMode(SQLiteConfig.TransactionMode.IMMEDIATE);
            }
            c = readOnly ? connectForReading(file, cfg) : connectWithRetry("jdbc:sqlite:" + file, cfg);
            ResultStore store = new ResultStore(c, file.toString(), false, readOnly);
            store.prepare();
            return store;
        } catch (StoreException e) {
            closeQuietly(c);
            throw e;
        } catch (SQLException e) {
            closeQuietly(c);
            throw new StoreException("cannot open the results store " + file + ": " + StoreErrors.describe(e), e);
        } catch (IOException e) {
            throw new StoreException("cannot open the results store " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * A store on read-only media (a copy handed to an auditor, a mounted backup): SQLite's shared
     * memory file cannot be made there, so the file is opened as immutable, unless a write-ahead
     * log beside it still holds records not yet in the file, which would then go unread.
     */
    private static Connection connectForReading(Path file, SQLiteConfig cfg) throws SQLException {
        Connection plain = null;
        try {
            plain = connectWithRetry("jdbc:sqlite:" + file, cfg);
            try (Statement s = plain.createStatement(); ResultSet r = s.executeQuery("SELECT COUNT(*) FROM sqlite_master")) {
                r.next();
            }
            return plain;
        } catch (SQLException e) {
            closeQuietly(plain);
            if (!String.valueOf(e.getMessage()).contains("SQLITE_CANTOPEN")) {
                throw e;
            }
            Path wal = Path.of(file + "-wal");
            try {
                if (Files.exists(wal) && Files.size(wal) > 0) {
                    throw new StoreException("the results store " + file + " cannot be read here: its folder is read-only"
                            + " and " + wal.getFileName() + " holds records not yet folded into the file; copy the store"
                            + " with its -wal and -shm files to a writable folder and read it there", e);
                }
            } catch (IOException io) {
                throw new StoreException("cannot read " + wal + ": " + io.getMessage(), io);
            }
            cfg.setOpenMode(SQLiteOpenMode.OPEN_URI);
            return DriverManager.getConnection("jdbc:sqlite:file:" + file.toAbsolutePath() + "?immutable=1",
                    cfg.toProperties());
        }
    }

    /** Setting WAL mode on a new file needs a lock for a moment; a bench opening it at the same time waits. */
    private static Connection connectWithRetry(String url, SQLiteConfig cfg) throws SQLException {
        for (int attempt = 1; ; attempt++) {
            try {
                return DriverManager.getConnection(url, cfg.toProperties());
            } catch (SQLException e) {
                if (attempt >= 50 || !String.valueOf(e.getMessage()).contains("SQLITE_BUSY")) {
                    throw e;
                }
                try {
                    Thread.sleep(20L * attempt);
                } catch (InterruptedException i) {
                    Thread.currentThread().interrupt();
                    throw e;
                }
            }
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
        String shown = url.replaceAll("password=[^&]*", "password=***");
        Connection c = null;
        try {
            c = DriverManager.getConnection(url);
            ResultStore store = new ResultStore(c, shown, true, false);
            store.prepare();
            return store;
        } catch (StoreException e) {
            closeQuietly(c);
            throw e;
        } catch (SQLException e) {
            closeQuietly(c);
            throw new StoreException("cannot open the results store at " + shown + ": " + StoreErrors.describe(e), e);
        }
    }

    /** Work done inside one transaction. */
    @FunctionalInterface
    private interface Work<T> {
        T run() throws SQLException;
    }

    /** Runs work as one transaction: committed whole, or rolled back whole on any failure. */
    private <T> T inTransaction(Work<T> work) throws SQLException {
        if (readOnly) {
            throw new StoreException("the results store " + where + " is open for reading only (the file is not"
                    + " writable here); nothing was written", null);
        }
        db.setAutoCommit(false);
        try {
            T out = work.run();
            db.commit();
            return out;
        } catch (SQLException | RuntimeException e) {
            try {
                db.rollback();
            } catch (SQLException afterFailure) {
                e.addSuppressed(afterFailure);
            }
            throw e;
        } finally {
            try {
                db.setAutoCommit(true);
            } catch (SQLException afterFailure) {
                // the connection is unusable; the original failure is what the caller reports
            }
        }
    }

    /** The schema version the store is at (0 for a new store). */
    public int version() {
        try {
            return readVersion();
        } catch (SQLException e) {
            throw new StoreException("reading the schema version of " + where + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private int readVersion() throws SQLException {
        try (Statement s = db.createStatement(); ResultSet r = s.executeQuery("SELECT version FROM schema_version")) {
            return r.next() ? r.getInt(1) : 0;
        } catch (SQLException e) {
            if (String.valueOf(e.getMessage()).toLowerCase(Locale.ROOT).contains("no such table")
                    || "42P01".equals(e.getSQLState())) {
                return 0;
            }
            throw e;
        }
    }

    /**
     * Checks the schema and brings it up to date. The version is read and every missing step applied
     * inside one write transaction (and, on PostgreSQL, under an advisory lock), so stores opened by
     * several benches at the same moment are migrated exactly once.
     */
    private void prepare() throws SQLException {
        if (postgres) {
            // a failed statement aborts a PostgreSQL transaction, so look before taking the lock
            db.setAutoCommit(true);
        }
        int at = readVersionIfAny();
        refuseNewer(at);
        if (at == latestVersion()) {
            return;
        }
        if (readOnly) {
            throw new StoreException("the results store " + where + " is at schema version " + at + " and this lrbench"
                    + " needs " + latestVersion() + "; it is read-only here, so it cannot be upgraded: open it once where"
                    + " it is writable", null);
        }
        inTransaction(() -> {
            try (Statement s = db.createStatement()) {
                if (postgres) {
                    s.execute("SELECT pg_advisory_xact_lock(" + MIGRATION_LOCK + ")");
                }
                s.execute("CREATE TABLE IF NOT EXISTS schema_version (version INTEGER NOT NULL)");
            }
            int now = readVersion();
            refuseNewer(now);
            for (int step = now; step < latestVersion(); step++) {
                try (Statement s = db.createStatement()) {
                    for (String sql : Migrations.STEPS.get(step)) {
                        s.execute(sql);
                    }
                }
            }
            if (now < 3) {
                sealEarlierRows();
            }
            if (now < latestVersion()) {
                try (Statement s = db.createStatement()) {
                    s.execute("DELETE FROM schema_version");
                    s.execute("INSERT INTO schema_version (version) VALUES (" + latestVersion() + ")");
                }
            }
            return null;
        });
    }

    /**
     * Rows moved over from schema 2 and older had no hashes: they get their links now, in the
     * migration's transaction, so the chain proves from here on that nothing changed.
     */
    private void sealEarlierRows() throws SQLException {
        List<Inspection> all = inspections(null);
        for (Inspection i : all) {
            chain.lock(i.lot());
            chain.append(i.lot(), "terms", i.round(), null, null, Canonical.sha256(Canonical.terms(i)));
            for (HashedAttempt h : attemptsWithHashes(i.lot())) {
                Attempt a = h.attempt();
                chain.append(a.lot(), "attempt", a.round(), a.serial(), a.number(),
                        Canonical.sha256(Canonical.attempt(a, h.programVersion(), h.tracesSha256())));
            }
            if (i.decided()) {
                chain.append(i.lot(), "decision", i.round(), null, null, Canonical.sha256(Canonical.decision(i)));
            }
        }
    }

    /** The version, or 0 where there is no schema yet; never writes. */
    private int readVersionIfAny() throws SQLException {
        if (postgres) {
            try (Statement s = db.createStatement();
                 ResultSet r = s.executeQuery("SELECT to_regclass('schema_version') IS NOT NULL")) {
                if (!r.next() || !r.getBoolean(1)) {
                    return 0;
                }
            }
        }
        return readVersion();
    }

    private void refuseNewer(int at) {
        if (at > latestVersion()) {
            throw new StoreException("the results store " + where + " is at schema version " + at + ", newer than this"
                    + " lrbench knows (" + latestVersion() + "); it was written by a newer lrbench. Use that version;"
                    + " nothing was changed", null);
        }
    }

    // ---- inspections -------------------------------------------------------------------------

    /**
     * The inspection a lot run works on. A new lot starts inspection 1 under the given terms. An
     * open inspection is continued only under the same terms ({@link LotTermsException} names every
     * difference). A decided inspection is returned as it is (closed: nothing more is measured), unless
     * {@code reinspectReason} is given, which opens the next round under the given terms.
     */
    public Inspection inspect(LotTerms given, String reinspectReason, String now) {
        try {
            return inTransaction(() -> {
                chain.lock(given.lot());
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
        try (PreparedStatement p = db.prepareStatement("INSERT INTO inspection (lot, round, part_number, plan_path,"
                + " plan_sha256, bench, lot_size, sample_size, sampling, operator, reason, created_at, supplier, severity,"
                + " severity_reason, class_plans) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
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
            p.executeUpdate();
        }
        chain.append(t.lot(), "terms", i.round(), null, null, Canonical.sha256(Canonical.terms(i)));
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
            + " severity, severity_reason, switching_step, reinstates_normal, class_plans";

    private List<Inspection> inspections(String lot) throws SQLException {
        String sql = "SELECT " + INSPECTION_COLUMNS + " FROM inspection" + (lot == null ? "" : " WHERE lot = ?")
                + " ORDER BY created_at, lot, round";
        List<Inspection> out = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement(sql)) {
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

    private static Inspection inspection(ResultSet r) throws SQLException {
        LotTerms t = new LotTerms(r.getString(1), r.getString(3), r.getString(4), r.getString(5), r.getString(6),
                whole(r, 7), whole(r, 8), r.getString(9), r.getString(10), r.getString(16), r.getString(17),
                r.getString(18), ClassPlansJson.read(r.getString(21), r.getString(1)));
        Integer reinstates = whole(r, 20);
        return new Inspection(t, r.getInt(2), r.getString(11), r.getString(12), r.getString(13), r.getString(14),
                r.getString(15), whole(r, 19), reinstates == null ? null : reinstates != 0);
    }

    /**
     * Records the disposition of an open inspection, once. Returns false (and changes nothing) when
     * the inspection was already decided.
     */
    public boolean decide(String lot, int round, String disposition, String reason, String now) {
        return decide(lot, round, disposition, reason, null, null, now);
    }

    /**
     * As above, with what the decision means for the switching rules (an original inspection under
     * a supplier's scheme): the switching score's step and whether it reinstates normal inspection.
     */
    public boolean decide(String lot, int round, String disposition, String reason, Integer switchingStep,
                          Boolean reinstatesNormal, String now) {
        try {
            return inTransaction(() -> {
                chain.lock(lot);
                int n;
                try (PreparedStatement p = db.prepareStatement("UPDATE inspection SET disposition = ?,"
                        + " disposition_reason = ?, finished_at = ?, switching_step = ?, reinstates_normal = ?"
                        + " WHERE lot = ? AND round = ? AND disposition IS NULL")) {
                    p.setString(1, disposition);
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
                chain.append(lot, "decision", round, null, null, Canonical.sha256(Canonical.decision(i)));
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

    // ---- the switching rules of a supplier's scheme -------------------------------------------

    /**
     * The history of one part number's scheme with one supplier ("" for none named): its original
     * inspections decided under the switching rules and the decisions people recorded, in time
     * order (a lot before a decision at the same instant).
     */
    public List<SwitchingRules.Event> schemeHistory(String partNumber, String supplier) {
        try {
            return schemeEvents(partNumber, supplier);
        } catch (SQLException e) {
            throw new StoreException("reading the inspection scheme of " + partNumber + " failed: "
                    + StoreErrors.describe(e), e);
        }
    }

    private List<SwitchingRules.Event> schemeEvents(String partNumber, String supplier) throws SQLException {
        List<SwitchingRules.Event> lots = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT lot, finished_at, severity, disposition, switching_step,"
                + " reinstates_normal FROM inspection WHERE part_number = ? AND supplier = ? AND round = 1"
                + " AND disposition IS NOT NULL AND severity IS NOT NULL")) {
            q.setString(1, partNumber);
            q.setString(2, supplier);
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    Integer step = whole(r, 5);
                    Integer reinstates = whole(r, 6);
                    lots.add(new SwitchingRules.LotOutcome(r.getString(2), r.getString(1), Severity.of(r.getString(3)),
                            "accept".equals(r.getString(4)), step == null ? 0 : step, reinstates != null && reinstates != 0));
                }
            }
        }
        List<SwitchingRules.Event> decisions = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT decided_at, severity, reason, operator, override"
                + " FROM scheme_decision WHERE part_number = ? AND supplier = ? ORDER BY seq")) {
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
        if (reason == null || reason.isBlank()) {
            throw new IllegalArgumentException("a decision on the inspection scheme needs a reason");
        }
        String key = "scheme " + partNumber + " / " + supplier;
        try {
            return inTransaction(() -> {
                if (postgres) {
                    // two benches deciding on one scheme take turns (SQLite's writes are serialized already)
                    try (PreparedStatement l = db.prepareStatement("SELECT pg_advisory_xact_lock(?)")) {
                        l.setLong(1, SCHEME_LOCK ^ key.hashCode());
                        l.execute();
                    }
                }
                SwitchingRules.State before = SwitchingRules.replay(schemeEvents(partNumber, supplier));
                String refusal = SwitchingRules.refusal(before, to);
                if (refusal != null && !override) {
                    throw new IllegalArgumentException("not recorded: " + refusal);
                }
                int seq;
                try (PreparedStatement q = db.prepareStatement("SELECT COALESCE(MAX(seq), 0) + 1 FROM scheme_decision"
                        + " WHERE part_number = ? AND supplier = ?")) {
                    q.setString(1, partNumber);
                    q.setString(2, supplier);
                    try (ResultSet r = q.executeQuery()) {
                        r.next();
                        seq = r.getInt(1);
                    }
                }
                try (PreparedStatement p = db.prepareStatement("INSERT INTO scheme_decision (part_number, supplier, seq,"
                        + " decided_at, severity, reason, operator, override) VALUES (?, ?, ?, ?, ?, ?, ?, ?)")) {
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
                return SwitchingRules.replay(schemeEvents(partNumber, supplier));
            });
        } catch (SQLException e) {
            throw new StoreException("recording a decision on " + key + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every (part number, supplier) with a scheme: inspections under the rules or decisions. */
    public List<String[]> schemes() {
        List<String[]> out = new ArrayList<>();
        try (Statement s = db.createStatement(); ResultSet r = s.executeQuery("SELECT part_number, supplier FROM inspection"
                + " WHERE supplier IS NOT NULL UNION SELECT part_number, supplier FROM scheme_decision"
                + " ORDER BY 1, 2")) {
            while (r.next()) {
                out.add(new String[] {r.getString(1), r.getString(2)});
            }
        } catch (SQLException e) {
            throw new StoreException("listing inspection schemes failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    // ---- attempts ----------------------------------------------------------------------------

    /**
     * Commits one attempt and its link in the lot's hash chain. The attempt number must be the next
     * one of the serial: when another run stored that number first, the commit is refused and
     * nothing is written.
     */
    public void record(Attempt a, String programVersion, String tracesSha256) {
        try {
            inTransaction(() -> {
                chain.lock(a.lot());
                int next = nextAttempt(a.lot(), a.serial());
                if (a.number() != next) {
                    throw new StoreException("serial " + a.serial() + " of lot " + a.lot() + " already has attempt "
                            + a.number() + " (stored by another run meanwhile); this measurement was not stored", null);
                }
                Inspection open = latestInspection(a.lot()).orElseThrow(() -> new StoreException("lot " + a.lot()
                        + " is not stored; start it before storing parts", null));
                if (open.round() != a.round() || open.decided()) {
                    throw new StoreException("inspection " + a.round() + " of lot " + a.lot() + " is closed"
                            + " (decided or followed by a re-inspection); this measurement was not stored", null);
                }
                try (PreparedStatement p = db.prepareStatement("INSERT INTO attempt (lot, serial, attempt, round,"
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
                chain.append(a.lot(), "attempt", a.round(), a.serial(), a.number(),
                        Canonical.sha256(Canonical.attempt(a, programVersion, tracesSha256)));
                return null;
            });
        } catch (SQLException e) {
            throw new StoreException("storing " + a.serial() + " of lot " + a.lot() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** The number the serial's next attempt in the lot gets: 1 for a serial not yet stored. */
    public int nextAttempt(String lot, String serial) {
        try (PreparedStatement q = db.prepareStatement("SELECT MAX(attempt) FROM attempt WHERE lot = ? AND serial = ?")) {
            q.setString(1, lot);
            q.setString(2, serial);
            try (ResultSet r = q.executeQuery()) {
                return r.next() ? r.getInt(1) + 1 : 1;
            }
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private static final String ATTEMPT_COLUMNS = "lot, serial, attempt, round, position, verdict, inductance_h,"
            + " series_resistance_ohm, measured_at, operator, reason, result_json, json_file, traces_file, traces_bytes";

    /** Every attempt of a lot, by round, position and attempt number. */
    public List<Attempt> attempts(String lot) {
        List<Attempt> out = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT " + ATTEMPT_COLUMNS + " FROM attempt WHERE lot = ?"
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
        Optional<Inspection> i = latestInspection(lot);
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
        return new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5), verdict(r, 6),
                real(r, 7), real(r, 8), r.getString(9), r.getString(10), r.getString(11), r.getString(12),
                r.getString(13), traces, bytes);
    }

    /** Removes a lot, its parts and its chain (the demo starts its lot afresh; nothing else deletes). */
    public void deleteLot(String lot) {
        try {
            inTransaction(() -> {
                for (String table : List.of("attempt", "chain_record", "lot_chain", "inspection")) {
                    try (PreparedStatement p = db.prepareStatement("DELETE FROM " + table + " WHERE lot = ?")) {
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

    // ---- the hash chain ----------------------------------------------------------------------

    /** The lots that have rows anywhere in the store (inspections, attempts or chain links). */
    public List<String> lotNames() {
        List<String> out = new ArrayList<>();
        String sql = "SELECT lot FROM inspection UNION SELECT lot FROM attempt UNION SELECT lot FROM lot_chain"
                + " UNION SELECT lot FROM chain_record ORDER BY 1";
        try (Statement s = db.createStatement(); ResultSet r = s.executeQuery(sql)) {
            while (r.next()) {
                out.add(r.getString(1));
            }
        } catch (SQLException e) {
            throw new StoreException("listing lots failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** The lot's chain head (hash of its last record), or null for a lot without a chain. */
    public String chainHead(String lot) {
        try {
            ChainCheck.State st = chain.state(lot);
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
            return ChainCheck.findings(lot, inspections(lot), attemptsWithHashes(lot), chain.links(lot), chain.state(lot));
        } catch (SQLException e) {
            throw new StoreException("reading lot " + lot + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** An attempt as stored with the two columns its content hash covers besides the record. */
    record HashedAttempt(Attempt attempt, String programVersion, String tracesSha256) {
    }

    private List<HashedAttempt> attemptsWithHashes(String lot) throws SQLException {
        List<HashedAttempt> out = new ArrayList<>();
        try (PreparedStatement q = db.prepareStatement("SELECT " + ATTEMPT_COLUMNS + ", program_version, traces_sha256"
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
        return new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5), verdict(r, 6),
                real(r, 7), real(r, 8), r.getString(9), r.getString(10), r.getString(11), r.getString(12),
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

    // ---- queries -----------------------------------------------------------------------------

    /** Every inspection of every lot, in the order they were started, with counts of their counting attempts. */
    public List<LotRecord> lots() {
        try {
            return records(inspections(null), summaries(null));
        } catch (SQLException e) {
            throw new StoreException("listing lots failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every inspection of one lot, first to latest. */
    public List<LotRecord> lot(String lot) {
        try {
            return records(inspections(lot), summaries(lot));
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
        try (PreparedStatement q = db.prepareStatement(sql)) {
            if (lot != null) {
                q.setString(1, lot);
            }
            try (ResultSet r = q.executeQuery()) {
                while (r.next()) {
                    Attempt a = new Attempt(r.getString(1), r.getString(2), r.getInt(3), r.getInt(4), r.getInt(5),
                            verdict(r, 6), real(r, 7), real(r, 8), r.getString(9), null, null, null, null, null, null);
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
                t.supplier(), t.severity(), t.severityReason(), t.classPlans());
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
        List<LotStatistics> out = new ArrayList<>();
        try {
            Map<String, List<Attempt>> byRound = summaries(null);
            for (Inspection i : inspections(null)) {
                if (!i.terms().partNumber().equals(partNumber)) {
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

    /** A stored verdict; a word no lrbench writes is a store fault naming it, never a guess. */
    private static Verdict verdict(ResultSet r, int column) throws SQLException {
        String word = r.getString(column);
        try {
            return Verdict.of(word);
        } catch (IllegalArgumentException e) {
            throw new StoreException("an attempt's stored " + e.getMessage() + " (the store was changed outside lrbench;"
                    + " run lrbench verify)", e);
        }
    }

    private static Double real(ResultSet r, int column) throws SQLException {
        double v = r.getDouble(column);
        return r.wasNull() ? null : v;
    }

    private static Integer whole(ResultSet r, int column) throws SQLException {
        int v = r.getInt(column);
        return r.wasNull() ? null : v;
    }

    private static void closeQuietly(Connection c) {
        if (c != null) {
            try {
                c.close();
            } catch (SQLException ignored) {
                // already failing; the first error is the one reported
            }
        }
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
