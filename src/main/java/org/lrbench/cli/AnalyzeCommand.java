package org.lrbench.cli;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.Callable;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.measure.PointResult;
import org.lrbench.plan.Plan;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.PartRun;
import org.lrbench.traces.CsvTraces;
import org.lrbench.traces.TraceAnalysis;
import org.lrbench.measure.MultisineCapture;
import org.lrbench.traces.TraceArchive;
import org.lrbench.units.Dimension;
import org.lrbench.units.UnitException;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench analyze --csv FILE --sense-resistor R}: the metrology on traces from any scope. */
@Command(name = "analyze", mixinStandardHelpOptions = true, description = {"Extract R, X, L and Q from a two-channel trace file.",
        "Time, sense-resistor voltage and part voltage with a header, as any scope or simulator writes them."})
final class AnalyzeCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Option(names = "--csv", paramLabel = "FILE", description = "a trace file from any scope")
    Path csv;

    @Option(names = "--archive", paramLabel = "FILE.lrtraces",
            description = "a part's trace archive: re-run the extraction, show old against new, add an analysis record")
    Path archive;

    @Option(names = "--sense-resistor", paramLabel = "R", description = "the sense resistor, e.g. 100ohm (with --csv)")
    String sense;

    @Option(names = "--frequency", paramLabel = "F", description = "the drive frequency (default: estimated from the data)")
    String frequency;

    @Option(names = "--json", paramLabel = "OUT.json", description = "with --csv: also write the figures as JSON")
    Path json;

    @Option(names = "--plan", paramLabel = "PLAN", description = "with --archive: the plan the part was measured with"
            + " (default: the one its result names; its content must be the same)")
    Path planFile;

    @Override
    public Integer call() throws Exception {
        if ((csv == null) == (archive == null)) {
            throw new BadInputException("give --csv FILE --sense-resistor R, or --archive FILE.lrtraces");
        }
        if (archive != null) {
            return reanalyse();
        }
        if (sense == null) {
            throw new BadInputException("--csv needs --sense-resistor R");
        }
        double rs;
        Double f = null;
        try {
            rs = Units.parse(sense, Dimension.RESISTANCE);
            if (frequency != null) {
                f = Units.parse(frequency, Dimension.FREQUENCY);
            }
        } catch (UnitException e) {
            throw new BadInputException(e.getMessage());
        }
        Inputs.requireFile(csv, "trace file");
        CsvTraces t;
        try {
            t = CsvTraces.read(csv);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        ImpedancePoint z;
        try {
            z = TraceAnalysis.analyse(t, rs, f);
        } catch (RuntimeException e) {
            throw new BadInputException(csv + ": the traces cannot be analysed: " + e.getMessage());
        }
        System.out.printf(Locale.ROOT, "%s: %d samples at %s, frequency %s%n", csv, t.sense().length,
                Units.format(t.intervalSecond(), Dimension.TIME), Units.format(z.frequencyHz(), Dimension.FREQUENCY));
        // full precision: these numbers are compared with other instruments' and re-used
        System.out.printf(Locale.ROOT, "  frequency_hz %.17g%n  resistance_ohm %.17g%n  reactance_ohm %.17g%n"
                        + "  inductance_h %.17g%n  quality_factor %.17g%n  component_uncertainty_ohm %.17g%n",
                z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm(), z.inductanceHenry(), z.qualityFactor(),
                z.componentUncertaintyOhm());
        if (json != null) {
            Map<String, Object> out = new LinkedHashMap<>();
            out.put("schema", "lrbench.trace-analysis.v1");
            out.put("file", csv.toString());
            out.put("samples", t.sense().length);
            out.put("sample_interval_s", t.intervalSecond());
            out.put("sense_resistor_ohm", rs);
            out.put("frequency_hz", z.frequencyHz());
            out.put("resistance_ohm", z.resistanceOhm());
            out.put("reactance_ohm", z.reactanceOhm());
            out.put("inductance_h", z.inductanceHenry());
            out.put("quality_factor", z.qualityFactor());
            out.put("component_uncertainty_ohm", z.componentUncertaintyOhm());
            ResultFiles.writeJson(json, out);
            System.out.println("written: " + json);
        }
        return ExitCodes.PASS;
    }

    /**
     * Re-fits the model and re-judges the limits with the plan the part was measured with (its
     * content checked against the stored hash), the bench and its corrections; prints the stored
     * verdict beside the new one and each limit's stored and new value.
     */
    private Map<String, Object> rejudge(Path original, List<PointResult> points)
            throws Exception {
        Map<String, Object> out = new LinkedHashMap<>();
        if (!Files.isRegularFile(original)) {
            System.out.println("no stored result " + original + ": the limits are not judged again");
            return out;
        }
        var stored = ResultFiles.JSON.readTree(original.toFile());
        Path planPath = planFile != null ? planFile : Path.of(stored.get("plan_path").asText());
        Inputs.requireFile(planPath, "plan (give it with --plan)");
        if (!Inputs.sha256(planPath).equals(stored.get("plan_sha256").asText())) {
            throw new BadInputException(planPath + " is not the plan the part was measured with (its content differs"
                    + " from the stored SHA-256); give the original with --plan");
        }
        BenchConfig b = benchOptions.load();
        Plan plan = Inputs.plan(planPath, b);
        var calibration = new CalibrationStore(calibrationOption.calibration, b.name()).load();
        String thenMatch = stored.path("corrections").path("channel_match_measured_at").asText(null);
        String nowMatch = calibration.channels() == null ? null : calibration.channels().measuredAt();
        if (!Objects.equals(thenMatch, nowMatch)) {
            System.out.println("note: the channel match in force now (" + nowMatch + ") is not the one of the"
                    + " measurement (" + thenMatch + ")");
        }
        var r = PartRun.reassess(plan, b, calibration, points);
        String before = stored.get("verdict").asText();
        String now = r.verdict().word();
        System.out.printf("verdict: stored %s, re-judged %s%s%n", before, now, before.equals(now) ? " (it stands)" : " (CHANGED)");
        Map<String, Double> storedValues = new HashMap<>();
        for (var l : stored.path("limits")) {
            storedValues.put(l.get("name").asText(), l.get("value").isNumber() ? l.get("value").asDouble() : null);
        }
        List<Map<String, Object>> limits = new ArrayList<>();
        for (var l : r.limits()) {
            System.out.printf(Locale.ROOT, "  %-28s stored %-14s now %-14s %s%n", l.limit().name(),
                    storedValues.get(l.limit().name()) == null ? "-" : String.format(Locale.ROOT, "%.6g", storedValues.get(l.limit().name())),
                    String.format(Locale.ROOT, "%.6g", l.value()), l.pass() ? "pass" : "fail");
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("name", l.limit().name());
            m.put("value", l.value());
            m.put("expanded_uncertainty", l.expandedUncertainty());
            m.put("pass", l.pass());
            m.put("stored_value", storedValues.get(l.limit().name()));
            limits.add(m);
        }
        if (r.error() != null) {
            System.out.println("  error: " + r.error());
        }
        out.put("stored_verdict", before);
        out.put("verdict", now);
        out.put("error", r.error());
        out.put("limits", limits);
        out.put("warnings", r.warnings());
        return out;
    }

    /** Re-runs the phasor extraction on archived traces; the original result is never touched. */
    private int reanalyse() throws Exception {
        Inputs.requireFile(archive, "trace archive");
        TraceArchive.Contents c;
        try {
            c = TraceArchive.read(archive);
        } catch (IOException e) {
            throw new BadInputException(e.getMessage());
        }
        double rs = c.header().get("sense_resistor_ohm").asDouble();
        // the fixture's wiring the traces were captured with (older archives: differential, unity probes)
        JsonNode wiring = c.header().get("wiring");
        double a1 = wiring == null ? 1 : wiring.get("attenuation_1").asDouble(1);
        double a2 = wiring == null ? 1 : wiring.get("attenuation_2").asDouble(1);
        boolean lowSide = wiring != null && wiring.get("low_side").asBoolean(false);
        String name = archive.getFileName().toString().replace(".lrtraces", "");
        Path original = archive.resolveSibling(name + ".json");
        JsonNode old = Files.isRegularFile(original)
                ? ResultFiles.JSON.readTree(original.toFile()).get("points") : null;
        List<Map<String, Object>> rows = new ArrayList<>();
        List<PointResult> points = new ArrayList<>();
        System.out.printf("re-analysis of %s (lot %s, serial %s), sense resistor %s%n", archive,
                c.header().get("lot").asText(), c.header().get("serial").asText(), Units.format(rs, Dimension.RESISTANCE));
        System.out.printf("  %12s %14s %14s %14s %14s%n", "frequency", "R before", "R now", "L before", "L now");
        // a multisine archive: every point is a tone of one capture, fitted together as in the sweep
        FixturePhasors.Result[] tones = c.header().path("excitation").asText("stepped").equals("multisine")
                ? MultisineCapture.refit(c.points().get(0).sense(), c.points().get(0).part(), c.points().get(0).intervalSecond(),
                        c.points().stream().mapToDouble(TraceArchive.Point::frequencyHz).toArray(), a1, a2, lowSide)
                : null;
        for (int i = 0; i < c.points().size(); i++) {
            var p = c.points().get(i);
            // the same extraction as the sweep: both channels fitted and corrected for quantization
            var phasors = tones != null ? tones[i] : FixturePhasors.of(p.sense(), p.part(), p.intervalSecond(), p.frequencyHz(),
                    a1, a2, lowSide);
            ImpedancePoint z = PhasorImpedance.of(p.frequencyHz(), phasors.sense(), phasors.part(), rs);
            Double oldR = old != null && old.size() > i ? old.get(i).get("resistance_ohm").asDouble() : null;
            Double oldL = old != null && old.size() > i ? old.get(i).get("inductance_h").asDouble() : null;
            System.out.printf(Locale.ROOT, "  %12s %14s %14s %14s %14s%n", Units.format(p.frequencyHz(), Dimension.FREQUENCY),
                    oldR == null ? "-" : Units.format(oldR, Dimension.RESISTANCE), Units.format(z.resistanceOhm(), Dimension.RESISTANCE),
                    oldL == null ? "-" : Units.format(oldL, Dimension.INDUCTANCE), Units.format(z.inductanceHenry(), Dimension.INDUCTANCE));
            Map<String, Object> row = new LinkedHashMap<>();
            row.put("frequency_hz", p.frequencyHz());
            row.put("resistance_ohm", z.resistanceOhm());
            row.put("reactance_ohm", z.reactanceOhm());
            row.put("inductance_h", z.inductanceHenry());
            row.put("previous_resistance_ohm", oldR);
            row.put("previous_inductance_h", oldL);
            rows.add(row);
            points.add(new PointResult(z, phasors.sense(), phasors.part(), p.senseRange(),
                    p.partRange(), p.intervalSecond(), p.sense().length, 1, 0.0, null, null, phasors.senseCorrection(),
                    phasors.partCorrection()));
        }
        Map<String, Object> judged = rejudge(original, points);
        String stamp = Instant.now().truncatedTo(ChronoUnit.SECONDS).toString().replace(":", "");
        Path record = archive.resolveSibling(name + ".analysis-" + stamp + ".json");
        for (int k = 2; Files.exists(record); k++) {
            record = archive.resolveSibling(name + ".analysis-" + stamp + "-" + k + ".json");
        }
        Map<String, Object> analysis = new LinkedHashMap<>();
        analysis.put("schema", "lrbench.reanalysis.v1");
        analysis.put("program_version", Home.version());
        analysis.put("archive", archive.toString());
        analysis.put("analysed_at", Instant.now().toString());
        analysis.put("method", "three-parameter sine fits, Z = Rs V2 / V1 per point (before bench corrections)");
        analysis.put("points", rows);
        analysis.putAll(judged);
        ResultFiles.writeNew(record, ResultFiles.JSON.writeValueAsBytes(analysis));
        System.out.println("analysis record added: " + record + " (the original result is unchanged)");
        return ExitCodes.PASS;
    }
}
