package org.lrbench.benchmark;

import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.CyclicBarrier;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.driver.DriverLoader;
import org.lrbench.lot.LotRunner;
import org.lrbench.lot.LotStart;
import org.lrbench.lot.TrayFeeder;
import org.lrbench.records.RecordCheck;
import org.lrbench.report.LotReport;
import org.lrbench.sim.PartModel;
import org.lrbench.store.LotHold;
import org.lrbench.store.ResultStore;

/**
 * A lab's records at size: per sample size (one lot each, simulated parts, one SQLite store) the lot
 * report's size and the time to write it, and the time to verify the lot; then runs racing for one lot
 * at one instant, and what each met. Goals: a 315-part lot's report under 2 MB, written in under 3 s;
 * exactly one run holds a raced lot, every other is told who.
 */
public final class RecordsBenchmark {
    /** Lot sizes whose sample (ISO 2859-1 level II, single, normal) is 8, 50, 125 and 315 parts. */
    static final int[][] LOTS = {{40, 8}, {300, 50}, {2000, 125}, {20000, 315}};

    private RecordsBenchmark() {
    }

    public static int run(PrintStream out, BenchConfig bench, Path planFile, Path drivers, int largest) throws Exception {
        Path dir = Files.createTempDirectory("lrbench-records-bench");
        int misses = 0;
        out.printf(Locale.ROOT, "records at size: one simulated lot per sample size, report and verify timed (best of 3)%n");
        out.printf(Locale.ROOT, "%8s %8s %12s %14s %12s %14s%n", "lot size", "parts", "report", "report time", "per part",
                "verify time");
        try (ResultStore store = ResultStore.open(dir.resolve("data/lrbench.db"))) {
            for (int[] lot : LOTS) {
                if (lot[1] > largest) {
                    continue;
                }
                String name = "SIZE-" + lot[1];
                List<SimulatedPart.Slot> tray = new ArrayList<>();
                for (int i = 1; i <= lot[1]; i++) {
                    // parts a little apart, so the tiles differ as a real lot's do
                    tray.add(new SimulatedPart.Slot(String.format(Locale.ROOT, "S%d-%04d", lot[1], i), SimulatedPart.of(
                            new PartModel(1e-3 * (1 + 0.01 * ((i * 7919) % 11 - 5) / 5.0), 2.3, 15e-12))));
                }
                // started as every lot is (lot.LotStart), on the simulated bench, traces not kept
                LotStart.Ready ready = LotStart.prepare(new LotStart.Request(planFile, bench, new DriverLoader(drivers),
                        name, lot[0], "benchmark", null, null, null, true, false, new LotStart.Folders(dir.resolve("cal"),
                        dir.resolve("runs"), dir.resolve("tables")), "benchmark"), store);
                LotRunner.run(ready.setup(), new TrayFeeder(tray), r -> { });
                long best = Long.MAX_VALUE;
                byte[] report = new byte[0];
                for (int k = 0; k < 3; k++) {
                    long t0 = System.nanoTime();
                    report = LotReport.html(store, name).getBytes(StandardCharsets.UTF_8);
                    best = Math.min(best, System.nanoTime() - t0);
                }
                int bytes = report.length;
                Files.write(dir.resolve(name + ".html"), report);
                long verify = Long.MAX_VALUE;
                for (int k = 0; k < 3; k++) {
                    long t0 = System.nanoTime();
                    RecordCheck.findings(store, dir.resolve("runs"), name);
                    verify = Math.min(verify, System.nanoTime() - t0);
                }
                boolean miss = lot[1] == 315 && (bytes > 2_000_000 || best > 3e9);
                misses += miss ? 1 : 0;
                out.printf(Locale.ROOT, "%8d %8d %9.0f kB %11.0f ms %9.1f kB %11.0f ms%s%n", lot[0], lot[1], bytes / 1e3,
                        best / 1e6, bytes / 1e3 / lot[1], verify / 1e6, miss ? "   MISS" : "");
            }
        }
        out.printf(Locale.ROOT, "the reports are in %s (to print or page through)%n", dir);
        misses += race(out, dir.resolve("race.db"), 4, 20);
        out.println(misses == 0 ? "every goal met" : misses + " goal(s) missed (marked MISS)");
        return misses;
    }

    /** {@code runs} runs take one new lot at one instant, {@code rounds} times, each on its own connection. */
    static int race(PrintStream out, Path db, int runs, int rounds) throws Exception {
        int oneHolder = 0;
        int refusedNamingIt = 0;
        int errors = 0;
        try (ResultStore s = ResultStore.open(db)) {
            s.heldBy("none");
        }
        for (int round = 0; round < rounds; round++) {
            String lot = "RACE-" + round;
            CyclicBarrier together = new CyclicBarrier(runs);
            ConcurrentLinkedQueue<String> outcomes = new ConcurrentLinkedQueue<>();
            List<Thread> threads = new ArrayList<>();
            for (int r = 0; r < runs; r++) {
                String me = "run" + r;
                Thread th = new Thread(() -> {
                    try (ResultStore s = ResultStore.open(db)) {
                        together.await();
                        Instant now = Instant.now();
                        LotHold other = s.holdLot(new LotHold(lot, me, "bench-" + me, "host", ProcessHandle.current().pid(),
                                now, now), Duration.ofMinutes(5));
                        outcomes.add(other == null ? "held" : "refused:" + other.holder());
                    } catch (Exception e) {
                        outcomes.add("error:" + e.getMessage());
                    }
                });
                threads.add(th);
                th.start();
            }
            for (Thread th : threads) {
                th.join();
            }
            long held = outcomes.stream().filter("held"::equals).count();
            oneHolder += held == 1 ? 1 : 0;
            refusedNamingIt += (int) outcomes.stream().filter(o -> o.startsWith("refused:run")).count();
            errors += (int) outcomes.stream().filter(o -> o.startsWith("error:")).count();
        }
        boolean miss = oneHolder != rounds || errors > 0 || refusedNamingIt != rounds * (runs - 1);
        out.printf(Locale.ROOT, "%d runs racing for one lot, %d rounds (SQLite): one holder in %d, %d refusals naming the"
                + " holder, %d errors%s%n", runs, rounds, oneHolder, refusedNamingIt, errors, miss ? "   MISS" : "");
        return miss ? 1 : 0;
    }
}
