package org.lrbench.sampling;

/**
 * A single sampling plan for one lot: the code letter Table I gave, the letter whose plan applies
 * after following any arrow of Table II-A, the sample size, the acceptance number Ac and the
 * rejection number Re, and whether the whole lot is inspected (sample at least as large as the lot).
 */
public record SamplingPlan(int lotSize, InspectionLevel level, double aql, char codeLetter, char planLetter,
                           int sampleSize, int acceptance, int rejection, boolean fullInspection) {

    /** The lot is accepted when the nonconforming parts found are at most Ac, rejected at Re or more. */
    public boolean accepts(int nonconforming) {
        return nonconforming <= acceptance;
    }
}
