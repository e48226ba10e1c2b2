package org.lrbench.store;

import java.util.List;
import org.lrbench.sampling.ClassPlan;
import org.lrbench.sampling.LotDisposition;

/**
 * One inspection of a lot as the store holds it, counted by the attempt that counts for each
 * part: measured (pass, fail or error; skipped positions are never measured), passed, failed,
 * errors, skipped, and all attempts stored. The disposition is null while the inspection is open.
 * Supplier and severity (with why the scheme was at it) are null on inspections stored before the
 * switching rules; the class plans (the sampling as data) are null on inspections stored before
 * they were kept.
 */
public record LotRecord(String lot, int round, String partNumber, String planPath, String planSha256, String bench,
                        Integer lotSize, Integer sampleSize, String sampling, String operator, String reason,
                        String createdAt, LotDisposition.State disposition, String dispositionReason, String finishedAt,
                        int measured, int passed, int failed, int errors, int skipped, int attempts, String supplier,
                        String severity, String severityReason, List<ClassPlan> classPlans, boolean simulated) {
}
