package org.lrbench.results;

import org.lrbench.sampling.LotDisposition;

/**
 * One inspection of a lot: the first (round 1), or a re-inspection opened on purpose, with its
 * reason, after an earlier one was decided. The disposition is null while the inspection is open.
 * An original inspection decided under the switching rules carries what it means for them: the
 * switching score's step (2 or 3 to add, 0 to reset; normal inspection) and whether it reinstates
 * normal inspection (accepted in a reduced plan's gap); both null otherwise.
 */
public record Inspection(LotTerms terms, int round, String reason, String createdAt, LotDisposition.State disposition,
                         String dispositionReason, String finishedAt, Integer switchingStep, Boolean reinstatesNormal) {

    public Inspection(LotTerms terms, int round, String reason, String createdAt, LotDisposition.State disposition,
                      String dispositionReason, String finishedAt) {
        this(terms, round, reason, createdAt, disposition, dispositionReason, finishedAt, null, null);
    }

    public String lot() {
        return terms.lot();
    }

    public boolean decided() {
        return disposition != null;
    }
}
