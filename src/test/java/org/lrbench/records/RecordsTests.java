package org.lrbench.records;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.sql.DriverManager;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.lrbench.judge.Verdict;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.measure.PointResult;
import org.lrbench.results.Attempt;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.ResultStore;
import org.lrbench.store.ResultStoreTests;
import org.lrbench.store.StoreException;
import org.lrbench.traces.TraceArchiveTests;

/**
 * The records a lot leaves behind: written whole or not at all, never replaced, repaired after a
 * crash, and checked byte for byte by {@link RecordCheck}.
 */
class RecordsTests {

    static PartResult attempt(String serial, String verdict, int number, String reason) {
        return ResultStoreTests.part("L1", serial, verdict).withAttempt(new PartResult.AttemptRecord(1, number, "op", reason));
    }

    static List<PointResult> traces() throws Exception {
        return TraceArchiveTests.sweep();
    }

    @Test
    void everyFileAndRowAlteredTruncatedOrRemovedIsNamed(@TempDir Path dir) throws Exception {
        Path runs = dir.resolve("runs");
        var points = traces();
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            StoreLedger ledger = new StoreLedger(s, runs, true);
            ledger.open(ResultStoreTests.terms("L1", 40), null);
            for (int i = 1; i <= 3; i++) {
                ledger.keep(attempt("S" + i, "pass", 1, null), i, points, 100);
            }
            assertThat(RecordCheck.findings(s, runs, "L1")).isEmpty();
            // one byte of a JSON edited, an archive truncated, a row deleted
            Path json = runs.resolve("L1/S1.json");
            byte[] b = Files.readAllBytes(json);
            b[b.length / 2] ^= 0x01;
            Files.write(json, b);
            Path archive = runs.resolve("L1/S2.lrtraces");
            try (var ch = FileChannel.open(archive, StandardOpenOption.WRITE)) {
                ch.truncate(Files.size(archive) - 100);
            }
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("s.db")); var st = c.createStatement()) {
            st.executeUpdate("DELETE FROM attempt WHERE serial = 'S3'");
        }
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            List<String> f = RecordCheck.findings(s, runs, "L1");
            assertThat(f).anySatisfy(x -> assertThat(x).contains("S1.json").contains("altered"));
            assertThat(f).anySatisfy(x -> assertThat(x).contains("S2.lrtraces").contains("truncated"));
            assertThat(f).anySatisfy(x -> assertThat(x).contains("attempt 1 of S3").contains("missing"));
            assertThat(f).hasSize(3);
        }
    }

    @Test
    void aRecordIsNeverReplaced(@TempDir Path dir) throws Exception {
        Path target = dir.resolve("S1.json");
        ResultFiles.writeNew(target, "first".getBytes(StandardCharsets.UTF_8));
        assertThatThrownBy(() -> ResultFiles.writeNew(target, "second".getBytes(StandardCharsets.UTF_8)))
                .isInstanceOf(FileAlreadyExistsException.class);
        assertThat(target).hasContent("first");
        try (var files = Files.list(dir)) {
            assertThat(files).containsExactly(target);
        }
    }

    @Test
    void aCrashBetweenTheCommitAndTheFileNamesIsRepairedOnTheNextOpen(@TempDir Path dir) throws Exception {
        Path runs = dir.resolve("runs");
        var points = traces();
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            StoreLedger ledger = new StoreLedger(s, runs, true);
            ledger.open(ResultStoreTests.terms("L1", 40), null);
            ledger.keep(attempt("S1", "pass", 1, null), 1, points, 100);
            ledger.keep(attempt("S2", "fail", 1, null), 2, points, 100);
        }
        // as a kill -9 after the commit leaves it: S1's JSON not yet named, S2's archive still under its
        // temporary name, and a half-written temporary file of a part that was never committed
        Path lotDir = runs.resolve("L1");
        Files.delete(lotDir.resolve("S1.json"));
        long deadPid = deadProcess();
        Path tmpArchive = lotDir.resolve(".S2.lrtraces.p" + deadPid + "-1.partial");
        Files.move(lotDir.resolve("S2.lrtraces"), tmpArchive);
        Path half = lotDir.resolve(".S3.json.p" + deadPid + "-2.partial");
        Files.writeString(half, "{\"schema\": \"lrbench.part-res");
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            assertThat(RecordCheck.findings(s, runs, "L1")).hasSize(2);
            StoreLedger ledger = new StoreLedger(s, runs, true);
            ledger.open(ResultStoreTests.terms("L1", 40), null);
            assertThat(ledger.repairs()).hasSize(3);
            assertThat(RecordCheck.findings(s, runs, "L1")).isEmpty();
            assertThat(half).doesNotExist();
            assertThat(tmpArchive).doesNotExist();
        }
    }

    @Test
    void ofTwoRunsKeepingTheSameAttemptTheLoserLeavesNothingUnderFinalNames(@TempDir Path dir) throws Exception {
        Path runs = dir.resolve("runs");
        var points = traces();
        try (ResultStore first = ResultStore.open(dir.resolve("s.db"))) {
            new StoreLedger(first, runs, true).open(ResultStoreTests.terms("L1", 40), null);
        }
        List<Throwable> failures = new ArrayList<>();
        List<String> winners = new ArrayList<>();
        CountDownLatch go = new CountDownLatch(1);
        List<Thread> benches = new ArrayList<>();
        for (String bench : List.of("A", "B")) {
            Thread t = new Thread(() -> {
                try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
                    StoreLedger ledger = new StoreLedger(s, runs, true);
                    go.await();
                    ledger.keep(attempt("S1", bench.equals("A") ? "pass" : "fail", 1, null), 1, points, 100);
                    synchronized (winners) {
                        winners.add(bench);
                    }
                } catch (Throwable e) {
                    synchronized (failures) {
                        failures.add(e);
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
        assertThat(winners).hasSize(1);
        assertThat(failures).singleElement().satisfies(e -> assertThat(e.getMessage())
                .satisfiesAnyOf(m -> assertThat(m).contains("already has attempt 1"),
                        m -> assertThat(m).contains("never replaced")));
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            assertThat(s.attempts("L1")).singleElement().extracting(Attempt::verdict)
                    .isEqualTo(winners.get(0).equals("A") ? Verdict.PASS : Verdict.FAIL);
            assertThat(RecordCheck.findings(s, runs, "L1")).isEmpty();
        }
        try (var files = Files.list(runs.resolve("L1"))) {
            assertThat(files.map(p -> p.getFileName().toString()).sorted()).containsExactly("S1.json", "S1.lrtraces");
        }
    }

    @Test
    void aFullDiskStoresNothingAndNamesThePath(@TempDir Path dir) throws Exception {
        Path runs = dir.resolve("tiny");
        Files.createDirectories(runs);
        assumeTrue(mount(runs, "size=256k"), "cannot mount a 256 KiB tmpfs here (needs root): full-disk test skipped");
        try {
            var points = traces();
            try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
                StoreLedger ledger = new StoreLedger(s, runs, true);
                ledger.open(ResultStoreTests.terms("L1", 40), null);
                IOException e = null;
                int kept = 0;
                for (int i = 1; i <= 20 && e == null; i++) {
                    try {
                        ledger.keep(attempt("S" + i, "pass", 1, null), i, points, 100);
                        kept++;
                    } catch (IOException full) {
                        e = full;
                    }
                }
                assertThat(e).isNotNull();
                assertThat(e.getMessage()).contains(runs.resolve("L1").toString()).contains("No space left on device");
                // what was committed is whole; the part that did not fit left neither a row nor a file
                assertThat(s.attempts("L1")).hasSize(kept);
                assertThat(RecordCheck.findings(s, runs, "L1")).isEmpty();
                try (var files = Files.list(runs.resolve("L1"))) {
                    assertThat(files.filter(p -> p.getFileName().toString().startsWith("."))).isEmpty();
                }
            }
        } finally {
            new ProcessBuilder("umount", runs.toString()).start().waitFor(10, TimeUnit.SECONDS);
        }
    }

    @Test
    void aStoreOnAFullDiskSaysSoAndKeepsWhatWasCommitted(@TempDir Path dir) throws Exception {
        Path disk = dir.resolve("disk");
        Files.createDirectories(disk);
        assumeTrue(mount(disk, "size=192k"), "cannot mount a tmpfs here (needs root): full-disk store test skipped");
        try {
            int stored = 0;
            StoreException full = null;
            try (ResultStore s = ResultStore.open(disk.resolve("s.db"))) {
                s.inspect(ResultStoreTests.terms("L1", 40), null, "t0");
                String big = "x".repeat(20_000);
                for (int i = 1; i <= 100 && full == null; i++) {
                    try {
                        ResultStoreTests.store(s, 1, i, 1, ResultStoreTests.part("L1", "S" + i, "pass"), big);
                        stored++;
                    } catch (StoreException e) {
                        full = e;
                    }
                }
            }
            assertThat(full).isNotNull();
            assertThat(full.getMessage()).contains("storing S" + (stored + 1)).contains("the disk is full");
            try (ResultStore s = ResultStore.openForReading(disk.resolve("s.db"))) {
                assertThat(s.attempts("L1")).hasSize(stored);
                assertThat(s.chainFindings("L1")).isEmpty();
            }
        } finally {
            new ProcessBuilder("umount", disk.toString()).start().waitFor(10, TimeUnit.SECONDS);
        }
    }

    @Test
    void aStoreOnReadOnlyMediaIsReadAndVerified(@TempDir Path dir) throws Exception {
        Path media = dir.resolve("media");
        Files.createDirectories(media);
        assumeTrue(mount(media, "size=4m"), "cannot mount a tmpfs here (needs root): read-only media test skipped");
        try {
            var points = traces();
            try (ResultStore s = ResultStore.open(media.resolve("s.db"))) {
                StoreLedger ledger = new StoreLedger(s, media.resolve("runs"), true);
                ledger.open(ResultStoreTests.terms("L1", 40), null);
                ledger.keep(attempt("S1", "pass", 1, null), 1, points, 100);
            }
            assumeTrue(new ProcessBuilder("mount", "-o", "remount,ro", media.toString()).start().waitFor() == 0,
                    "cannot remount read-only here");
            assertThat(Files.isWritable(media.resolve("s.db"))).isFalse();
            try (ResultStore s = ResultStore.open(media.resolve("s.db"))) {
                assertThat(s.lots()).singleElement().extracting(l -> l.measured()).isEqualTo(1);
                assertThat(RecordCheck.findings(s, media.resolve("runs"), "L1")).isEmpty();
                assertThatThrownBy(() -> s.inspect(ResultStoreTests.terms("L2", 40), null, "t"))
                        .hasMessageContaining("reading only");
            }
        } finally {
            new ProcessBuilder("umount", media.toString()).start().waitFor(10, TimeUnit.SECONDS);
        }
    }

    static boolean mount(Path dir, String options) {
        try {
            Process p = new ProcessBuilder("mount", "-t", "tmpfs", "-o", options, "tmpfs", dir.toString())
                    .redirectErrorStream(true).start();
            return p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException | InterruptedException e) {
            return false;
        }
    }

    /** The pid of a process that has ended. */
    static long deadProcess() throws Exception {
        Process p = new ProcessBuilder("true").start();
        p.waitFor(10, TimeUnit.SECONDS);
        return p.pid();
    }
}
