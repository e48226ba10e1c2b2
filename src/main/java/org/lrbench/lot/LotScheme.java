package org.lrbench.lot;

import java.nio.file.Path;
import org.lrbench.results.Names;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SeverityTable;

/**
 * The supplier's scheme a lot is inspected under: the supplier ("" when none is named), the folder
 * holding the lab's tightened and reduced tables (null: none), and, once resolved before the run,
 * the severity, why the scheme is at it, and the table that gives its plans (null for normal).
 */
public record LotScheme(String supplier, Path tables, Severity severity, String why, SeverityTable table) {

    /** A scheme not yet resolved for a supplier, with the folder of the lab's tables. */
    public static LotScheme of(String supplier, Path tables) {
        String problem = Names.supplierProblem(supplier);
        if (problem != null) {
            throw new IllegalArgumentException(problem);
        }
        return new LotScheme(supplier == null ? "" : supplier.trim(), tables, null, null, null);
    }

    public boolean resolved() {
        return severity != null;
    }

    LotScheme at(Severity s, String reason, SeverityTable t) {
        return new LotScheme(supplier, tables, s, reason, t);
    }

    /** The plan's sampling under this scheme's severity (normal until resolved). */
    public SamplingScheme sampling(SamplingScheme plan) {
        return severity == null || severity == Severity.NORMAL ? plan : plan.under(severity, table);
    }
}
