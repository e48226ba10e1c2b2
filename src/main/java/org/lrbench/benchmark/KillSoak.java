package org.lrbench.benchmark;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.lrbench.records.RecordCheck;
import org.lrbench.results.Attempt;
import org.lrbench.store.ResultStore;

/**
 * The kill soak: a lot run in a child process, killed with SIGKILL at random moments and resumed
 * each time, lot after lot, until the kills are spent; then every invariant of the records is
 * checked against an uninterrupted run of the same lot: each part stored exactly once, every
 * stored part with whole files, the verification clean, no temporary file left, and the verdicts
 * and the disposition equal to the uninterrupted run's (simulated noise is seeded per serial and
 * attempt, so a resumed part is measured exactly as it would have been).
 */
public final class KillSoak {

    private KillSoak() {
    }

    /** What a finished lot holds: verdict per serial and the disposition. */
    private record LotState(Map<String, String> verdicts, String disposition, int attempts) {
    }

    public static int run(PrintStream out, Path home, Path plan, Path tray, int kills, long seed) throws Exception {
        Path work = Files.createTempDirectory("lrbench-soak-");
        out.printf(Locale.ROOT, "kill soak in %s: %d SIGKILLs, seed %d%n", work, kills, seed);
        long t0 = System.nanoTime();
        Process ref = child(home, plan, tray, work, "REF");
        if (!ref.waitFor(5, TimeUnit.MINUTES)) {
            ref.destroyForcibly();
            throw new IOException("the uninterrupted reference run did not finish in 5 minutes");
        }
        double runSeconds = (System.nanoTime() - t0) / 1e9;
        LotState reference = state(work, "REF");
        out.printf(Locale.ROOT, "reference run (uninterrupted): %.1f s, disposition %s, verdicts %s%n", runSeconds,
                reference.disposition(), reference.verdicts().values());
        Random random = new Random(seed);
        int killed = 0;
        int starts = 0;
        int lots = 0;
        int repairs = 0;
        int midLot = 0;
        List<String> violations = new ArrayList<>();
        while (killed < kills) {
            String lot = "SOAK-" + (++lots);
            int killsThisLot = 0;
            while (true) {
                Process p = child(home, plan, tray, work, lot);
                starts++;
                // anywhere from JVM start to past the end of a whole run: start-up, sweeps, commits, renames
                long delay = (long) (random.nextDouble() * runSeconds * 1000);
                int before = storedAttempts(work, lot);
                boolean finished = p.waitFor(delay, TimeUnit.MILLISECONDS);
                if (!finished && killed < kills) {
                    p.destroyForcibly();
                    p.waitFor(30, TimeUnit.SECONDS);
                    killed++;
                    killsThisLot++;
                    if (storedAttempts(work, lot) > before) {
                        midLot++;
                    }
                    continue;
                }
                if (!p.waitFor(5, TimeUnit.MINUTES)) {
                    p.destroyForcibly();
                    violations.add(lot + ": a resumed run did not finish in 5 minutes");
                    break;
                }
                repairs += (int) Files.readAllLines(work.resolve(lot + ".out")).stream()
                        .filter(l -> l.startsWith("repaired:")).count();
                int code = p.exitValue();
                if (code != 0 && code != 1) {
                    violations.add(lot + ": the finishing run exited " + code + " (see " + work.resolve(lot + ".out") + ")");
                }
                break;
            }
            violations.addAll(check(work, lot, reference));
            out.printf(Locale.ROOT, "%s: killed %d times, then finished%n", lot, killsThisLot);
        }
        double total = (System.nanoTime() - t0) / 1e9;
        out.printf(Locale.ROOT, "%d SIGKILLs over %d lots (%d after the killed run had committed a part), %d child runs,"
                + " %d repairs on resume, %.0f s%n", killed, lots, midLot, starts, repairs, total);
        if (violations.isEmpty()) {
            out.println("every invariant held: each part stored once, every file whole, verification clean,"
                    + " no temporary file left, verdicts and disposition as the uninterrupted run's");
            return 0;
        }
        violations.forEach(v -> out.println("VIOLATION: " + v));
        return 1;
    }

    private static Process child(Path home, Path plan, Path tray, Path work, String lot) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = List.of(java, "-cp", System.getProperty("java.class.path"), "-Dlrbench.home=" + home,
                "org.lrbench.cli.Main", "run", plan.toString(), "--lot", lot, "--lot-size", "40", "--sim-lot",
                tray.toString(), "--data", work.resolve("data").toString(), "--runs", work.resolve("runs").toString(),
                "--calibration", work.resolve("cal").toString(), "--operator", "soak",
                // each lot its own supplier: every lot is rejected, and under one supplier's scheme the
                // switching rules would tighten the third (which needs the lab's Table II-B)
                "--supplier", "soak supplier " + lot);
        return new ProcessBuilder(cmd).redirectErrorStream(true)
                .redirectOutput(ProcessBuilder.Redirect.appendTo(work.resolve(lot + ".out").toFile())).start();
    }

    private static int storedAttempts(Path work, String lot) {
        if (!Files.exists(work.resolve("data/lrbench.db"))) {
            return 0;
        }
        try (ResultStore s = ResultStore.open(work.resolve("data/lrbench.db"))) {
            return s.attempts(lot).size();
        }
    }

    /** The lot as the store holds it; no inspection at all gives a null disposition (a violation). */
    private static LotState state(Path work, String lot) {
        try (ResultStore s = ResultStore.open(work.resolve("data/lrbench.db"))) {
            Map<String, String> verdicts = new LinkedHashMap<>();
            s.parts(lot).forEach(a -> verdicts.put(a.serial(), a.verdict().word()));
            String disposition = s.latestInspection(lot).map(i -> i.disposition() == null ? null : i.disposition().word()).orElse(null);
            return new LotState(verdicts, disposition, s.attempts(lot).size());
        }
    }

    private static List<String> check(Path work, String lot, LotState reference) throws IOException {
        List<String> v = new ArrayList<>();
        LotState got = state(work, lot);
        if (!got.verdicts().equals(reference.verdicts())) {
            v.add(lot + ": verdicts " + got.verdicts() + " differ from the uninterrupted run's " + reference.verdicts());
        }
        if (got.attempts() != got.verdicts().size()) {
            v.add(lot + ": " + got.attempts() + " attempts stored for " + got.verdicts().size() + " parts");
        }
        if (got.disposition() == null || !got.disposition().equals(reference.disposition())) {
            v.add(lot + ": disposition " + got.disposition() + ", uninterrupted " + reference.disposition());
        }
        try (ResultStore s = ResultStore.open(work.resolve("data/lrbench.db"))) {
            for (Attempt a : s.attempts(lot)) {
                if (a.number() != 1) {
                    v.add(lot + ": " + a.serial() + " stored as attempt " + a.number());
                }
            }
            RecordCheck.findings(s, work.resolve("runs"), lot).forEach(f -> v.add(lot + ": " + f));
        }
        Path folder = work.resolve("runs").resolve(lot);
        if (!Files.isDirectory(folder)) {
            v.add(lot + ": no result folder " + folder);
            return v;
        }
        try (Stream<Path> files = Files.list(folder)) {
            files.filter(f -> f.getFileName().toString().endsWith(".partial"))
                    .forEach(f -> v.add(lot + ": temporary file left: " + f));
        }
        return v;
    }
}
