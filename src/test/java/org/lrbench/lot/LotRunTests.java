package org.lrbench.lot;

import org.lrbench.run.PartRun;

import org.lrbench.bench.SimulatedPart;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.HashSet;
import java.util.HexFormat;
import java.util.List;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.records.RecordCheck;
import org.lrbench.records.StoreLedger;
import org.lrbench.results.Attempt;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sim.SimLot;
import org.lrbench.store.ResultStore;

public class LotRunTests {
    static final Path HOME = TestBench.home();

    public static LotRunner.Setup setup(ResultStore store, Path runs) throws Exception {
        return setup(store, runs, 40);
    }

    public static LotRunner.Setup setup(ResultStore store, Path runs, int lotSize) throws Exception {
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench.yaml"));
        Plan p = PlanLoader.load(HOME.resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        byte[] content = Files.readAllBytes(HOME.resolve("plans/qfd-ind-1m0.yaml"));
        String sha = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(content));
        PartRun.Request t = new PartRun.Request(p, sha, b, "LOT-1", "-", true, "test");
        return LotRunner.Setup.of(t, lotSize, new DriverLoader(HOME.resolve("drivers")), new StoreLedger(store, runs, true))
                .withOperator("tester");
    }

    static SimLot tray() throws Exception {
        return SimLot.load(HOME.resolve("simulator/demo-lot.yaml"));
    }

    /** A tray feeder that stops after so many parts, as an operator pressing q would. */
    static PartFeeder stoppingAfter(PartFeeder inner, int parts) {
        return new PartFeeder() {
            int given;

            @Override
            public Next next(Prompt prompt) {
                return given++ < parts ? inner.next(prompt) : Next.stop();
            }
        };
    }

    /** An operator at the fixture who answers from a script and records what the runner refused. */
    static final class ScriptedOperator implements PartFeeder {
        final Deque<Next> answers;
        final List<String> refusals = new ArrayList<>();

        ScriptedOperator(List<Next> answers) {
            this.answers = new ArrayDeque<>(answers);
        }

        @Override
        public Next next(Prompt prompt) {
            return answers.isEmpty() ? Next.stop() : answers.poll();
        }

        @Override
        public void refused(String message) {
            refusals.add(message);
        }
    }

    static PartFeeder.Next part(SimLot tray, String serial, String reason) {
        var p = tray.parts().stream().filter(x -> x.serial().equals(serial)).findFirst().orElseThrow();
        return new PartFeeder.Next(PartFeeder.Action.MEASURE, serial, SimulatedPart.of(p.model()), reason);
    }

