package org.lrbench.store;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.CyclicBarrier;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Runs that start one lot at one instant meet an outcome, never a database error: exactly one holds the
 * lot, every other is told who does (bench, process, since when); a hold of a run that died is taken over
 * when stale, or at once when its process is gone from this host. Each run has its own connection, as a
 * process has. (Mutual exclusion by a row's primary key and compare-and-set: common practice, no source.)
 */
class LotHoldTests {
    private static final Duration STALE = Duration.ofMinutes(5);

    static LotHold hold(String lot, String holder, String host, long pid, Instant at) {
        return new LotHold(lot, holder, "bench-" + holder, host, pid, at, at);
    }

    /** {@code runs} runs take one new lot at one instant, {@code rounds} times: one holder each time. */
    static void startAtOnce(Supplier<ResultStore> open, int runs, int rounds) throws Exception {
        try (ResultStore s = open.get()) {
            assertThat(s.heldBy("none")).isNull(); // the schema in place before the race
        }
        for (int round = 0; round < rounds; round++) {
            String lot = "RACE-" + round;
            CyclicBarrier together = new CyclicBarrier(runs);
            ConcurrentLinkedQueue<String> outcomes = new ConcurrentLinkedQueue<>();
            ConcurrentLinkedQueue<Throwable> errors = new ConcurrentLinkedQueue<>();
            List<Thread> threads = new ArrayList<>();
            for (int r = 0; r < runs; r++) {
                String me = "run" + r;
                Thread t = new Thread(() -> {
                    try (ResultStore s = open.get()) {
                        together.await();
                        LotHold other = s.holdLot(hold(lot, me, "host-" + me, 1000, Instant.now()), STALE);
                        outcomes.add(other == null ? "HELD:" + me : "REFUSED:" + other.holder());
                    } catch (Throwable e) {
                        errors.add(e);
                    }
                });
                threads.add(t);
                t.start();
            }
            for (Thread t : threads) {
                t.join();
            }
            assertThat(errors).as("round %d", round).isEmpty();
            List<String> won = outcomes.stream().filter(o -> o.startsWith("HELD:")).toList();
            assertThat(won).as("round %d: %s", round, outcomes).hasSize(1);
            String winner = won.get(0).substring(5);
            assertThat(outcomes.stream().filter(o -> o.startsWith("REFUSED:")))
                    .allSatisfy(o -> assertThat(o).isEqualTo("REFUSED:" + winner));
            try (ResultStore s = open.get()) {
                assertThat(s.heldBy(lot).holder()).isEqualTo(winner);
                assertThat(s.heldBy(lot).describe()).contains("bench-" + winner).contains("process 1000")
                        .contains("host-" + winner);
            }
        }
    }

    @Test
    void sqliteRunsStartingOneLotAtOnceMeetOneHolder(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("s.db");
        startAtOnce(() -> ResultStore.open(db), 4, 10);
    }

    @Test
    void postgresRunsStartingOneLotAtOnceMeetOneHolder() throws Exception {
        String url = SharedStoreTests.postgres();
        SharedStoreTests.reset(url);
        startAtOnce(() -> ResultStore.openUrl(url), 4, 10);
    }

    @Test
    void aHoldIsGivenBackRenewedAndTakenOverOnlyWhenItsRunIsGone(@TempDir Path dir) throws Exception {
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            Instant now = Instant.now();
            String here = "this-host";
            long alive = ProcessHandle.current().pid();
            LotHold a = hold("L", "a", here, alive, now.minus(Duration.ofMinutes(4)));
            assertThat(s.holdLot(a, STALE)).isNull();
            // four minutes old and its process alive: held
            assertThat(s.holdLot(hold("L", "b", here, alive + 1, now), STALE).holder()).isEqualTo("a");
            // renewed, then given back: the next run takes it
            assertThat(s.renewHold(a, now)).isTrue();
            s.releaseHold(a);
            assertThat(s.heldBy("L")).isNull();
            LotHold b = hold("L", "b", "other-host", 42, now.minus(Duration.ofMinutes(6)));
            assertThat(s.holdLot(b, STALE)).isNull();
            // six minutes without a sign of life on another host: stale, taken over; the old run learns it
            assertThat(s.holdLot(hold("L", "c", here, alive, now), STALE)).isNull();
            assertThat(s.renewHold(b, now)).isFalse();
            // a hold whose process is gone from this host is taken over at once
            Process gone = new ProcessBuilder("true").start();
            gone.waitFor();
            s.releaseHold(hold("L", "c", here, alive, now));
            assertThat(s.holdLot(hold("L", "d", here, gone.pid(), now), STALE)).isNull();
            assertThat(s.holdLot(hold("L", "e", here, alive, now), STALE)).isNull();
            assertThat(s.heldBy("L").holder()).isEqualTo("e");
        }
    }
}
