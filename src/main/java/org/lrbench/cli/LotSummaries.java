package org.lrbench.cli;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;
import org.lrbench.results.Attempt;
import org.lrbench.results.LotSummary;
import org.lrbench.run.LotRunner;

/** A lot's summary file from what the store holds after a lot run. */
final class LotSummaries {

    private LotSummaries() {
    }

    static LotSummary of(LotRunner.Outcome outcome, int attemptsStored, String chainHead) {
        List<Attempt> rows = outcome.counting();
        var i = outcome.inspection();
        List<String> failed = serials(rows, "fail");
        List<String> errors = serials(rows, "error");
        int passed = serials(rows, "pass").size();
        int skipped = serials(rows, "skipped").size();
        return new LotSummary(LotSummary.SCHEMA, i.lot(), i.round(), i.terms().partNumber(), i.terms().planPath(),
                i.terms().operator(), Instant.now().truncatedTo(ChronoUnit.MILLIS).toString(),
                passed + failed.size() + errors.size(), passed, failed.size(), errors.size(), skipped, attemptsStored,
                failed, errors, i.terms().lotSize(), outcome.disposition().sampleSize(),
                outcome.disposition().state().name().toLowerCase(Locale.ROOT), outcome.disposition().reason(), chainHead);
    }

    private static List<String> serials(List<Attempt> rows, String verdict) {
        return rows.stream().filter(r -> r.verdict().equals(verdict)).map(Attempt::serial).toList();
    }
}
