package org.lrbench.run;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.Sleeper;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sim.SimLot;
import org.lrbench.store.PartRow;
import org.lrbench.store.ResultStore;

public class LotRunTests {
    static final Path HOME = TestBench.home();

    public static LotRunner.Setup setup(ResultStore store, Path runs) throws Exception {
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench.yaml"));
        Plan p = PlanLoader.load(HOME.resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        byte[] content = Files.readAllBytes(HOME.resolve("plans/qfd-ind-1m0.yaml"));
        String sha = java.util.HexFormat.of().formatHex(java.security.MessageDigest.getInstance("SHA-256").digest(content));
        PartRun.Request t = new PartRun.Request(p, sha, b, "LOT-1", "-", true, "test");
        return new LotRunner.Setup(t, 40, new DriverLoader(HOME.resolve("drivers")), store, runs, Sleeper.NONE);
    }

    /** A tray feeder that stops after so many parts, as an operator pressing q would. */
    static PartFeeder stoppingAfter(PartFeeder inner, int parts) {
        return new PartFeeder() {
            int given;

            @Override
            public Next next(int index, int of) {
                return given++ < parts ? inner.next(index, of) : Next.stop();
            }
        };
    }

    @Test
    void aStoppedLotResumesAfterItsLastCompletedPart(@TempDir Path dir) throws Exception {
        SimLot tray = SimLot.load(HOME.resolve("simulator/demo-lot.yaml"));
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.Outcome first = LotRunner.run(setup(store, dir), stoppingAfter(new TrayFeeder(tray.parts(), Set.of()), 3),
                    r -> { });
            assertThat(first.measuredNow()).hasSize(3);
            assertThat(first.disposition().state()).isEqualTo(LotDisposition.State.OPEN);
            List<String> measuredAgain = new ArrayList<>();
            LotRunner.Outcome second = LotRunner.run(setup(store, dir), new TrayFeeder(tray.parts(), store.completed("LOT-1")),
                    r -> measuredAgain.add(r.serial()));
            assertThat(measuredAgain).doesNotContain("HC0417-0001", "HC0417-0002", "HC0417-0003").hasSize(5);
            assertThat(second.stored()).extracting(PartRow::serial).doesNotHaveDuplicates().hasSize(8);
            assertThat(second.disposition().state()).isEqualTo(LotDisposition.State.REJECT);
            assertThat(store.lots().get(0).disposition()).isEqualTo("reject");
        }
    }

    @Test
    void aLotRunKilledHardLosesAtMostThePartInProgress(@TempDir Path dir) throws Exception {
        // a separate JVM runs the lot and is killed as soon as two parts are complete (their JSON files
        // are written after their store commits); the store is not touched while it runs
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Path db = dir.resolve("data/lrbench.db");
        List<String> cmd = List.of(java, "-cp", System.getProperty("java.class.path"), "-Dlrbench.home=" + HOME,
                "org.lrbench.cli.Main", "run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "LOT-1",
                "--lot-size", "40", "--sim-lot", HOME.resolve("simulator/demo-lot.yaml").toString(),
                "--data", dir.resolve("data").toString(), "--runs", dir.resolve("runs").toString(),
                "--calibration", dir.resolve("cal").toString());
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(Path.of("target", "lot-kill-child.txt").toFile()).start();
        long deadline = System.currentTimeMillis() + 60_000;
        int seen = 0;
        while (p.isAlive() && System.currentTimeMillis() < deadline && seen < 2) {
            Thread.sleep(10);
            Path lotRuns = dir.resolve("runs/LOT-1");
            if (Files.isDirectory(lotRuns)) {
                try (var files = Files.list(lotRuns)) {
                    seen = (int) files.filter(f -> f.toString().endsWith(".json")).count();
                }
            }
        }
        p.destroyForcibly();
        p.waitFor(10, TimeUnit.SECONDS);
        try (ResultStore store = ResultStore.open(db)) {
            Set<String> before = new HashSet<>(store.completed("LOT-1"));
            assertThat(before).isNotEmpty();
            SimLot tray = SimLot.load(HOME.resolve("simulator/demo-lot.yaml"));
            List<String> now = new ArrayList<>();
            LotRunner.Outcome o = LotRunner.run(setup(store, dir.resolve("runs")), new TrayFeeder(tray.parts(), before),
                    r -> now.add(r.serial()));
            assertThat(now).doesNotContainAnyElementsOf(before);
            assertThat(o.stored()).extracting(PartRow::serial).doesNotHaveDuplicates().hasSize(8);
            assertThat(o.disposition().state()).isEqualTo(LotDisposition.State.REJECT);
        }
    }
}
