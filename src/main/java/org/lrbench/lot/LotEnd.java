package org.lrbench.lot;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import org.lrbench.judge.Verdict;
import org.lrbench.results.Attempt;
import org.lrbench.results.LotSummary;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.ResultStore;

/** The end of a lot run: its summary from what the store holds, written as {@code runs/LOT/lot-summary.json}. */
public final class LotEnd {
    public static final String SUMMARY_FILE = "lot-summary.json";

    private LotEnd() {
    }

    /** The summary of the inspection a run ended with, from the store (attempts kept, chain head). */
    public static LotSummary summary(LotRunner.Outcome outcome, ResultStore store) {
        List<Attempt> rows = outcome.counting();
        var i = outcome.inspection();
        List<String> failed = serials(rows, Verdict.FAIL);
        List<String> errors = serials(rows, Verdict.ERROR);
        int passed = serials(rows, Verdict.PASS).size();
        int skipped = serials(rows, Verdict.SKIPPED).size();
        return new LotSummary(LotSummary.SCHEMA, i.lot(), i.round(), i.terms().partNumber(), i.terms().planPath(),
                i.terms().operator(), Instant.now().truncatedTo(ChronoUnit.MILLIS).toString(),
                passed + failed.size() + errors.size(), passed, failed.size(), errors.size(), skipped,
                store.attempts(i.lot()).size(), failed, errors, i.terms().lotSize(), outcome.disposition().sampleSize(),
                outcome.disposition().state().word(), outcome.disposition().reason(), store.chainHead(i.lot()));
    }

    /** Writes the summary whole as the lot folder's summary file; returns its path. */
    public static Path write(Path runs, LotSummary summary) throws IOException {
        Path file = runs.resolve(summary.lot()).resolve(SUMMARY_FILE);
        ResultFiles.writeJson(file, summary);
        return file;
    }

    private static List<String> serials(List<Attempt> rows, Verdict verdict) {
        return rows.stream().filter(r -> r.verdict() == verdict).map(Attempt::serial).toList();
    }
}
