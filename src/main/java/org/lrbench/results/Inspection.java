package org.lrbench.results;

/**
 * One inspection of a lot: the first (round 1), or a re-inspection opened on purpose, with its
 * reason, after an earlier one was decided. The disposition is null while the inspection is open.
 */
public record Inspection(LotTerms terms, int round, String reason, String createdAt, String disposition,
                         String dispositionReason, String finishedAt) {

    public String lot() {
        return terms.lot();
    }

    public boolean decided() {
        return disposition != null;
    }
}
