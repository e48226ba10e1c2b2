package org.lrbench.store;

/** A lot as the store holds it; disposition null while the lot is open. */
public record LotRecord(String lot, String partNumber, String planPath, String planSha256, String bench,
                        Integer lotSize, Integer sampleSize, String createdAt, String disposition,
                        String dispositionReason, String finishedAt, int measured, int passed, int failed) {
}
