package org.lrbench.records;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.lrbench.bench.CheckStandard;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.Canonical;
import org.lrbench.store.CheckFile;
import org.lrbench.store.ResultStore;
import org.lrbench.study.ControlChart;

/**
 * A bench's check-standard readings, one record each under {@code RUNS/check-standard/BENCH/},
 * named by the time they were taken and never replaced; overrides of the check before a lot run go
 * to {@code overrides/} beside them. {@link #gate} says whether a lot run may start.
 */
public final class CheckStandardLog {
    /** Record names by the time taken, to the millisecond, in UTC: they sort as they were taken. */
    private static final java.time.format.DateTimeFormatter NAME = java.time.format.DateTimeFormatter
            .ofPattern("yyyyMMdd'T'HHmmss.SSS'Z'").withZone(java.time.ZoneOffset.UTC);
    private final Path folder;

    public CheckStandardLog(Path runs, String bench) {
        this.folder = runs.resolve("check-standard").resolve(bench);
    }

    public Path folder() {
        return folder;
    }

    /** One reading as recorded. */
    public record Entry(Instant at, double value, double expandedUncertainty, String verdict, boolean inControl,
                        String reason) {
    }

    /** Records a reading with the chart's verdict on it; returns the record's path. */
    public Path append(Instant at, String serial, String plan, double value, double expanded, String partVerdict,
                       ControlChart.State state) throws IOException {
        ObjectNode o = ResultFiles.JSON.createObjectNode();
        o.put("taken_at", at.toString());
        o.put("serial", serial);
        o.put("plan", plan);
        o.put("inductance_h", value);
        o.put("expanded_uncertainty_h", expanded);
        o.put("part_verdict", partVerdict);
        o.put("in_control", state.inControl());
        o.put("reason", state.reason());
        o.put("centre_h", state.centre());
        o.put("lower_h", state.lower());
        o.put("upper_h", state.upper());
        Path file = folder.resolve(NAME.format(at) + ".json");
        Files.createDirectories(folder);
        ResultFiles.writeNew(file, ResultFiles.JSON.writeValueAsBytes(o));
        return file;
    }

    /** Every reading in the order taken. */
    public List<Entry> entries() throws IOException {
        List<Entry> out = new ArrayList<>();
        if (!Files.isDirectory(folder)) {
            return out;
        }
        List<Path> files;
        try (Stream<Path> s = Files.list(folder)) {
            files = s.filter(p -> p.getFileName().toString().endsWith(".json")).sorted().toList();
        }
        for (Path f : files) {
            JsonNode n = ResultFiles.JSON.readTree(f.toFile());
            out.add(new Entry(Instant.parse(n.get("taken_at").asText()), n.get("inductance_h").asDouble(),
                    n.get("expanded_uncertainty_h").asDouble(), n.get("part_verdict").asText(), n.get("in_control").asBoolean(),
                    n.get("reason").asText()));
        }
        out.sort(java.util.Comparator.comparing(Entry::at));
        return out;
    }

    /** The readings as the chart takes them. */
    public static List<ControlChart.Reading> readings(List<Entry> entries) {
        return entries.stream().map(e -> new ControlChart.Reading(e.value(), e.expandedUncertainty())).toList();
    }

    /**
     * Why a lot run may not start now (null: it may): no check yet, the last one out of control or
     * older than the interval, or the bench's corrections older than their due interval.
     *
     * @param correctionsAt when the corrections in force were measured (null: none)
     */
    public String gate(CheckStandard standard, Instant now, Instant correctionsAt) throws IOException {
        List<Entry> e = entries();
        if (e.isEmpty()) {
            return "the check standard " + standard.serial() + " has not been measured on this bench: run lrbench standard";
        }
        Entry last = e.get(e.size() - 1);
        if (!last.inControl()) {
            return "the last check of " + standard.serial() + " (" + last.at() + ") was out of control: " + last.reason();
        }
        Duration age = Duration.between(last.at(), now);
        if (age.getSeconds() > standard.intervalSecond()) {
            return "the last check of " + standard.serial() + " was " + hours(age.getSeconds()) + " ago; it is due every "
                    + hours((long) standard.intervalSecond());
        }
        if (correctionsAt == null) {
            return "the bench has no corrections in force: run lrbench calibrate";
        }
        long corrections = Duration.between(correctionsAt, now).getSeconds();
        if (corrections > standard.calibrationDueSecond()) {
            return "the bench's corrections were measured " + hours(corrections) + " ago; they are due every "
                    + hours((long) standard.calibrationDueSecond());
        }
        return null;
    }

