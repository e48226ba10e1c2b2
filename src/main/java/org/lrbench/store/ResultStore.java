package org.lrbench.store;

import org.lrbench.sampling.LotDisposition;
import java.nio.file.Path;
import java.sql.SQLException;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SwitchingRules;

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
    private final StoreDb db;
    private final InspectionRows inspections;
    private final SchemeRows schemes;
    private final AttemptRows attempts;
    private final ChainRows chain;
    private final SinglePartRows singles;
    private final LotHolds holds;
    private final DecisionChain decisions;
    private final CheckFileRows checkFiles;
    private final LotQueries queries;
    private final StoreSchema schema;

    private ResultStore(StoreDb db) {
        this.db = db;
        this.inspections = new InspectionRows(db);
        this.schemes = new SchemeRows(db);
        this.attempts = new AttemptRows(db, inspections);
        this.chain = new ChainRows(db, inspections);
        this.singles = new SinglePartRows(db);
        this.holds = new LotHolds(db);
        this.decisions = new DecisionChain(db);
        this.checkFiles = new CheckFileRows(db);
        this.queries = new LotQueries(db, inspections);
        this.schema = new StoreSchema(db, inspections, chain);
    }

    /** The schema version this program writes. */
    public static int latestVersion() {
        return StoreSchema.latestVersion();
    }

    /**
     * Opens (creating if needed) an SQLite store file and brings its schema up to date. A file this
     * process may not write is opened read-only: it can be read if its schema is current.
     */
    public static ResultStore open(Path file) {
        return new ResultStore(StoreOpening.open(file));
    }

    /** Opens an existing SQLite store for reading only: nothing is migrated or written. */
    public static ResultStore openForReading(Path file) {
        return new ResultStore(StoreOpening.openForReading(file));
    }

    /**
     * Opens a store by JDBC URL: {@code jdbc:postgresql://HOST:PORT/DB?user=...} for a shared
     * PostgreSQL store, or {@code jdbc:sqlite:FILE}.
     */
    public static ResultStore openUrl(String url) {
        return new ResultStore(StoreOpening.openUrl(url));
    }

    /** The schema version the store is at (0 for a new store). */
    public int version() {
        return schema.version();
    }

    /**
     * The inspection a lot run works on. A new lot starts inspection 1 under the given terms. An
     * open inspection is continued only under the same terms ({@link LotTermsException} names every
     * difference). A decided inspection is returned as it is (closed: nothing more is measured), unless
     * {@code reinspectReason} is given, which opens the next round under the given terms.
     */
    public Inspection inspect(LotTerms given, String reinspectReason, String now) {
        return inspections.inspect(given, reinspectReason, now);
    }

    /** The lot's latest inspection, if the lot is stored. */
    public Optional<Inspection> latestInspection(String lot) {
        return inspections.latestInspection(lot);
    }

    /**
     * Records the disposition of an open inspection, once. Returns false (and changes nothing) when
     * the inspection was already decided.
     */
    public boolean decide(String lot, int round, LotDisposition.State disposition, String reason, String now) {
        return inspections.decide(lot, round, disposition, reason, now);
    }

    /**
     * As above, with what the decision means for the switching rules (an original inspection under
     * a supplier's scheme): the switching score's step and whether it reinstates normal inspection.
     */
    public boolean decide(String lot, int round, LotDisposition.State disposition, String reason, Integer switchingStep,
                          Boolean reinstatesNormal, String now) {
        return inspections.decide(lot, round, disposition, reason, switchingStep, reinstatesNormal, now);
    }

    /**
     * The history of one part number's scheme with one supplier ("" for none named): its original
     * inspections decided under the switching rules and the decisions people recorded, in time
     * order (a lot before a decision at the same instant).
     */
    public List<SwitchingRules.Event> schemeHistory(String partNumber, String supplier) {
        return schemes.schemeHistory(partNumber, supplier);
    }

    /** A supplier's scheme of real lots, or of lots on the simulated bench (the two never mix). */
    public List<SwitchingRules.Event> schemeHistory(String partNumber, String supplier, boolean simulated) {
        return schemes.schemeHistory(partNumber, supplier, simulated);
    }

    /**
     * Records a decision on a supplier's scheme: the severity a person sets, why, and whether it
     * overrides the rules. Without override the rules must allow it ({@link SwitchingRules#refusal});
     * otherwise nothing is written and the reason is thrown. Decisions are never changed or removed.
     */
    public SwitchingRules.State decideScheme(String partNumber, String supplier, Severity to, String reason,
                                             String operator, boolean override, String now) {
        return schemes.decideScheme(partNumber, supplier, to, reason, operator, override, now);
    }

    /** As above, on the real scheme or on the simulated bench's. */
    public SwitchingRules.State decideScheme(String partNumber, String supplier, Severity to, String reason,
                                             String operator, boolean override, String now, boolean simulated) {
        return schemes.decideScheme(partNumber, supplier, to, reason, operator, override, now, simulated);
    }

    /** Every (part number, supplier) with a scheme: inspections under the rules or decisions. */
    public List<String[]> schemes() {
        return schemes.schemes();
    }

    /** The schemes of real lots, or of simulated ones. */
    public List<String[]> schemes(boolean simulated) {
        return schemes.schemes(simulated);
    }

    /**
     * Commits one attempt and its link in the lot's hash chain. The attempt number must be the next
     * one of the serial: when another run stored that number first, the commit is refused and
     * nothing is written.
     */
    public void record(Attempt a, String programVersion, String tracesSha256) {
        attempts.record(a, programVersion, tracesSha256);
    }

    /** The number the serial's next attempt in the lot gets: 1 for a serial not yet stored. */
    public int nextAttempt(String lot, String serial) {
        return attempts.nextAttempt(lot, serial);
    }

    /** Every attempt of a lot, by round, position and attempt number. */
    public List<Attempt> attempts(String lot) {
        return attempts.attempts(lot);
    }

    /** The attempts of one inspection round. */
    public List<Attempt> attempts(String lot, int round) {
        return attempts.attempts(lot, round);
    }

    /** The counting attempts of the lot's latest inspection (empty for a lot not stored). */
    public List<Attempt> parts(String lot) {
        return attempts.parts(lot);
    }

    /** Removes a lot, its parts and its chain (the demo starts its lot afresh; nothing else deletes). */
    public void deleteLot(String lot) {
        attempts.deleteLot(lot);
    }

    /** The lots that have rows anywhere in the store (inspections, attempts or chain links). */
    public List<String> lotNames() {
        return chain.lotNames();
    }

    /** The lot's chain head (hash of its last record), or null for a lot without a chain. */
    public String chainHead(String lot) {
        return chain.chainHead(lot);
    }

    /**
     * Re-reads a lot's rows and its hash chain and names every row altered, removed or added
     * outside lrbench, every broken or missing link, and every row stored before the chain existed
     * (schema 2 and older: unverifiable, listed as such). Empty when the lot is intact.
     */
    public List<String> chainFindings(String lot) {
        return chain.chainFindings(lot);
    }

    /** Every lot's chain length and head as they stand, and the single parts' chain (what an anchor keeps). */
    public List<ChainAnchor> chainAnchors() {
        List<ChainAnchor> out = new java.util.ArrayList<>(chain.anchors());
        for (ChainAnchor c : new ChainAnchor[] {singles.anchor(), decisions.anchor(), checkFiles.anchor()}) {
            if (c != null && c.length() > 0) {
                out.add(c);
            }
        }
        return out;
    }

    /** Findings of the chains against an anchor kept outside the store (see {@link ChainRows#anchorFindings}). */
    public List<String> anchorFindings(List<ChainAnchor> anchored) {
        List<String> out = new java.util.ArrayList<>(chain.anchorFindings(anchored.stream()
                .filter(a -> !a.lot().startsWith("~")).toList()));
        anchored.stream().filter(a -> a.lot().equals(SinglePartRows.ANCHOR_NAME)).map(singles::anchorFinding)
                .filter(java.util.Objects::nonNull).forEach(out::add);
        anchored.stream().filter(a -> a.lot().equals(DecisionChain.ANCHOR_NAME)).map(decisions::anchorFinding)
                .filter(java.util.Objects::nonNull).forEach(out::add);
        anchored.stream().filter(a -> a.lot().equals(CheckFileRows.ANCHOR_NAME)).map(checkFiles::anchorFinding)
                .filter(java.util.Objects::nonNull).forEach(out::add);
        return out;
    }

    /** Keeps the record of a file of a bench's checks, as the next link of the check files' chain. */
    public void recordCheckFile(CheckFile f) {
        checkFiles.record(f);
    }

    /** Every check file's record, in the order they were kept. */
    public List<CheckFile> checkFiles() {
        return checkFiles.all();
    }

    /** The check files' chain's breaks (empty when whole). */
    public List<String> checkFileFindings() {
        return checkFiles.findings();
    }

    /** The scheme decisions' chain's breaks (empty when whole). */
    public List<String> decisionFindings() {
        return decisions.findings();
    }

    /**
     * Takes the hold on a lot for a run (see {@link LotHold}): null when it is this run's now, else the
     * hold of the run in its way. One not renewed for {@code stale}, or of a process gone from this host,
     * is taken over.
     */
    public LotHold holdLot(LotHold mine, java.time.Duration stale) {
        return holds.take(mine, stale);
    }

    /** Renews this run's hold; false when it is no longer this run's (it was taken over as stale). */
    public boolean renewHold(LotHold mine, java.time.Instant at) {
        return holds.renew(mine, at);
    }

    /** Gives this run's hold back. */
    public void releaseHold(LotHold mine) {
        holds.release(mine);
    }

    /** The hold on a lot, or null when no run holds it. */
    public LotHold heldBy(String lot) {
        return holds.held(lot);
    }

    /** Keeps the record of a part measured outside a lot's sample, as the next link of the single parts' chain. */
    public void recordSinglePart(SingleRecord r) {
        singles.record(r);
    }

    /** Every single part's record, in the order they were kept. */
    public List<SingleRecord> singleParts() {
        return singles.all();
    }

    /** The single parts' chain's breaks (empty when whole). */
    public List<String> singlePartFindings() {
        return singles.findings();
    }

    /** The traces SHA-256 recorded for each attempt of a lot, keyed "serial~attempt". */
    public Map<String, String> tracesHashes(String lot) {
        return chain.tracesHashes(lot);
    }

    /** Every inspection of every lot, in the order they were started, with counts of their counting attempts. */
    public List<LotRecord> lots() {
        return queries.lots();
    }

    /** Every inspection of one lot, first to latest. */
    public List<LotRecord> lot(String lot) {
        return queries.lot(lot);
    }

    /**
     * A part number's inspections in the order they were started, with yield (passed over passed
     * and failed) and the mean and sample standard deviation of the measured L and R, over the
     * attempts that count.
     */
    public List<LotStatistics> history(String partNumber) {
        return queries.history(partNumber);
    }

    /** A part number's lots over time, real ones or simulated ones. */
    public List<LotStatistics> history(String partNumber, boolean simulated) {
        return queries.history(partNumber, simulated);
    }

    /** A part number's lots over time from one supplier ("" for none; null: all), real or simulated. */
    public List<LotStatistics> history(String partNumber, String supplier, boolean simulated) {
        return queries.history(partNumber, supplier, simulated);
    }

    @Override
    public void close() {
        db.close();
    }
}
