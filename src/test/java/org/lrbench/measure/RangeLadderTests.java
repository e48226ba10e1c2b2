package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

/**
 * The ladder of ranges lrbench asks for: the R10 series of preferred numbers, 1.00, 1.25, 1.60, 2.00,
 * 2.50, 3.15, 4.00, 5.00, 6.30, 8.00 in each decade (ISO 3, the rounded values of 10^(i/10); from memory).
 */
class RangeLadderTests {

    @Test
    void aRequestIsRoundedUpToTheNextR10Value() {
        double[][] cases = {{1.1, 1.25}, {0.3, 0.315}, {7, 8}, {8.0001, 10}, {0.01, 0.01}, {3.15, 3.15},
            {3.16, 4}, {0.0049, 0.005}, {62, 63}, {1e-3, 1e-3}};
        for (double[] c : cases) {
            assertThat(RangeLadder.up(c[0])).as("up(%s)", c[0]).isEqualTo(c[1]);
        }
        // the next rung above a rung, and every rung of a decade in order
        assertThat(RangeLadder.next(2.0)).isEqualTo(2.5);
        double r = 1.0;
        StringBuilder decade = new StringBuilder();
        for (int i = 0; i < 10; i++) {
            decade.append(r).append(' ');
            r = RangeLadder.next(r);
        }
        assertThat(decade.toString().trim()).isEqualTo("1.0 1.25 1.6 2.0 2.5 3.15 4.0 5.0 6.3 8.0");
        assertThat(r).isEqualTo(10.0);
    }
}
