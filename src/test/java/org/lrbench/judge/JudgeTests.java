package org.lrbench.judge;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.SeriesModel;

class JudgeTests {
    static final Limit L = new Limit("inductance", Characteristic.INDUCTANCE, null, 0.9e-3, 1.1e-3, "1 mH +/- 10 %");
    static final Limit R = new Limit("winding resistance", Characteristic.SERIES_RESISTANCE, null,
            Double.NEGATIVE_INFINITY, 2.6, "max 2.6 ohm");
    static final Limit Q = new Limit("Q", Characteristic.QUALITY_FACTOR, 10e3, 20, Double.POSITIVE_INFINITY, "min 20");

    @Test
    void aValueOnTheBoundPassesUnderSimpleAcceptance() {
        // common practice, no source: a specification limit includes its end points
        List<LimitResult> r = Judge.judge(List.of(L, R), new SeriesModel(2.6, 1.1e-3, 0, 0, 1, 3));
        assertThat(r).allMatch(LimitResult::pass);
        assertThat(r.get(0).margin()).isCloseTo(0, within(1e-15));
    }

    @Test
    void qualityFactorIsTheModelsReactanceOverResistanceAtTheLimitsFrequency() {
        // Q = omega L / R of the series model (textbook definition, from memory)
        List<LimitResult> r = Judge.judge(List.of(Q), new SeriesModel(3.35, 1.006e-3, 0.001, 1e-7, 1, 7));
        assertThat(r.get(0).value()).isCloseTo(2 * Math.PI * 1e4 * 1.006e-3 / 3.35, within(1e-12));
        assertThat(r.get(0).pass()).isFalse();
        assertThat(r.get(0).reason()).isEqualTo("Q 18.87 < 20.00");
        assertThat(Judge.verdict(r)).isEqualTo(Verdict.FAIL);
    }

    @Test
    void marginsAreNegativeOutsideAndReasonsNameTheBound() {
        LimitResult low = Judge.judge(List.of(L), new SeriesModel(2.2, 0.883e-3, 0, 0, 1, 3)).get(0);
        assertThat(low.pass()).isFalse();
        assertThat(low.margin()).isCloseTo(-17e-6, within(1e-12));
        assertThat(low.reason()).isEqualTo("inductance 883.0 uH < 900.0 uH");
    }
}