    /**
     * The gate for a bench: null when it has no check standard or a lot run may start, else why not.
     *
     * @param corrections the corrections in force (null: none)
     */
    public static String gate(org.lrbench.bench.BenchConfig bench, Path runs, org.lrbench.calibration.Calibration corrections,
                              Instant now) throws IOException {
        if (bench.checkStandard() == null) {
            return null;
        }
        Instant at = corrections == null || corrections.channels() == null ? null
                : Instant.parse(corrections.channels().measuredAt());
        return new CheckStandardLog(runs, bench.name()).gate(bench.checkStandard(), now, at);
    }

    /** Records that a lot run started although the gate said no, with who and why. */
    public Path override(Instant at, String lot, String operator, String reason, String refusal) throws IOException {
        ObjectNode o = ResultFiles.JSON.createObjectNode();
        o.put("at", at.toString());
        o.put("lot", lot);
        o.put("operator", operator);
        o.put("reason", reason);
        o.put("overridden", refusal);
        Path dir = folder.resolve("overrides");
        Files.createDirectories(dir);
        Path file = dir.resolve(NAME.format(at) + "-" + lot + ".json");
        ResultFiles.writeNew(file, ResultFiles.JSON.writeValueAsBytes(o));
        return file;
    }

    /**
     * Keeps {@code file}, just written under {@code runs} by this log, as the next link of the store's chain
     * of check files; when the store refuses, the file is removed again (no reading or override stands
     * that the store does not hold) and the store's error thrown.
     */
    public static void keep(ResultStore store, Path runs, String bench, String kind, Path file) throws IOException {
        byte[] bytes = Files.readAllBytes(file);
        try {
            store.recordCheckFile(new CheckFile(bench, kind, relative(runs, file), bytes.length, Canonical.sha256(bytes),
                    Instant.now().toString()));
        } catch (RuntimeException e) {
            Files.deleteIfExists(file);
            throw e;
        }
    }

    /** A file's path under the runs folder as the store keeps it ('/' between names). */
    public static String relative(Path runs, Path file) {
        return runs.toAbsolutePath().normalize().relativize(file.toAbsolutePath().normalize()).toString()
                .replace(java.io.File.separatorChar, '/');
    }

    /**
     * Why the last reading cannot be trusted to open the gate (null: it can): its file is not the one the
     * store recorded (added or altered behind lrbench's back). Readings taken before the store kept them
     * count as recorded when the store holds none of this bench's.
     */
    public String unrecordedLast(ResultStore store, Path runs, String bench) throws IOException {
        if (!Files.isDirectory(folder)) {
            return null;
        }
        List<Path> files;
        try (Stream<Path> s = Files.list(folder)) {
            files = s.filter(p -> p.getFileName().toString().endsWith(".json")).sorted().toList();
        }
        if (files.isEmpty()) {
            return null;
        }
        List<CheckFile> kept = store.checkFiles().stream()
                .filter(f -> f.bench().equals(bench) && f.kind().equals(CheckFile.READING)).toList();
        if (kept.isEmpty()) {
            return null;
        }
        Path last = files.get(files.size() - 1);
        String name = relative(runs, last);
        String sha = Canonical.sha256(Files.readAllBytes(last));
        for (CheckFile f : kept) {
            if (f.file().equals(name)) {
                return f.sha256().equals(sha) ? null : "the last check-standard reading " + last
                        + " is not the one the store recorded (altered): run lrbench verify, then lrbench standard";
            }
        }
        return "the last check-standard reading " + last + " is not one the store recorded (added behind lrbench's back?):"
                + " run lrbench verify, then lrbench standard";
    }

    private static String hours(long seconds) {
        return seconds >= 86400 ? String.format(java.util.Locale.ROOT, "%.1f d", seconds / 86400.0)
                : String.format(java.util.Locale.ROOT, "%.1f h", seconds / 3600.0);
    }
}
