package org.lrbench.sampling;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

class SingleSamplingTests {

    @ParameterizedTest(name = "lot {0}..{1} -> {2}")
    @CsvSource({
        // ISO 2859-1:1999 Table I, general inspection level II
        "2, 8, A", "9, 15, B", "16, 25, C", "26, 50, D", "51, 90, E", "91, 150, F", "151, 280, G", "281, 500, H",
        "501, 1200, J", "1201, 3200, K", "3201, 10000, L", "10001, 35000, M", "35001, 150000, N",
        "150001, 500000, P", "500001, 2000000, Q"})
    void codeLettersOfLevelTwo(int from, int to, char letter) {
        assertThat(SingleSampling.codeLetter(from, InspectionLevel.II)).isEqualTo(letter);
        assertThat(SingleSampling.codeLetter(to, InspectionLevel.II)).isEqualTo(letter);
    }

    @ParameterizedTest(name = "{0} -> n = {1}")
    @CsvSource({
        // ISO 2859-1:1999 Table II-A sample sizes per code letter
        "A, 2", "B, 3", "C, 5", "D, 8", "E, 13", "F, 20", "G, 32", "H, 50", "J, 80", "K, 125", "L, 200",
        "M, 315", "N, 500", "P, 800", "Q, 1250"})
    void sampleSizesPerLetter(char letter, int n) {
        assertThat(SingleSampling.sampleSize(letter)).isEqualTo(n);
    }

    @ParameterizedTest(name = "lot {0}, AQL {1}: {2} n={3} Ac {4}")
    @CsvSource({
        // ISO 2859-1:1999 Table II-A (normal inspection, single sampling)
        "1000, 0.65, J, 80, 1",
        "1000, 1.0, J, 80, 2",
        "1000, 1.5, J, 80, 3",
        "1000, 2.5, J, 80, 5",
        "1000, 4.0, J, 80, 7",
        "200, 0.65, F, 20, 0",   // G at 0.65 is an arrow up to F
        "200, 1.0, H, 50, 1",    // G at 1.0 is an arrow down to H
        "2000, 1.0, K, 125, 3",
        "20000, 1.0, M, 315, 7"})
    void tableTwoACells(int lot, double aql, char planLetter, int n, int ac) {
        SamplingPlan p = SingleSampling.plan(lot, InspectionLevel.II, aql);
        assertThat(p.planLetter()).isEqualTo(planLetter);
        assertThat(p.sampleSize()).isEqualTo(n);
        assertThat(p.acceptance()).isEqualTo(ac);
        assertThat(p.rejection()).isEqualTo(ac + 1);
        assertThat(p.fullInspection()).isFalse();
    }

    @Test
    void everyZeroOneCellHasAnUpArrowBelowAndADownArrowAbove() {
        // ISO 2859-1 Table II-A structure: the cell just above each 0/1 is a down arrow and the one
        // just below an up arrow
        for (int a = 0; a < SingleSampling.AQLS.length; a++) {
            int zero = 14 - a;
            assertThat(SingleSampling.cell(zero, a)).isZero();
            if (zero > 0) {
                assertThat(SingleSampling.cell(zero - 1, a)).isEqualTo(-1);
            }
            assertThat(SingleSampling.cell(zero + 1, a)).isEqualTo(-2);
        }
    }

    @Test
    void theTranscribedLevelTwoColumnsMatchCellByCell() {
        // the table as transcribed from the published MIL-STD-105E / ISO 2859-1 values, rows A..R,
        // AQL 0.65 1.0 1.5 2.5 4.0: "d" down arrow, "u" up arrow, else Ac
        String[] rows = {
            "d d d d d", "d d d d 0", "d d d 0 u", "d d 0 u d", "d 0 u d 1", "0 u d 1 2", "u d 1 2 3",
            "d 1 2 3 5", "1 2 3 5 7", "2 3 5 7 10", "3 5 7 10 14", "5 7 10 14 21", "7 10 14 21 u",
            "10 14 21 u u", "14 21 u u u", "21 u u u u"};
        double[] aqls = {0.65, 1.0, 1.5, 2.5, 4.0};
        for (int r = 0; r < rows.length; r++) {
            String[] cells = rows[r].split(" ");
            for (int c = 0; c < aqls.length; c++) {
                int expected = cells[c].equals("d") ? -1 : cells[c].equals("u") ? -2 : Integer.parseInt(cells[c]);
                assertThat(SingleSampling.cell(r, SingleSampling.aqlIndex(aqls[c])))
                        .as("row %s AQL %s", SingleSampling.LETTERS.charAt(r), aqls[c]).isEqualTo(expected);
            }
        }
    }

    @Test
    void aSampleAsLargeAsTheLotMeansInspectingEveryPart() {
        // ISO 2859-1: where the sample size equals or exceeds the lot size, carry out 100 % inspection
        SamplingPlan p = SingleSampling.plan(10, InspectionLevel.II, 0.65);
        assertThat(p.codeLetter()).isEqualTo('B');
        assertThat(p.planLetter()).isEqualTo('F');
        assertThat(p.fullInspection()).isTrue();
        assertThat(p.sampleSize()).isEqualTo(10);
        assertThat(p.accepts(0)).isTrue();
        assertThat(p.accepts(1)).isFalse();
    }

    @Test
    void unsupportedInputsAreRefusedClearly() {
        assertThatThrownBy(() -> SingleSampling.plan(100, InspectionLevel.II, 0.7)).hasMessageContaining("AQL 0.7");
        assertThatThrownBy(() -> SingleSampling.plan(1, InspectionLevel.II, 1.0)).hasMessageContaining("start at 2");
    }
}
