package org.lrbench.records;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.lrbench.results.Attempt;
import org.lrbench.store.Canonical;
import org.lrbench.store.ResultStore;
import org.lrbench.store.SingleRecord;

/**
 * Re-reads a lot's records and names everything that is not as it was written: store rows altered,
 * removed or added outside lrbench (through the lot's hash chain), result files altered or
 * missing (each must hold exactly the JSON the store holds), trace archives truncated, altered or
 * missing (size and SHA-256 as the store recorded them).
 */
public final class RecordCheck {

    private RecordCheck() {
    }

    /** Every finding for one lot; empty when the lot's records are whole. */
    public static List<String> findings(ResultStore store, Path runs, String lot) {
        List<String> out = new ArrayList<>(store.chainFindings(lot));
        Path dir = runs.resolve(lot);
        Map<String, String> traceHashes = store.tracesHashes(lot);
        for (Attempt a : store.attempts(lot)) {
            if (a.jsonFile() != null) {
                checkJson(out, dir.resolve(a.jsonFile()), a);
            }
            if (a.tracesFile() != null) {
                checkTraces(out, dir.resolve(a.tracesFile()), a, traceHashes.get(a.serial() + "~" + a.number()));
            }
        }
        return out;
    }

    /**
     * The records of parts measured outside a lot's sample: the store's chain of them (whole store only:
     * {@code lot} null), and each record's result file and trace archive against the size and SHA-256 the
     * store keeps (of one lot, or of all).
     */
    public static List<String> singlePartFindings(ResultStore store, Path runs, String lot) {
        return singlePartFindings(store, runs, lot, null);
    }

    /**
     * As above, the files checked only of records made on {@code benches} (null: all) or whose lot's folder
     * is in {@code runs}: where each bench keeps its own runs folder.
     */
    public static List<String> singlePartFindings(ResultStore store, Path runs, String lot, java.util.Set<String> benches) {
        List<String> out = new ArrayList<>();
        if (lot == null) {
            out.addAll(store.singlePartFindings());
        }
        for (SingleRecord r : store.singleParts()) {
            if (lot != null && !lot.equals(r.lot())) {
                continue;
            }
            if (benches != null && !benches.contains(r.bench()) && !Files.isDirectory(runs.resolve(r.lot()))) {
                continue;
            }
            String what = "attempt " + r.attempt() + " of " + r.serial() + " (measured on its own)";
            checkFile(out, runs.resolve(r.lot()).resolve(r.resultFile()), r.resultBytes(), r.resultSha256(), what);
            if (r.tracesFile() != null) {
                checkFile(out, runs.resolve(r.lot()).resolve(r.tracesFile()), r.tracesBytes() == null ? -1 : r.tracesBytes(),
                        r.tracesSha256(), "trace archive of " + what);
            }
        }
        return out;
    }

    /**
     * The files of the benches' checks (check-standard readings, overrides of the gate) against the store's
     * chain of them: the chain whole, every recorded file present with its size and SHA-256, and every
     * reading or override file under {@code RUNS/check-standard/} one the store recorded. Only the benches
     * in {@code benches} (null: all) where each bench keeps its own runs folder; the chart page, rewritten
     * at each reading, is exempt.
     */
    public static List<String> checkFileFindings(ResultStore store, Path runs, java.util.Set<String> benches) {
        List<String> out = new ArrayList<>(store.checkFileFindings());
        java.util.Set<String> recorded = new java.util.HashSet<>();
        for (org.lrbench.store.CheckFile f : store.checkFiles()) {
            recorded.add(f.file());
            if (benches != null && !benches.contains(f.bench())) {
                continue;
            }
            checkFile(out, runs.resolve(f.file()), f.bytes(), f.sha256(), "the check-standard " + f.kind() + " of bench "
                    + f.bench());
        }
        Path root = runs.resolve("check-standard");
        if (!Files.isDirectory(root)) {
            return out;
        }
        try (var walk = Files.walk(root)) {
            for (Path f : walk.filter(Files::isRegularFile).sorted().toList()) {
                String name = f.getFileName().toString();
                Path rel = root.relativize(f);
                if (name.equals("chart.html") && rel.getNameCount() == 2 || name.startsWith(".") && name.endsWith(".partial")
                        || benches != null && !benches.contains(rel.getName(0).toString())) {
                    continue;
                }
                if (!recorded.contains(CheckStandardLog.relative(runs, f))) {
                    out.add(f + ": a check-standard file no record of the store names (added, or written before the"
                            + " store kept them: schema 9 or older)");
                }
            }
        } catch (IOException e) {
            out.add(root + ": cannot be listed: " + e.getMessage());
        }
        return out;
    }

    private static void checkFile(List<String> out, Path file, long bytes, String sha, String what) {
        try {
            if (!Files.exists(file)) {
                out.add(file + ": missing (" + what + " is stored)");
                return;
            }
            long size = Files.size(file);
            if (bytes >= 0 && size != bytes) {
                out.add(file + ": " + (size < bytes ? "truncated" : "has bytes added") + " (" + size
                        + " bytes; the store recorded " + bytes + " for " + what + ")");
            } else if (sha != null && !sha.equals(Canonical.sha256(Files.readAllBytes(file)))) {
                out.add(file + ": altered (its SHA-256 is not the one the store recorded for " + what + ")");
            }
        } catch (IOException e) {
            out.add(file + ": cannot be read: " + e.getMessage());
        }
    }

