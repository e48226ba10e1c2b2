package org.lrbench.cli;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;
import org.lrbench.plan.Plan;
import org.lrbench.results.LotSummary;
import org.lrbench.run.LotRunner;
import org.lrbench.store.PartRow;

/** A lot's summary file from what the store holds after a lot run. */
final class LotSummaries {

    private LotSummaries() {
    }

    static LotSummary of(String lot, Plan plan, int lotSize, LotRunner.Outcome outcome) {
        List<PartRow> rows = outcome.stored();
        List<String> failed = rows.stream().filter(r -> r.verdict().equals("fail")).map(PartRow::serial).toList();
        List<String> errors = rows.stream().filter(r -> !r.verdict().equals("fail") && !r.verdict().equals("pass"))
                .map(PartRow::serial).toList();
        int passed = (int) rows.stream().filter(r -> r.verdict().equals("pass")).count();
        return new LotSummary(LotSummary.SCHEMA, lot, plan.partNumber(), plan.source(),
                Instant.now().truncatedTo(ChronoUnit.MILLIS).toString(), rows.size(), passed, failed.size(), errors.size(),
                failed, errors, lotSize, outcome.disposition().sampleSize(),
                outcome.disposition().state().name().toLowerCase(Locale.ROOT), outcome.disposition().reason());
    }
}
