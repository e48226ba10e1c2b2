package org.lrbench.results;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.lrbench.sampling.ClassPlan;

/**
 * What a lot's inspection is held to, fixed when it starts: the plan (by content), the bench, the
 * lot size, the sample size and the sampling (inspection level, AQL per class and severity) the
 * plan and the supplier's scheme gave, the operator who started it, the supplier ("" when none is
 * named), the severity (normal, tightened, reduced) and why the scheme was at it. Resuming with any
 * term different is refused. Supplier and severity are null on inspections stored before the
 * switching rules (all of them normal). The class plans (each class's n, Ac and Re for the lot size
 * under the severity) are the sampling as data; null on inspections stored before they were kept.
 */
public record LotTerms(String lot, String partNumber, String planPath, String planSha256, String bench,
                       Integer lotSize, Integer sampleSize, String sampling, String operator, String supplier,
                       String severity, String severityReason, List<ClassPlan> classPlans, boolean simulated) {

    /** Terms of a lot on a real bench. */
    public LotTerms(String lot, String partNumber, String planPath, String planSha256, String bench, Integer lotSize,
                    Integer sampleSize, String sampling, String operator, String supplier, String severity,
                    String severityReason, List<ClassPlan> classPlans) {
        this(lot, partNumber, planPath, planSha256, bench, lotSize, sampleSize, sampling, operator, supplier, severity,
                severityReason, classPlans, false);
    }

    /** The same terms for a lot measured on the simulated bench (or not). */
    public LotTerms simulatedBench(boolean s) {
        return new LotTerms(lot, partNumber, planPath, planSha256, bench, lotSize, sampleSize, sampling, operator, supplier,
                severity, severityReason, classPlans, s);
    }

    /** Terms without the class plans as data (records from before they were kept). */
    public LotTerms(String lot, String partNumber, String planPath, String planSha256, String bench, Integer lotSize,
                    Integer sampleSize, String sampling, String operator, String supplier, String severity,
                    String severityReason) {
        this(lot, partNumber, planPath, planSha256, bench, lotSize, sampleSize, sampling, operator, supplier, severity,
                severityReason, null);
    }

    /** Terms without a supplier or severity (records from before the switching rules, tests). */
    public LotTerms(String lot, String partNumber, String planPath, String planSha256, String bench, Integer lotSize,
                    Integer sampleSize, String sampling, String operator) {
        this(lot, partNumber, planPath, planSha256, bench, lotSize, sampleSize, sampling, operator, null, null, null);
    }

    /** The terms that must match to continue an inspection, each as "term: stored X, given Y". */
    public List<String> differences(LotTerms given) {
        List<String> out = new ArrayList<>();
        differ(out, "plan content (SHA-256)", shortHash(planSha256), shortHash(given.planSha256));
        differ(out, "part number", partNumber, given.partNumber);
        differ(out, "bench", bench, given.bench);
        differ(out, "simulated bench", simulated ? "yes" : "no", given.simulated ? "yes" : "no");
        differ(out, "lot size", lotSize, given.lotSize);
        differ(out, "sample size", sampleSize, given.sampleSize);
        differ(out, "sampling", sampling, given.sampling);
        if (supplier != null) {
            differ(out, "supplier", supplier, given.supplier);
        }
        return out;
    }

    private static void differ(List<String> out, String term, Object stored, Object given) {
        if (!Objects.equals(stored, given)) {
            out.add(term + ": stored " + (stored == null ? "none" : stored) + ", given " + (given == null ? "none" : given));
        }
    }

    private static String shortHash(String sha) {
        return sha == null || sha.length() < 12 ? sha : sha.substring(0, 12) + "...";
    }
}