    @Test
    void aStoppedLotResumesAfterItsLastCompletedPart(@TempDir Path dir) throws Exception {
        SimLot tray = tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.Outcome first = LotRunner.run(setup(store, dir), stoppingAfter(new TrayFeeder(SimulatedPart.tray(tray.parts())), 3),
                    r -> { });
            assertThat(first.keptNow()).hasSize(3);
            assertThat(first.disposition().state()).isEqualTo(LotDisposition.State.OPEN);
            List<String> measuredAgain = new ArrayList<>();
            LotRunner.Outcome second = LotRunner.run(setup(store, dir), new TrayFeeder(SimulatedPart.tray(tray.parts())),
                    r -> measuredAgain.add(r.serial()));
            assertThat(measuredAgain).doesNotContain("HC0417-0001", "HC0417-0002", "HC0417-0003").hasSize(5);
            assertThat(second.counting()).extracting(Attempt::serial).doesNotHaveDuplicates().hasSize(8);
            assertThat(second.disposition().state()).isEqualTo(LotDisposition.State.REJECT);
            assertThat(store.lots().get(0).disposition()).isEqualTo(LotDisposition.State.REJECT);
            assertThat(RecordCheck.findings(store, dir, "LOT-1")).isEmpty();
        }
    }

    @Test
    void aLotIsHeldToItsTermsAndADecidedLotIsClosed(@TempDir Path dir) throws Exception {
        SimLot tray = tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.run(setup(store, dir), stoppingAfter(new TrayFeeder(SimulatedPart.tray(tray.parts())), 2), r -> { });
            // a half-measured lot resumed with a smaller lot size (n = 2, Ac 0 by ISO 2859-1) is refused
            assertThatThrownBy(() -> LotRunner.preflight(setup(store, dir, 5))).isInstanceOf(LotRefused.class)
                    .hasMessageContaining("lot size: stored 40, given 5");
            assertThatThrownBy(() -> LotRunner.run(setup(store, dir, 5), new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { }))
                    .hasMessageContaining("lot size: stored 40, given 5");
            LotRunner.Outcome done = LotRunner.run(setup(store, dir), new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { });
            assertThat(done.disposition().state()).isEqualTo(LotDisposition.State.REJECT);
            // the same lot again, even with a lot size that would accept it: closed, nothing measured
            List<String> measured = new ArrayList<>();
            assertThat(LotRunner.preflight(setup(store, dir, 5)).disposition()).isEqualTo(LotDisposition.State.REJECT);
            LotRunner.Outcome again = LotRunner.run(setup(store, dir, 5), new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> measured.add(r.serial()));
            assertThat(again.closed()).isTrue();
            assertThat(measured).isEmpty();
            assertThat(store.lots()).hasSize(1);
            assertThat(store.lots().get(0).disposition()).isEqualTo(LotDisposition.State.REJECT);
            // a re-inspection is an explicit act with a reason: a new inspection, the first one kept
            LotRunner.Outcome second = LotRunner.run(setup(store, dir).reinspecting("supplier sorted the lot"),
                    new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> measured.add(r.serial()));
            assertThat(second.inspection().round()).isEqualTo(2);
            assertThat(measured).hasSize(8);
            assertThat(store.lots()).extracting(l -> l.round() + " " + l.disposition().word())
                    .containsExactly("1 reject", "2 reject");
            assertThat(store.attempts("LOT-1")).hasSize(16);
            // second attempts of each serial have their own files; the first ones are untouched
            assertThat(dir.resolve("LOT-1/HC0417-0001~2.json")).exists();
            assertThat(RecordCheck.findings(store, dir, "LOT-1")).isEmpty();
        }
    }

    @Test
    void aDoubleScanIsRefusedAndAMeasureAgainIsANewAttempt(@TempDir Path dir) throws Exception {
        SimLot tray = tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            ScriptedOperator op = new ScriptedOperator(List.of(part(tray, "HC0417-0004", null),
                    part(tray, "HC0417-0004", null), part(tray, "HC0417-0004", "probe clip slipped")));
            LotRunner.run(setup(store, dir), op, r -> { });
            assertThat(op.refusals).singleElement().asString().contains("HC0417-0004 is already measured");
            List<Attempt> attempts = store.attempts("LOT-1");
            assertThat(attempts).extracting(Attempt::number).containsExactly(1, 2);
            assertThat(attempts.get(1).reason()).isEqualTo("probe clip slipped");
            assertThat(attempts.get(1).position()).isEqualTo(attempts.get(0).position());
            assertThat(store.parts("LOT-1")).singleElement().extracting(Attempt::number).isEqualTo(2);
            assertThat(dir.resolve("LOT-1/HC0417-0004.json")).hasContent(attempts.get(0).resultJson());
            assertThat(dir.resolve("LOT-1/HC0417-0004~2.json")).hasContent(attempts.get(1).resultJson());
            assertThat(dir.resolve("LOT-1/HC0417-0004~2.lrtraces")).exists();
            assertThat(store.lots().get(0).measured()).isEqualTo(1);
        }
    }

    @Test
    void aStopDuringASweepDropsThePartInProgress(@TempDir Path dir) throws Exception {
        SimLot tray = tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotStop stop = new LotStop();
            List<String> shown = new ArrayList<>();
            int[] points = {0};
            int perPart = setup(store, dir).template().plan().sweep().frequenciesHz().size();
            SweepListener signal = new SweepListener() {
                @Override
                public void pointMeasured(int index, int count, PointResult point) {
                    // SIGTERM arrives half-way through the third part's sweep
                    if (++points[0] == 2 * perPart + 3) {
                        assertThat(stop.request()).isFalse();
                    }
                }
            };
            LotRunner.Outcome o = LotRunner.run(setup(store, dir).withStop(stop).withListener(signal),
                    new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> shown.add(r.serial()));
            assertThat(o.stopped()).isTrue();
            assertThat(shown).containsExactly("HC0417-0001", "HC0417-0002");
            assertThat(store.attempts("LOT-1")).extracting(Attempt::serial).containsExactly("HC0417-0001", "HC0417-0002");
            assertThat(stop.progress()).isEqualTo("2 of 8 parts");
            assertThat(dir.resolve("LOT-1/HC0417-0003.json")).doesNotExist();
            assertThat(store.lots().get(0).disposition()).isNull();
        }
    }

    @Test
    void aLotRunKilledHardLosesAtMostThePartInProgress(@TempDir Path dir) throws Exception {
        // a separate JVM runs the lot and is killed as soon as two parts are complete (their JSON files
        // get their final names after their store commits); the store is not touched while it runs
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Path db = dir.resolve("data/lrbench.db");
        List<String> cmd = List.of(java, "-cp", System.getProperty("java.class.path"), "-Dlrbench.home=" + HOME,
                "org.lrbench.cli.Main", "run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "LOT-1",
                "--lot-size", "40", "--sim-lot", HOME.resolve("simulator/demo-lot.yaml").toString(),
                "--data", dir.resolve("data").toString(), "--runs", dir.resolve("runs").toString(),
                "--calibration", dir.resolve("cal").toString(), "--operator", "tester");
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(Path.of("target", "lot-kill-child.txt").toFile()).start();
        long deadline = System.currentTimeMillis() + 60_000;
        int seen = 0;
        while (p.isAlive() && System.currentTimeMillis() < deadline && seen < 2) {
            Thread.sleep(10);
            Path lotRuns = dir.resolve("runs/LOT-1");
            if (Files.isDirectory(lotRuns)) {
                try (var files = Files.list(lotRuns)) {
                    seen = (int) files.filter(f -> f.getFileName().toString().matches("HC.*\\.json")).count();
                }
            }
        }
        p.destroyForcibly();
        p.waitFor(10, TimeUnit.SECONDS);
        try (ResultStore store = ResultStore.open(db)) {
            Set<String> before = new HashSet<>();
            store.parts("LOT-1").forEach(a -> before.add(a.serial()));
            assertThat(before).isNotEmpty();
            List<String> now = new ArrayList<>();
            LotRunner.Outcome o = LotRunner.run(setup(store, dir.resolve("runs")), new TrayFeeder(SimulatedPart.tray(tray().parts())),
                    r -> now.add(r.serial()));
            assertThat(now).doesNotContainAnyElementsOf(before);
            assertThat(o.counting()).extracting(Attempt::serial).doesNotHaveDuplicates().hasSize(8);
            assertThat(o.disposition().state()).isEqualTo(LotDisposition.State.REJECT);
            assertThat(RecordCheck.findings(store, dir.resolve("runs"), "LOT-1")).isEmpty();
        }
    }

    @Test
    void sigtermAndCtrlCStopALotWithExitFiveAndAWordOnResuming(@TempDir Path dir) throws Exception {
        for (String signal : List.of("TERM", "INT")) {
            Path work = dir.resolve(signal);
            String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
            List<String> cmd = List.of(java, "-cp", System.getProperty("java.class.path"), "-Dlrbench.home=" + HOME,
                    "org.lrbench.cli.Main", "run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "LOT-1",
                    "--lot-size", "40", "--sim-lot", HOME.resolve("simulator/demo-lot.yaml").toString(),
                    "--data", work.resolve("data").toString(), "--runs", work.resolve("runs").toString(),
                    "--calibration", work.resolve("cal").toString(), "--operator", "tester");
            Files.createDirectories(work);
            Path output = work.resolve("child.txt");
            Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(output.toFile()).start();
            long deadline = System.currentTimeMillis() + 60_000;
            // the signal goes once the first part is shown: the seven after it (about 2 s of a multisine lot
            // whose analysis keeps both cores busy) leave the signal time to arrive mid-lot
            while (p.isAlive() && System.currentTimeMillis() < deadline
                    && Files.readAllLines(output).stream().noneMatch(l -> l.startsWith("HC0417-0001"))) {
                Thread.sleep(10);
            }
            // TERM straight from this process (Process.destroy sends SIGTERM on Unix), with no process to start
            // between the part shown and the signal; INT through kill
            if (signal.equals("TERM")) {
                p.destroy();
            } else {
                new ProcessBuilder("kill", "-" + signal, String.valueOf(p.pid())).start().waitFor(10, TimeUnit.SECONDS);
            }
            assertThat(p.waitFor(60, TimeUnit.SECONDS)).isTrue();
            String text = Files.readString(output);
            // the documented exit code of a lot left open (README, exit codes), never 130 or 143
            assertThat(p.exitValue()).as(text).isEqualTo(5);
            assertThat(text).containsPattern("lot LOT-1 stopped after [0-9] of 8 parts; run the same command to resume");
            try (ResultStore store = ResultStore.open(work.resolve("data/lrbench.db"))) {
                int shown = (int) text.lines().filter(l -> l.startsWith("HC0417-")).count();
                // every verdict shown was stored, and nothing more
                assertThat(store.attempts("LOT-1")).hasSize(shown);
                assertThat(text).contains("stopped after " + shown + " of 8 parts");
                assertThat(store.lots().get(0).disposition()).isNull();
                assertThat(RecordCheck.findings(store, work.resolve("runs"), "LOT-1")).isEmpty();
            }
        }
    }
}