    /**
     * What the store cannot account for under the runs folder: a lot folder of no lot in the store (added,
     * or its lot removed from the store behind lrbench's back), and in a stored lot's folder every file no
     * record names ({@link #lotFolderFindings}). The check standard's folder is its own log's.
     */
    public static List<String> folderFindings(ResultStore store, Path runs) {
        List<String> out = new ArrayList<>();
        if (!Files.isDirectory(runs)) {
            return out;
        }
        java.util.Set<String> lots = new java.util.HashSet<>(store.lotNames());
        List<SingleRecord> singles = store.singleParts();
        singles.forEach(r -> lots.add(r.lot()));
        try (var dirs = Files.list(runs)) {
            for (Path d : dirs.sorted().toList()) {
                String name = d.getFileName().toString();
                if (name.equals("check-standard") || name.startsWith(".")) {
                    continue;
                }
                if (!Files.isDirectory(d)) {
                    out.add(d + ": a file among the lot folders that no record names (added?)");
                } else if (!lots.contains(name)) {
                    out.add(d + "/: a lot folder the store has no lot for (added, or its lot removed from the store)");
                } else {
                    out.addAll(lotFolderFindings(store, runs, name, singles));
                }
            }
        } catch (IOException e) {
            out.add(runs + ": cannot be listed: " + e.getMessage());
        }
        return out;
    }

    /**
     * A stored lot's folder against its records: every file must be one a record names (an attempt's
     * result file or trace archive), the lot's summary and report, a re-analysis record of a stored part,
     * or a temporary file of a write in progress; the summary's disposition and chain head must be the
     * store's.
     */
    public static List<String> lotFolderFindings(ResultStore store, Path runs, String lot) {
        return lotFolderFindings(store, runs, lot, store.singleParts());
    }

    /** As above, with the single parts' records read once for every folder. */
    private static List<String> lotFolderFindings(ResultStore store, Path runs, String lot, List<SingleRecord> singles) {
        List<String> out = new ArrayList<>();
        Path dir = runs.resolve(lot);
        if (!Files.isDirectory(dir)) {
            return out;
        }
        java.util.Set<String> named = new java.util.HashSet<>(List.of("lot-summary.json", "report.html"));
        java.util.Set<String> serials = new java.util.HashSet<>();
        for (Attempt a : store.attempts(lot)) {
            if (a.jsonFile() != null) {
                named.add(a.jsonFile());
            }
            if (a.tracesFile() != null) {
                named.add(a.tracesFile());
            }
            serials.add(a.serial());
        }
        for (SingleRecord r : singles) {
            if (r.lot().equals(lot)) {
                named.add(r.resultFile());
                if (r.tracesFile() != null) {
                    named.add(r.tracesFile());
                }
                serials.add(r.serial());
            }
        }
        try (var files = Files.list(dir)) {
            for (Path f : files.sorted().toList()) {
                String name = f.getFileName().toString();
                if (named.contains(name) || name.startsWith(".") && name.endsWith(".partial")) {
                    continue;
                }
                int analysis = name.indexOf(".analysis-");
                if (analysis > 0 && name.endsWith(".json") && serials.contains(name.substring(0, analysis))) {
                    continue; // a re-analysis record of a stored part: a new record beside the original
                }
                out.add(f + ": a file no record of lot " + lot + " names (added?)");
            }
        } catch (IOException e) {
            out.add(dir + ": cannot be listed: " + e.getMessage());
        }
        Path summary = dir.resolve("lot-summary.json");
        var latest = store.latestInspection(lot);
        if (Files.isRegularFile(summary) && latest.isPresent() && latest.get().disposition() != null) {
            try {
                var json = new com.fasterxml.jackson.databind.ObjectMapper().readTree(summary.toFile());
                String said = json.path("disposition").asText(null);
                String stored = latest.get().disposition().word();
                if (!stored.equals(said)) {
                    out.add(summary + ": says disposition " + said + ", the store's is " + stored + " (altered)");
                }
                String head = json.path("chain_head_sha256").asText(null);
                String now = store.chainHead(lot);
                if (head != null && now != null && !head.equals(now)) {
                    out.add(summary + ": its chain head " + head.substring(0, Math.min(12, head.length()))
                            + "... is not the store's " + now.substring(0, Math.min(12, now.length()))
                            + "... (the summary or the chain was altered, or records were added after it)");
                }
            } catch (IOException e) {
                out.add(summary + ": not readable JSON (" + e.getMessage().lines().findFirst().orElse("") + ")");
            }
        }
        return out;
    }

    private static void checkJson(List<String> out, Path file, Attempt a) {
        byte[] want = a.resultJson().getBytes(StandardCharsets.UTF_8);
        try {
            if (!Files.exists(file)) {
                out.add(file + ": missing (attempt " + a.number() + " of " + a.serial() + " is stored)");
                return;
            }
            byte[] have = Files.readAllBytes(file);
            if (!Arrays.equals(have, want)) {
                out.add(file + ": altered" + (have.length < want.length ? " or truncated" : "") + " (" + have.length
                        + " bytes; the store's record of attempt " + a.number() + " has " + want.length
                        + " bytes and differs)");
            }
        } catch (IOException e) {
            out.add(file + ": cannot be read: " + e.getMessage());
        }
    }

    private static void checkTraces(List<String> out, Path file, Attempt a, String sha) {
        try {
            if (!Files.exists(file)) {
                out.add(file + ": missing (trace archive of attempt " + a.number() + " of " + a.serial() + ")");
                return;
            }
            long size = Files.size(file);
            if (a.tracesBytes() != null && size != a.tracesBytes()) {
                out.add(file + ": " + (size < a.tracesBytes() ? "truncated" : "has bytes added") + " (" + size
                        + " bytes; the store recorded " + a.tracesBytes() + ")");
                return;
            }
            if (sha != null && !sha.equals(Canonical.sha256(Files.readAllBytes(file)))) {
                out.add(file + ": altered (its SHA-256 is not the one the store recorded)");
            }
        } catch (IOException e) {
            out.add(file + ": cannot be read: " + e.getMessage());
        }
    }
}
