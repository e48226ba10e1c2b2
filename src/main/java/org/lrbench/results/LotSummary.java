package org.lrbench.results;

import java.util.List;

/** The parts of one lot measured in one run, counted by verdict. */
public record LotSummary(String schema, String lot, String partNumber, String planPath, String finishedAt,
                         int measured, int passed, int failed, int errors, List<String> failedSerials,
                         List<String> errorSerials, Integer lotSize, Integer sampleSize, String disposition,
                         String dispositionReason) {

    public static final String SCHEMA = "lrbench.lot-summary.v2";

    public static LotSummary of(String lot, String partNumber, String planPath, String finishedAt,
                                List<PartResult> parts) {
        List<String> failed = parts.stream().filter(p -> p.verdict().equals("fail")).map(PartResult::serial).toList();
        List<String> errors = parts.stream().filter(p -> p.verdict().equals("error")).map(PartResult::serial).toList();
        int passed = (int) parts.stream().filter(p -> p.verdict().equals("pass")).count();
        return new LotSummary(SCHEMA, lot, partNumber, planPath, finishedAt, parts.size(), passed, failed.size(),
                errors.size(), failed, errors, null, null, null, null);
    }

    /** The same counts with the lot's sampling and disposition. */
    public LotSummary withDisposition(int size, int sample, String state, String reason) {
        return new LotSummary(schema, lot, partNumber, planPath, finishedAt, measured, passed, failed, errors,
                failedSerials, errorSerials, size, sample, state, reason);
    }
}
