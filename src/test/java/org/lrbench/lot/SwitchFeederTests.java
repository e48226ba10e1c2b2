package org.lrbench.lot;

import static org.assertj.core.api.Assertions.assertThat;
import static org.mockito.Mockito.inOrder;
import static org.mockito.Mockito.mock;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchLoader;
import org.lrbench.instrument.Switch;
import org.mockito.InOrder;

/** The tray's positions sit on consecutive channels from the bench's first channel, whatever the unit numbers. */
class SwitchFeederTests {

    @Test
    void positionsFollowTheBenchsFirstChannelAndMeasuredSerialsArePassedOver() {
        Switch unit = mock(Switch.class);
        SwitchFeeder feeder = new SwitchFeeder(unit, 201, List.of("A", "B", "C"));
        assertThat(feeder.next(new PartFeeder.Prompt(1, 3, Set.of())).serial()).isEqualTo("A");
        assertThat(feeder.next(new PartFeeder.Prompt(2, 3, Set.of("B"))).serial()).isEqualTo("C");
        assertThat(feeder.next(new PartFeeder.Prompt(3, 3, Set.of("B"))).action()).isEqualTo(PartFeeder.Action.STOP);
        InOrder order = inOrder(unit);
        order.verify(unit).connect(201);
        order.verify(unit).connect(203);
        order.verify(unit).disconnectAll();
    }

    @Test
    void theBenchFileNamesTheFirstChannelOrLeavesItAtOne(@TempDir Path dir) throws Exception {
        String bench = Files.readString(TestBench.home().resolve("simulator/bench.yaml"));
        Files.writeString(dir.resolve("b.yaml"), bench);
        assertThat(BenchLoader.load(dir.resolve("b.yaml")).switchUnit().firstChannel()).isEqualTo(1);
        Files.writeString(dir.resolve("b101.yaml"), bench.replace("  address: sim://switch",
                "  address: sim://switch\n  first_channel: 101"));
        assertThat(BenchLoader.load(dir.resolve("b101.yaml")).switchUnit().firstChannel()).isEqualTo(101);
    }
}
