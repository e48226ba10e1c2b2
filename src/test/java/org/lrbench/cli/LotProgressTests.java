package org.lrbench.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** The progress line says where the lot is and, from the points so far, how long is left. */
class LotProgressTests {

    @Test
    void theLineCountsPartsAndPointsAndEstimatesWhatIsLeft() {
        long[] now = {0};
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        LotProgress p = new LotProgress(new PrintStream(bytes, true, StandardCharsets.UTF_8), 8, 7, () -> now[0]);
        p.sweepStarted();
        assertThat(p.line(0)).isEqualTo("part 1 of 8 - point 0 of 7");
        // 2 s a point: after 5 of 56 points, 51 are left, about 102 s
        for (int i = 0; i < 5; i++) {
            now[0] += 2_000_000_000L;
            p.pointMeasured(i, 7, null);
        }
        assertThat(p.line(5)).isEqualTo("part 1 of 8 - point 5 of 7 - about 1 min 42 s left");
        p.close();
        assertThat(bytes.toString(StandardCharsets.UTF_8)).contains("\rpart 1 of 8 - point 5 of 7").endsWith("\r");
    }

    @Test
    void durationsReadAsAPersonSaysThem() {
        assertThat(LotProgress.duration(6.4)).isEqualTo("6 s");
        assertThat(LotProgress.duration(125)).isEqualTo("2 min 5 s");
        assertThat(LotProgress.duration(3780)).isEqualTo("1 h 3 min");
    }
}
