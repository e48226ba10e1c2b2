package org.lrbench.sampling;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.yaml.ProblemsException;

/**
 * The lab's severity tables. lrbench ships no Table II-B or II-C (they could not be checked against
 * the standard here), so the reader is checked with Table II-A itself written in the table format:
 * every lot size and AQL must give the plan the built-in Table II-A gives (ISO 2859-1:1999 Table
 * II-A, checked cell by cell in {@link SingleSamplingTests}).
 */
public class SeverityTableTests {
    private static final int ROWS = 16;
    private static final int FIRST_AQL = 2;

    @TempDir
    Path dir;

    /**
     * Table II-A written as a lab would write a table file, under the given severity's name, for the
     * AQLs from 0.025 (where the built-in structure's row R leads off the table for 0.015, a row level
     * II never reaches).
     */
    public static String tableIIA(String severity) {
        StringBuilder y = new StringBuilder("table_format: 1\nseverity: " + severity + "\n"
                + "source: ISO 2859-1:1999 Table II-A written in the table format (a test)\nsample_sizes: {");
        for (int i = 0; i < ROWS; i++) {
            y.append(i == 0 ? "" : ", ").append(SingleSampling.LETTERS.charAt(i)).append(": ")
                    .append(SingleSampling.SAMPLE_SIZES[i]);
        }
        y.append("}\ncolumns:\n");
        for (int a = FIRST_AQL; a < SingleSampling.AQLS.length; a++) {
            List<String> cells = new ArrayList<>();
            for (int r = 0; r < ROWS; r++) {
                int c = SingleSampling.cell(r, a);
                cells.add(c == -1 ? "down" : c == -2 ? "up" : c + "/" + (c + 1));
            }
            y.append(String.format(Locale.ROOT, "  - aql: %s%n    cells: [%s]%n", SingleSampling.AQLS[a],
                    String.join(", ", cells)));
        }
        return y.toString();
    }

    @Test
    void tableIIAInTheTableFormatGivesTheBuiltInPlans() throws IOException, ProblemsException {
        Files.writeString(dir.resolve("tightened.yaml"), tableIIA("tightened"));
        SeverityTable t = SeverityTableLoader.find(dir, Severity.TIGHTENED).orElseThrow();
        for (int lot : new int[] {2, 9, 20, 40, 70, 120, 200, 400, 1000, 2000, 5000, 20000, 100000, 300000, 600000}) {
            for (int a = FIRST_AQL; a < SingleSampling.AQLS.length; a++) {
                double aql = SingleSampling.AQLS[a];
                assertThat(t.plan(lot, InspectionLevel.II, aql)).as("lot %d, AQL %s", lot, aql)
                        .isEqualTo(SingleSampling.plan(lot, InspectionLevel.II, aql));
            }
        }
        assertThat(SeverityTableLoader.find(dir, Severity.REDUCED)).isEmpty();
    }

    @Test
    void aFileNamedForOneSeverityHoldingAnotherIsRefused() throws IOException {
        Files.writeString(dir.resolve("reduced.yaml"), tableIIA("tightened"));
        assertThatThrownBy(() -> SeverityTableLoader.find(dir, Severity.REDUCED)).isInstanceOf(ProblemsException.class)
                .hasMessageContaining("holds the tightened table");
    }

    @Test
    void everyCellProblemIsPositioned() throws IOException {
        String bad = tableIIA("reduced").replaceFirst("0/1", "1/1").replace("  - aql: 0.025\n", "  - aql: 0.02\n");
        bad = bad.replace("cells: [down, down, down, down, down, down, down, down, down, down, down, 0/1, up, down, 1/2, 2/3]",
                "cells: [down, down, maybe]");
        Files.writeString(dir.resolve("reduced.yaml"), bad);
        assertThatThrownBy(() -> SeverityTableLoader.read(dir.resolve("reduced.yaml")))
                .isInstanceOf(ProblemsException.class)
                .satisfies(e -> {
                    String m = e.getMessage();
                    assertThat(m).contains("Re must be larger than Ac").contains("AQL 0.02").contains(":7:")
                            .contains("3 cells; the table has 16 letters");
                });
    }

    @Test
    void anArrowThatReachesNoPlanAndAFallingAcceptanceAreRefused() throws IOException {
        String y = "table_format: 1\nseverity: reduced\nsource: test\nsample_sizes: {A: 2, B: 2, C: 3}\ncolumns:\n"
                + "  - aql: 1.0\n    cells: [up, 0/1, down]\n  - aql: 1.5\n    cells: [0/2, 1/3, 0/2]\n";
        Files.writeString(dir.resolve("r.yaml"), y);
        assertThatThrownBy(() -> SeverityTableLoader.read(dir.resolve("r.yaml"))).isInstanceOf(ProblemsException.class)
                .hasMessageContaining("reaches no plan").hasMessageContaining("never fall");
    }
}
