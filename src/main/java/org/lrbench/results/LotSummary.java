package org.lrbench.results;

import java.util.List;

/**
 * One inspection of a lot, counted over the attempt that counts for each part: measured (pass,
 * fail or error), passed, failed, errors, skipped positions (never measured), every attempt
 * stored, the disposition, and the head of the lot's hash chain when the summary was written.
 * A derived file: the store is the record.
 */
public record LotSummary(String schema, String lot, int inspection, String partNumber, String planPath, String operator,
                         String finishedAt, int measured, int passed, int failed, int errors, int skipped, int attempts,
                         List<String> failedSerials, List<String> errorSerials, Integer lotSize, Integer sampleSize,
                         String disposition, String dispositionReason, String chainHeadSha256) {

    public static final String SCHEMA = "lrbench.lot-summary.v3";
}
