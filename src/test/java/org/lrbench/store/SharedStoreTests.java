package org.lrbench.store;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.nio.file.Path;
import java.sql.DriverManager;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import java.time.Instant;
import org.lrbench.results.Attempt;
import org.lrbench.sampling.Severity;

/**
 * Two benches writing one store at once, on SQLite and on a real PostgreSQL server. The PostgreSQL
 * server is the one .ci/run starts, named by LRBENCH_TEST_POSTGRES_URL; without it the PostgreSQL
 * half is skipped with that reason.
 */
class SharedStoreTests {

    static String postgres() {
        String url = System.getenv("LRBENCH_TEST_POSTGRES_URL");
        assumeTrue(url != null && !url.isBlank(),
                "no PostgreSQL server: set LRBENCH_TEST_POSTGRES_URL (.ci/run starts one) to test the shared store");
        return url;
    }

    static void reset(String url) throws Exception {
        try (var c = DriverManager.getConnection(url); var s = c.createStatement()) {
            for (String table : List.of("check_file", "check_file_chain", "decision_chain", "lot_hold", "single_part", "single_part_chain", "chain_record", "lot_chain", "attempt", "inspection", "part_result", "lot",
                    "scheme_decision", "schema_version")) {
                s.execute("DROP TABLE IF EXISTS " + table);
            }
        }
    }

    @Test
    void sqliteKeepsALotConsistentUnderTwoWriters(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("shared.db");
        twoBenches(() -> ResultStore.open(db));
    }

    @Test
    void postgresKeepsALotConsistentUnderTwoWriters() throws Exception {
        String url = postgres();
        reset(url);
        twoBenches(() -> ResultStore.openUrl(url));
        try (ResultStore s = ResultStore.openUrl(url)) {
            assertThat(s.version()).isEqualTo(Migrations.STEPS.size());
            assertThat(s.history("P-1")).hasSize(1);
        }
    }

    @Test
    void postgresKeepsEveryDecisionOnASchemeWhenTwoBenchesDecideAtOnce() throws Exception {
        String url = postgres();
        reset(url);
        try (ResultStore s = ResultStore.openUrl(url)) {
            assertThat(s.schemeHistory("P-1", "S")).isEmpty();
        }
        List<Thread> threads = new ArrayList<>();
        AtomicInteger failures = new AtomicInteger();
        for (int bench = 0; bench < 2; bench++) {
            int b = bench;
            threads.add(new Thread(() -> {
                try (ResultStore s = ResultStore.openUrl(url)) {
                    for (int i = 0; i < 10; i++) {
                        s.decideScheme("P-1", "S", i % 2 == 0 ? Severity.TIGHTENED
                                : Severity.NORMAL, "bench " + b + " decision " + i, "qa", true,
                                Instant.now().toString());
                    }
                } catch (RuntimeException e) {
                    failures.incrementAndGet();
                }
            }));
        }
        threads.forEach(Thread::start);
        for (Thread t : threads) {
            t.join();
        }
        assertThat(failures.get()).isZero();
        try (ResultStore s = ResultStore.openUrl(url)) {
            // 20 decisions, none lost or replaced (each keeps its own sequence number)
            assertThat(s.schemeHistory("P-1", "S")).hasSize(20);
        }
    }

    @Test
    void postgresStoreOpenedByManyBenchesAtOnceIsMigratedOnce() throws Exception {
        String url = postgres();
        reset(url);
        openAtOnce(() -> ResultStore.openUrl(url), 8);
    }

    /** Many benches open one new store at the same moment: every one opens it, at the latest schema. */
    static void openAtOnce(Supplier<ResultStore> open, int benches) throws Exception {
        List<Throwable> failures = new ArrayList<>();
        CountDownLatch go = new CountDownLatch(1);
        List<Thread> threads = new ArrayList<>();
        for (int b = 0; b < benches; b++) {
            int bench = b;
            Thread t = new Thread(() -> {
                try {
                    go.await();
                    try (ResultStore s = open.get()) {
                        assertThat(s.version()).isEqualTo(ResultStore.latestVersion());
                        s.inspect(ResultStoreTests.terms("B" + bench, 40), null, "t0");
                    }
                } catch (Throwable e) {
                    synchronized (failures) {
                        failures.add(e);
                    }
                }
            });
            threads.add(t);
            t.start();
        }
        go.countDown();
        for (Thread t : threads) {
            t.join(60_000);
        }
        assertThat(failures).isEmpty();
        try (ResultStore s = open.get()) {
            assertThat(s.lots()).hasSize(benches);
        }
    }

    /** Two stores (two connections), each saving its own serials and both racing for one shared serial. */
    static void twoBenches(Supplier<ResultStore> open) throws Exception {
        try (ResultStore first = open.get()) {
            first.inspect(ResultStoreTests.terms("L1", 40), null, "2026-12-01T00:00:00Z");
        }
        AtomicInteger sharedWins = new AtomicInteger();
        List<Throwable> unexpected = new ArrayList<>();
        CountDownLatch go = new CountDownLatch(1);
        List<Thread> benches = new ArrayList<>();
        for (int b = 0; b < 2; b++) {
            int bench = b;
            Thread t = new Thread(() -> {
                try (ResultStore s = open.get()) {
                    go.await();
                    for (int i = 0; i < 10; i++) {
                        ResultStoreTests.store(s, 1, bench * 100 + i, 1, ResultStoreTests.part("L1", "B" + bench + "-" + i,
                                "pass"), null);
                    }
                    try {
                        ResultStoreTests.store(s, 1, 999, 1, ResultStoreTests.part("L1", "SHARED", "pass"), null);
                        sharedWins.incrementAndGet();
                    } catch (StoreException expected) {
                        // the other bench stored it first
                    }
                } catch (Throwable e) {
                    synchronized (unexpected) {
                        unexpected.add(e);
                    }
                }
            });
            benches.add(t);
            t.start();
        }
        go.countDown();
        for (Thread t : benches) {
            t.join(60_000);
        }
        assertThat(unexpected).isEmpty();
        assertThat(sharedWins.get()).isEqualTo(1);
        try (ResultStore s = open.get()) {
            assertThat(s.parts("L1")).hasSize(21).extracting(Attempt::serial).doesNotHaveDuplicates();
            assertThat(s.attempts("L1")).hasSize(21);
            // both benches appended to one lot's hash chain, in turn, without a gap
            assertThat(s.chainFindings("L1")).isEmpty();
        }
    }
}
