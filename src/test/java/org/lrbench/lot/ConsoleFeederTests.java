package org.lrbench.lot;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.BufferedReader;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.lrbench.judge.Verdict;

/** The console prompt as a keyboard-wedge scanner and an operator use it. */
class ConsoleFeederTests {

    static ConsoleFeeder feeder(String typed, ByteArrayOutputStream out) {
        return new ConsoleFeeder(new BufferedReader(new StringReader(typed)), new PrintStream(out, true, StandardCharsets.UTF_8));
    }

    @Test
    void aDoubleScanIsRefusedUnlessTheOperatorGivesAReason() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        // scanned twice (refused, Enter declines), then scanned again with a reason
        ConsoleFeeder f = feeder("HC-1\n\nHC-1\nlead clip slipped\n", out);
        PartFeeder.Next n = f.next(new PartFeeder.Prompt(2, 8, Set.of("HC-1")));
        assertThat(n.action()).isEqualTo(PartFeeder.Action.MEASURE);
        assertThat(n.serial()).isEqualTo("HC-1");
        assertThat(n.reason()).isEqualTo("lead clip slipped");
        assertThat(out.toString(StandardCharsets.UTF_8)).contains("HC-1 is already measured in this lot")
                .contains("HC-1 not measured again");
    }

    @Test
    void aSerialThatCannotBeAFileNameIsRefusedAtThePrompt() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ConsoleFeeder f = feeder("../x\nHC-2\n", out);
        PartFeeder.Next n = f.next(new PartFeeder.Prompt(1, 8, Set.of()));
        assertThat(n.serial()).isEqualTo("HC-2");
        assertThat(n.reason()).isNull();
        assertThat(out.toString(StandardCharsets.UTF_8)).contains("serial '../x' ('.' at position 1): use 1 to 64 letters");
    }

    @Test
    void measuringAgainAfterAPartAsksWhy() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        assertThat(feeder("r\nprobe moved\n", out).again("HC-3", Verdict.FAIL)).isEqualTo("probe moved");
        assertThat(feeder("r\n\n", new ByteArrayOutputStream()).again("HC-3", Verdict.FAIL)).isNull();
        assertThat(feeder("\n", new ByteArrayOutputStream()).again("HC-3", Verdict.PASS)).isNull();
    }

    @Test
    void aSerialScannedAtTheAfterPartQuestionIsTheNextPartNeverLost() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        // the operator scans the next part while the question about the last one is open
        ConsoleFeeder f = feeder("HC-5\n", out);
        assertThat(f.again("HC-4", Verdict.PASS)).isNull();
        PartFeeder.Next n = f.next(new PartFeeder.Prompt(5, 8, Set.of("HC-4")));
        assertThat(n.action()).isEqualTo(PartFeeder.Action.MEASURE);
        assertThat(n.serial()).isEqualTo("HC-5");
        assertThat(out.toString(StandardCharsets.UTF_8)).contains("'HC-5' is taken as the entry for the next part");
        // q typed there stops at the next prompt, as it would have there
        ConsoleFeeder g = feeder("q\n", new ByteArrayOutputStream());
        assertThat(g.again("HC-4", Verdict.FAIL)).isNull();
        assertThat(g.next(new PartFeeder.Prompt(5, 8, Set.of())).action()).isEqualTo(PartFeeder.Action.STOP);
    }
}
