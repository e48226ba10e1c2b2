package org.lrbench.sampling;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * lrbench's built-in ISO 2859-1:1999 Table 2-B (tightened) and Table 2-C (reduced, the 1999 version with
 * Re = Ac + 1), AQL 0.010 to 6.5, every cell against a transcription of the standard's tables checked cell
 * by cell against independent public transcriptions (kept beside this test): for every letter and AQL the
 * plan the built-in table leads to (following its arrows) is the letter and Ac/Re the transcription
 * prints, and a dash is a cell without a plan.
 */
class BuiltInTablesTests {

    record Reference(List<String> aqls, List<Character> letters, List<Integer> sizes, List<List<String>> cells) {
    }

    static Reference reference(String heading) throws IOException {
        String md;
        try (var in = BuiltInTablesTests.class.getResourceAsStream("sampling-tables-tightened-reduced.md")) {
            md = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        String[] lines = md.substring(md.indexOf(heading)).split("\n");
        List<String> aqls = new ArrayList<>();
        List<Character> letters = new ArrayList<>();
        List<Integer> sizes = new ArrayList<>();
        List<List<String>> cells = new ArrayList<>();
        Pattern row = Pattern.compile("^\\| ([A-Z]) \\((\\d+)\\) \\|(.*)\\|$");
        for (int i = 1; i < lines.length; i++) {
            String l = lines[i].trim();
            if (l.startsWith("| letter")) {
                for (String c : l.substring(1, l.length() - 1).split("\\|")) {
                    aqls.add(c.trim());
                }
                aqls.remove(0);
                continue;
            }
            Matcher m = row.matcher(l);
            if (m.matches()) {
                letters.add(m.group(1).charAt(0));
                sizes.add(Integer.parseInt(m.group(2)));
                List<String> r = new ArrayList<>();
                for (String c : m.group(3).split("\\|")) {
                    r.add(c.trim());
                }
                cells.add(r);
            } else if (!letters.isEmpty() && !l.startsWith("|")) {
                break;
            }
        }
        return new Reference(aqls, letters, sizes, cells);
    }

    /** Every cell of the built-in table against the reference: the plan it leads to, or no plan. */
    static int compare(SeverityTable t, Reference ref) {
        Pattern cell = Pattern.compile("^(?:[↓↑]([A-Z]) )?\\(?(\\d+)/(\\d+)\\)?$");
        int checked = 0;
        assertThat(t.letters()).isEqualTo(ref.letters().stream().map(String::valueOf).reduce("", String::concat));
        for (int r = 0; r < ref.letters().size(); r++) {
            assertThat(t.sampleSizes()[r]).as("sample size of %s", ref.letters().get(r)).isEqualTo(ref.sizes().get(r));
            for (int a = 0; a < ref.aqls().size(); a++) {
                double aql = Double.parseDouble(ref.aqls().get(a));
                String want = ref.cells().get(r).get(a);
                List<SeverityTable.Cell> column = t.column(aql);
                String where = ref.letters().get(r) + " at AQL " + ref.aqls().get(a);
                if (want.equals("—")) {
                    assertThat(column.get(r).arrow()).as(where).isEqualTo(SeverityTable.Arrow.EMPTY);
                    checked++;
                    continue;
                }
                Matcher m = cell.matcher(want);
                assertThat(m.matches()).as(where + ": '" + want + "'").isTrue();
                char letter = m.group(1) == null ? ref.letters().get(r) : m.group(1).charAt(0);
                int k = r;
                SeverityTable.Arrow arrow = column.get(k).arrow();
                while (column.get(k).arrow() != SeverityTable.Arrow.NONE) {
                    k += arrow == SeverityTable.Arrow.DOWN ? 1 : -1;
                }
                assertThat(ref.letters().get(k)).as(where).isEqualTo(letter);
                assertThat(column.get(k).acceptance()).as(where).isEqualTo(Integer.parseInt(m.group(2)));
                assertThat(column.get(k).rejection()).as(where).isEqualTo(Integer.parseInt(m.group(3)));
                checked++;
            }
        }
        return checked;
    }

    @Test
    void tableTwoBIsTheStandardsCellByCell() throws IOException {
        // ISO 2859-1:1999 Table 2-B: 17 letters (A to S) x 15 AQLs
        assertThat(compare(SeverityTableLoader.builtIn(Severity.TIGHTENED), reference("## Table II-B"))).isEqualTo(255);
    }

    @Test
    void tableTwoCIsTheStandards1999VersionCellByCell() throws IOException {
        // ISO 2859-1:1999 Table 2-C: 16 letters (A to R) x 15 AQLs, Re = Ac + 1 in every plan
        SeverityTable reduced = SeverityTableLoader.builtIn(Severity.REDUCED);
        assertThat(compare(reduced, reference("## Table 2-C: reduced inspection, ISO"))).isEqualTo(240);
        reduced.cells().values().forEach(col -> col.stream().filter(c -> c.arrow() == SeverityTable.Arrow.NONE)
                .forEach(c -> assertThat(c.rejection()).isEqualTo(c.acceptance() + 1)));
    }

    @Test
    void aLotUnderTightenedInspectionTakesTheTablesPlan() {
        // ISO 2859-1:1999 Tables I and 2-B: lot 40 at level II is D; tightened at AQL 6.5 D is an arrow down
        // to E: n = 13, Ac 1, Re 2
        SamplingPlan p = SeverityTableLoader.builtIn(Severity.TIGHTENED).plan(40, InspectionLevel.II, 6.5);
        assertThat(p.sampleSize()).isEqualTo(13);
        assertThat(p.acceptance()).isEqualTo(1);
        assertThat(p.rejection()).isEqualTo(2);
        // and reduced (Table 2-C, 1999): D at AQL 6.5 is an arrow down to E: n = 5, Ac 1, Re 2
        SamplingPlan r = SeverityTableLoader.builtIn(Severity.REDUCED).plan(40, InspectionLevel.II, 6.5);
        assertThat(r.sampleSize()).isEqualTo(5);
        assertThat(r.acceptance()).isEqualTo(1);
        assertThat(r.rejection()).isEqualTo(2);
    }
}
