package org.lrbench.records;

import org.lrbench.sampling.LotDisposition;
import org.lrbench.fixture.FixtureWiring;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.lrbench.measure.PointResult;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.results.LotLedger;
import org.lrbench.store.Canonical;
import org.lrbench.sampling.SwitchingRules;
import org.lrbench.store.ResultStore;
import org.lrbench.store.StoreException;
import org.lrbench.traces.TraceArchive;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Keeps a lot's attempts in the results store and as files under {@code RUNS/LOT/}: the result
 * JSON {@code SERIAL.json} (then {@code SERIAL~2.json}, ...) and the trace archive
 * {@code SERIAL.lrtraces}. Each attempt is kept in three steps: both files written whole under
 * temporary names and forced to disk; the store commit, with both files' SHA-256 in the lot's hash
 * chain (the point of truth); then the files' final names, which are never reused. A crash between
 * the commit and the names is repaired on the next open ({@link #repair}); a run that loses a race
 * for the same attempt removes its temporary files and leaves nothing under final names.
 */
public final class StoreLedger implements LotLedger {
    private static final Logger LOG = LoggerFactory.getLogger(StoreLedger.class);
    private final ResultStore store;
    private final Path runs;
    private final boolean keepTraces;
    private final List<String> repairs = new ArrayList<>();

    public StoreLedger(ResultStore store, Path runs, boolean keepTraces) {
        this.store = store;
        this.runs = runs;
        this.keepTraces = keepTraces;
    }

    @Override
    public Inspection open(LotTerms terms, String reinspectReason) {
        Inspection i = store.inspect(terms, reinspectReason, Instant.now()
                .truncatedTo(ChronoUnit.MILLIS).toString());
        repairs.addAll(repair(terms.lot()));
        return i;
    }

    /** What opening the lot repaired (files a crash left unpublished), for the operator to read. */
    public List<String> repairs() {
        return List.copyOf(repairs);
    }

    @Override
    public Optional<Inspection> latest(String lot) {
        return store.latestInspection(lot);
    }

    @Override
    public List<Attempt> attempts(String lot, int round) {
        return store.attempts(lot, round);
    }

    @Override
    public int nextAttempt(String lot, String serial) {
        return store.nextAttempt(lot, serial);
    }

    @Override
    public Attempt keep(PartResult result, int position, List<PointResult> traces, double senseOhm, FixtureWiring wiring)
            throws IOException {
        PartResult.AttemptRecord ar = result.attempt();
        Path dir = runs.resolve(result.lot());
        Path jsonPath = dir.resolve(Attempt.fileName(result.serial(), ar.number(), "json"));
        byte[] json = ResultFiles.JSON.writeValueAsBytes(result);
        byte[] archive = keepTraces && !traces.isEmpty()
                ? TraceArchive.encode(result.lot(), result.serial(), result.partNumber(), senseOhm, wiring,
                        ResultFiles.JSON.valueToTree(result.instruments()), traces)
                : null;
        Path tracesPath = archive == null ? null : dir.resolve(Attempt.fileName(result.serial(), ar.number(), "lrtraces"));
        for (Path p : archive == null ? List.of(jsonPath) : List.of(jsonPath, tracesPath)) {
            if (Files.exists(p)) {
                throw new FileAlreadyExistsException(p.toString(), null, "a record of that name exists and is never"
                        + " replaced; the store does not know it, so it was put there by something other than this lot run");
            }
        }
        List<Path> temporary = new ArrayList<>();
        try {
            Path tmpTraces = archive == null ? null : ResultFiles.writeTemporary(tracesPath, archive);
            if (tmpTraces != null) {
                temporary.add(tmpTraces);
            }
            Path tmpJson = ResultFiles.writeTemporary(jsonPath, json);
            temporary.add(tmpJson);
            Attempt a = new Attempt(result.lot(), result.serial(), ar.number(), ar.inspection(), position,
                    result.verdict(), result.inductanceH(), result.seriesResistanceOhm(), result.finishedAt(),
                    ar.operator(), ar.reason(), new String(json, StandardCharsets.UTF_8), jsonPath.getFileName().toString(),
                    archive == null ? null : tracesPath.getFileName().toString(),
                    archive == null ? null : (long) archive.length);
            store.record(a, result.programVersion(), archive == null ? null : Canonical.sha256(archive));
            if (tmpTraces != null) {
                ResultFiles.publish(tmpTraces, tracesPath);
            }
            ResultFiles.publish(tmpJson, jsonPath);
            temporary.clear();
            LOG.debug("kept attempt {} of {} in lot {}: {}", a.number(), a.serial(), a.lot(), jsonPath);
            return a;
        } finally {
            for (Path p : temporary) {
                Files.deleteIfExists(p);
            }
        }
    }

    @Override
    public boolean decide(String lot, int round, LotDisposition.State disposition, String reason, Integer switchingStep,
                          Boolean reinstatesNormal, String now) {
        return store.decide(lot, round, disposition, reason, switchingStep, reinstatesNormal, now);
    }

    @Override
    public SwitchingRules.State scheme(String partNumber, String supplier) {
        return SwitchingRules.replay(store.schemeHistory(partNumber, supplier));
    }

    @Override
    public SwitchingRules.State scheme(String partNumber, String supplier, boolean simulated) {
        return SwitchingRules.replay(store.schemeHistory(partNumber, supplier, simulated));
    }

    /**
     * Puts back what a crash between a commit and the files' final names left undone: a missing
     * result JSON is written again from the store (it holds the full record); a missing trace
     * archive is published from its temporary file when that file is whole (its SHA-256 matches the
     * store's). Then removes temporary files whose writer no longer runs. Returns what it did.
     */
    public List<String> repair(String lot) {
        List<String> done = new ArrayList<>();
        Path dir = runs.resolve(lot);
        var traceHashes = store.tracesHashes(lot);
        try {
            for (Attempt a : store.attempts(lot)) {
                if (a.jsonFile() != null && !Files.exists(dir.resolve(a.jsonFile()))) {
                    ResultFiles.writeNew(dir.resolve(a.jsonFile()), a.resultJson().getBytes(StandardCharsets.UTF_8));
                    done.add("rewrote " + dir.resolve(a.jsonFile()) + " from the store");
                }
                if (a.tracesFile() != null && !Files.exists(dir.resolve(a.tracesFile()))) {
                    Path target = dir.resolve(a.tracesFile());
                    String want = traceHashes.get(a.serial() + "~" + a.number());
                    for (Path tmp : ResultFiles.orphansOf(target)) {
                        if (want != null && want.equals(Canonical.sha256(Files.readAllBytes(tmp)))) {
                            ResultFiles.publish(tmp, target);
                            done.add("published " + target + " from its complete temporary file");
                            break;
                        }
                    }
                }
            }
            int removed = ResultFiles.removeOrphans(dir);
            if (removed > 0) {
                done.add("removed " + removed + " temporary file(s) left by an interrupted run in " + dir);
            }
        } catch (IOException e) {
            throw new StoreException("repairing the files of lot " + lot + " in " + dir + " failed: "
                    + e.getMessage(), e);
        }
        return done;
    }
}
