package org.lrbench.sampling;

import java.util.List;
import java.util.Map;

/**
 * A table of single sampling plans for tightened (ISO 2859-1 Table II-B) or reduced (Table II-C)
 * inspection, as the lab transcribed it from its copy of the standard: the sample size of each code
 * letter, and per AQL one cell per letter, a plan Ac/Re or an arrow to the first plan below or
 * above. lrbench builds only Table II-A in; these two tables could not be checked against the
 * standard here, so a lab that switches severity supplies them (see {@link SeverityTableLoader}).
 *
 * <p>Reduced plans may have a gap between Ac and Re: a lot with more than Ac but fewer than Re
 * nonconforming parts is accepted, and normal inspection is reinstated (MIL-STD-105E 10.1.4, from
 * memory); where the table has Re = Ac + 1 there is no gap.
 *
 * @param letters the code letters in table order, e.g. "ABCDEFGHJKLMNPQR"
 * @param sampleSizes the sample size of each letter, in the same order
 * @param cells per AQL (percent nonconforming), one cell per letter
 * @param source where the transcription came from, as the file states it
 */
public record SeverityTable(Severity severity, String letters, int[] sampleSizes, Map<Double, List<Cell>> cells,
                            String source) {

    /** One cell: a plan (Ac, Re), or an arrow down or up (Ac and Re unused). */
    public record Cell(Arrow arrow, int acceptance, int rejection) {
        public static Cell plan(int ac, int re) {
            return new Cell(Arrow.NONE, ac, re);
        }

        public static Cell arrow(Arrow a) {
            return new Cell(a, -1, -1);
        }
    }

    /** NONE: the cell is a plan; DOWN, UP: use the first plan below or above; EMPTY: no plan printed there. */
    public enum Arrow { NONE, DOWN, UP, EMPTY }

    /** The plan for a lot: Table I's letter, the table's arrows followed, n >= N inspected whole. */
    public SamplingPlan plan(int lotSize, InspectionLevel level, double aql) {
        char letter = SingleSampling.codeLetter(lotSize, level);
        List<Cell> column = column(aql);
        int row = letters.indexOf(letter);
        if (row < 0) {
            throw new IllegalArgumentException(severity.word() + " table (" + source + ") has no row for code letter "
                    + letter + "; its letters are " + letters);
        }
        int r = row;
        Arrow a = column.get(r).arrow();
        if (a == Arrow.EMPTY) {
            throw new IllegalArgumentException(severity.word() + " table (" + source + ") prints no plan at letter "
                    + letter + ", AQL " + aql);
        }
        while (r >= 0 && r < column.size() && column.get(r).arrow() != Arrow.NONE) {
            r += a == Arrow.DOWN ? 1 : -1;
        }
        if (r < 0 || r >= column.size()) {
            throw new IllegalArgumentException(severity.word() + " table (" + source + "): the arrow at letter " + letter
                    + ", AQL " + aql + " leads to no plan");
        }
        Cell c = column.get(r);
        int n = sampleSizes[r];
        boolean all = n >= lotSize;
        return new SamplingPlan(lotSize, level, aql, letter, letters.charAt(r), all ? lotSize : n, c.acceptance(),
                c.rejection(), all);
    }

    /** The column of one AQL, or a refusal naming the AQLs the table has. */
    public List<Cell> column(double aql) {
        for (var e : cells.entrySet()) {
            if (Math.abs(e.getKey() - aql) <= 1e-9 * aql) {
                return e.getValue();
            }
        }
        throw new IllegalArgumentException(severity.word() + " table (" + source + ") has no column for AQL " + aql
                + "; it has " + cells.keySet());
    }
}
