package org.lrbench.study;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class ControlChartTests {

    private static List<ControlChart.Reading> readings(double... v) {
        List<ControlChart.Reading> out = new ArrayList<>();
        for (double x : v) {
            out.add(new ControlChart.Reading(x, 0.3));
        }
        return out;
    }

    @Test
    void beforeTheBaselineEachReadingIsJudgedByItsNormalizedError() {
        // En = (x - X) / sqrt(U_x^2 + U_ref^2), |En| <= 1 (ISO 13528, from memory): 0.3 and 0.4 give 0.5
        ControlChart.State ok = ControlChart.of(readings(10.4), 10.0, 0.4, 5);
        assertThat(ok.inControl()).isTrue();
        assertThat(ok.reason()).contains("En = 0.80");
        assertThat(ok.upper()).isCloseTo(10.5, within(1e-12));
        ControlChart.State bad = ControlChart.of(readings(10.6), 10.0, 0.4, 5);
        assertThat(bad.inControl()).isFalse();
        assertThat(bad.reason()).contains("En = 1.20").contains("beyond 1");
    }

    @Test
    void afterTheBaselineTheLimitsAreTheMeanPlusMinus266MovingRanges() {
        // individuals chart: centre the mean, limits +/- 2.66 MR-bar (3 / d2, d2 = 1.128; NIST/SEMATECH
        // e-Handbook, from memory). Baseline 10, 11, 10, 11, 10: mean 10.4, MR-bar 1
        ControlChart.State s = ControlChart.of(readings(10, 11, 10, 11, 10, 12.5), 10.0, 0.4, 5);
        assertThat(s.fromHistory()).isTrue();
        assertThat(s.centre()).isCloseTo(10.4, within(1e-12));
        assertThat(s.upper()).isCloseTo(13.06, within(1e-12));
        assertThat(s.inControl()).isTrue();
        ControlChart.State out = ControlChart.of(readings(10, 11, 10, 11, 10, 13.1), 10.0, 0.4, 5);
        assertThat(out.inControl()).isFalse();
        assertThat(out.reason()).contains("beyond the control limits");
    }

    @Test
    void eightInARowOnOneSideIsOutOfControl() {
        // the Western Electric run rule (from memory): eight successive points on one side of the centre
        ControlChart.State s = ControlChart.of(readings(10, 11, 10, 11, 10, 10.5, 10.6, 10.5, 10.7, 10.5, 10.6, 10.5, 10.6),
                10.0, 0.4, 5);
        assertThat(s.inControl()).isFalse();
        assertThat(s.reason()).contains("8 readings are all on one side");
    }
}
