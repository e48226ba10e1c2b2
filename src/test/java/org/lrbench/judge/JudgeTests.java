package org.lrbench.judge;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

class JudgeTests {
    static final Limit L = new Limit("inductance", Characteristic.INDUCTANCE, null, 0.9e-3, 1.1e-3, "1 mH +/- 10 %");
    static final Limit R = new Limit("winding resistance", Characteristic.SERIES_RESISTANCE, null,
            Double.NEGATIVE_INFINITY, 2.6, "max 2.6 ohm");

    static Judge.Reading reading(double v, double bigU) {
        return new Judge.Reading(v, bigU / 2, bigU);
    }

    @Test
    void aValueOnTheBoundPassesUnderSimpleAcceptance() {
        // common practice, no source: a specification limit includes its end points
        List<LimitResult> r = Judge.judge(List.of(L, R), List.of(reading(1.1e-3, 0), reading(2.6, 0)));
        assertThat(r).allMatch(LimitResult::pass);
        assertThat(r.get(0).margin()).isCloseTo(0, within(1e-15));
    }

    @Test
    void guardedAcceptanceFollowsIlacG8() {
        // ILAC-G8:09/2019 guarded acceptance with w = U: spec 100 uH +/- 10 % with U = 2 uH accepts
        // only 92 .. 108 uH; 108.5 uH passes under simple acceptance and fails under guarded
        Limit simple = new Limit("L", Characteristic.INDUCTANCE, null, 90e-6, 110e-6, "100 uH +/- 10 %");
        Limit guarded = new Limit("L", Characteristic.INDUCTANCE, null, 90e-6, 110e-6, "100 uH +/- 10 %",
                DecisionRule.GUARDED, null);
        LimitResult g = Judge.judge(guarded, reading(108.5e-6, 2e-6));
        assertThat(g.acceptanceLower()).isCloseTo(92e-6, within(1e-15));
        assertThat(g.acceptanceUpper()).isCloseTo(108e-6, within(1e-15));
        assertThat(g.pass()).isFalse();
        assertThat(g.zone()).isEqualTo(Zone.OUTSIDE);
        LimitResult s = Judge.judge(simple, reading(108.5e-6, 2e-6));
        assertThat(s.pass()).isTrue();
        // inside the tolerance but within U of it: reported as marginal
        assertThat(s.zone()).isEqualTo(Zone.MARGINAL);
        assertThat(s.reason()).contains("marginal");
        assertThat(Judge.judge(guarded, reading(107.9e-6, 2e-6)).pass()).isTrue();
        assertThat(Judge.judge(guarded, reading(91.9e-6, 2e-6)).pass()).isFalse();
        // an explicit guard band replaces U
        Limit narrow = new Limit("L", Characteristic.INDUCTANCE, null, 90e-6, 110e-6, "", DecisionRule.GUARDED, 1e-6);
        assertThat(Judge.judge(narrow, reading(108.5e-6, 2e-6)).pass()).isTrue();
    }

    @Test
    void marginsAreNegativeOutsideAndReasonsNameTheBound() {
        LimitResult low = Judge.judge(L, reading(0.883e-3, 0));
        assertThat(low.pass()).isFalse();
        assertThat(low.margin()).isCloseTo(-17e-6, within(1e-12));
        assertThat(low.reason()).isEqualTo("inductance 883.0 uH < 900.0 uH");
        assertThat(Judge.verdict(List.of(low))).isEqualTo(Verdict.FAIL);
        assertThat(Judge.judge(R, reading(2.2, 0.01)).zone()).isEqualTo(Zone.CLEAR);
    }
}
