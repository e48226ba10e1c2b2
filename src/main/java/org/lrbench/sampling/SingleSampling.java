package org.lrbench.sampling;

import java.util.List;
import java.util.Locale;

/**
 * Single sampling plans for normal inspection after ISO 2859-1:1999 (the same values as
 * MIL-STD-105E and ANSI/ASQ Z1.4): Table I gives the sample size code letter from the lot size and
 * the inspection level, Table II-A the acceptance and rejection numbers from the letter and the AQL
 * (percent nonconforming).
 *
 * <p>Table II-A is built from the standard's structure rather than typed in: for the AQL at index a
 * of the preferred series 0.010 ... 6.5, the plan Ac 0 / Re 1 stands at letter index 14 - a; every
 * letter above it carries a down arrow to it; the letter just below carries an up arrow to it, the
 * next one a down arrow to the plan Ac 1 below that; from there the acceptance numbers run
 * 1, 2, 3, 5, 7, 10, 14, 21 one letter at a time, with Re = Ac + 1, and any letter beyond the 21
 * carries an up arrow. An arrow sends the user to the first plan in its direction, whose letter's
 * sample size then applies. AQLs from 10 upward (the nonconformities-per-hundred columns with their
 * larger acceptance numbers) are not covered.
 */
public final class SingleSampling {
    static final String LETTERS = "ABCDEFGHJKLMNPQR";
    static final int[] SAMPLE_SIZES = {2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800, 1250, 2000};
    /** The preferred AQL series of the standard up to 6.5 (percent nonconforming). */
    static final double[] AQLS = {0.010, 0.015, 0.025, 0.040, 0.065, 0.10, 0.15, 0.25, 0.40, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5};
    private static final int[] ACCEPTANCE_RUN = {1, 2, 3, 5, 7, 10, 14, 21};
    /** Lot size upper bounds of the rows of Table I (the last row is open-ended). */
    private static final int[] LOT_BOUNDS = {8, 15, 25, 50, 90, 150, 280, 500, 1200, 3200, 10000, 35000, 150000,
        500000, Integer.MAX_VALUE};
    /**
     * Table I letters per row, columns S-1 S-2 S-3 S-4 I II III. Level II: ISO 2859-1:1999 Table I
     * (checked against the published table); the other levels from memory of the same table.
     */
    private static final List<String> TABLE_I = List.of(
            "AAAAAAB", "AAAAABC", "AABBBCD", "ABBCCDE", "BBCCCEF", "BBCDDFG", "BCDEEGH", "BCDEFHJ",
            "CCEFGJK", "CDEGHKL", "CDFGJLM", "CDFHKMN", "DEGJLNP", "DEGJMPQ", "DEHKNQR");

    private SingleSampling() {
    }

    /** The code letter for a lot size at an inspection level (Table I). */
    public static char codeLetter(int lotSize, InspectionLevel level) {
        if (lotSize < 2) {
            throw new IllegalArgumentException("lot size " + lotSize + ": ISO 2859-1 tables start at 2 parts");
        }
        for (int row = 0; row < LOT_BOUNDS.length; row++) {
            if (lotSize <= LOT_BOUNDS[row]) {
                return TABLE_I.get(row).charAt(level.ordinal());
            }
        }
        throw new IllegalStateException();
    }

    public static int sampleSize(char letter) {
        return SAMPLE_SIZES[index(letter)];
    }

    /** The plan for a lot: letter, arrows followed, Ac and Re, and 100 % inspection when n >= N. */
    public static SamplingPlan plan(int lotSize, InspectionLevel level, double aql) {
        int a = aqlIndex(aql);
        char letter = codeLetter(lotSize, level);
        int row = resolve(index(letter), a);
        int ac = acceptance(row, a);
        int n = SAMPLE_SIZES[row];
        boolean all = n >= lotSize;
        return new SamplingPlan(lotSize, level, aql, letter, LETTERS.charAt(row), all ? lotSize : n, ac, ac + 1, all);
    }

    /**
     * The acceptance number of the next tighter AQL at the same sample size (the plan letter's row,
     * arrows not followed), for the switching score of ISO 2859-1:1999 clause 9.3.3.2; -1 where that
     * cell is an arrow or there is no tighter AQL.
     */
    public static int tighterAcceptance(char planLetter, double aql) {
        int a = aqlIndex(aql);
        if (a == 0) {
            return -1;
        }
        int c = cell(index(planLetter), a - 1);
        return Math.max(c, -1);
    }

    /** The cell of Table II-A: an Ac number, or -1 for a down arrow and -2 for an up arrow. */
    static int cell(int row, int a) {
        int zero = 14 - a;
        if (row < zero) {
            return -1;
        }
        if (row == zero) {
            return 0;
        }
        if (row == zero + 1) {
            return -2;
        }
        if (row == zero + 2) {
            return -1;
        }
        int k = row - (zero + 3);
        return k < ACCEPTANCE_RUN.length ? ACCEPTANCE_RUN[k] : -2;
    }

    /** Follows arrows from a letter's row to the row whose plan applies. */
    static int resolve(int row, int a) {
        int r = row;
        int c = cell(r, a);
        if (c == -1) {
            while (cell(r, a) < 0) {
                r++;
            }
        } else if (c == -2) {
            while (cell(r, a) < 0) {
                r--;
            }
        }
        return r;
    }

    private static int acceptance(int row, int a) {
        return cell(row, a);
    }

    static int index(char letter) {
        int i = LETTERS.indexOf(letter);
        if (i < 0) {
            throw new IllegalArgumentException("'" + letter + "' is not a sample size code letter (" + LETTERS + ")");
        }
        return i;
    }

    static int aqlIndex(double aql) {
        for (int i = 0; i < AQLS.length; i++) {
            if (Math.abs(AQLS[i] - aql) <= 1e-9 * AQLS[i]) {
                return i;
            }
        }
        StringBuilder allowed = new StringBuilder();
        for (double v : AQLS) {
            allowed.append(allowed.length() == 0 ? "" : ", ").append(String.format(Locale.ROOT, "%s", v));
        }
        throw new IllegalArgumentException("AQL " + aql + " % is not one of the standard's values covered here: "
                + allowed + " (percent nonconforming)");
    }
}
