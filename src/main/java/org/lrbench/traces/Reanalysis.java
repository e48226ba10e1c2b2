package org.lrbench.traces;

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
import java.util.Map;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.measure.MultisineCapture;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanIdentity;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.PartRun;
import org.lrbench.yaml.ProblemsException;

/**
 * A part's archived traces analysed again: the same extraction as the sweep (both channels
 * fitted at each frequency, corrected for quantization; a multisine's tones fitted together), the
 * model re-fitted and the limits re-judged with the plan the part was measured with (its content
 * checked against the stored SHA-256) and the bench's corrections in force, and a new analysis
 * record beside the original, which is never touched.
 */
public final class Reanalysis {
    public static final String SCHEMA = "lrbench.reanalysis.v1";

    /**
     * One point worked out again, with the stored values it replaces (null where the original has
     * none) and the current's distortion (NaN where it is not worked out again: a multisine's tones).
     */
    public record Row(PointResult point, Double previousResistanceOhm, Double previousInductanceH) {

        public ImpedancePoint now() {
            return point.impedance();
        }

        public double currentThd() {
            return point.currentThd();
        }
    }

    /** The re-judged verdict and limits beside the stored ones, and the channel matches then and now. */
    public record Rejudged(String storedVerdict, PartRun.Reassessment now, Map<String, Double> storedValues,
                           String channelMatchThen, String channelMatchNow) {
    }

    /** What a re-analysis came to; {@code rejudged} is null without a stored result to judge against. */
    public record Outcome(JsonNode header, double senseOhm, List<Row> rows, Rejudged rejudged, Path record) {
    }

    /** A re-analysis that cannot be made as asked (the plan is not the one the part was measured with). */
    public static final class Refused extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Refused(String message) {
            super(message);
        }
    }

    private Reanalysis() {
    }

    /**
     * Re-analyses the archive and adds the analysis record.
     *
     * @param planFile the plan to judge with (null: the one the stored result names)
     */
    public static Outcome run(Path archive, Path planFile, BenchConfig bench, Calibration corrections,
                              String programVersion) throws IOException, ProblemsException {
        TraceArchive.Contents c = TraceArchive.read(archive);
        String name = archive.getFileName().toString().replace(".lrtraces", "");
        Path original = archive.resolveSibling(name + ".json");
        JsonNode stored = Files.isRegularFile(original) ? ResultFiles.JSON.readTree(original.toFile()) : null;
        double rs = c.header().get("sense_resistor_ohm").asDouble();
        List<Row> rows = extract(c, stored == null ? null : stored.get("points"));
        Rejudged rejudged = stored == null ? null : rejudge(stored, planFile, bench, corrections, rows);
        Path record = write(archive, name, programVersion, rows, rejudged);
        return new Outcome(c.header(), rs, rows, rejudged, record);
    }

    /** Every archived point through the sweep's own extraction, beside the stored values. */
    static List<Row> extract(TraceArchive.Contents c, JsonNode old) {
        double rs = c.header().get("sense_resistor_ohm").asDouble();
        // the fixture's wiring the traces were captured with (older archives: differential, unity probes)
        JsonNode wiring = c.header().get("wiring");
        double a1 = wiring == null ? 1 : wiring.get("attenuation_1").asDouble(1);
        double a2 = wiring == null ? 1 : wiring.get("attenuation_2").asDouble(1);
        boolean lowSide = wiring != null && wiring.get("low_side").asBoolean(false);
        boolean multisine = c.header().path("excitation").asText("stepped").equals("multisine");
        // a multisine archive: every point is a tone of one capture, fitted together as in the sweep
        FixturePhasors.Result[] tones = multisine
                ? MultisineCapture.refit(c.points().get(0).sense(), c.points().get(0).part(),
                        c.points().get(0).intervalSecond(),
                        c.points().stream().mapToDouble(TraceArchive.Point::frequencyHz).toArray(), a1, a2, lowSide)
                : null;
        // a multisine's distortion figures from the current's watched bins, as the sweep found them
        double[] toneThd = null;
        if (multisine) {
            double[] amplitudes = new double[tones.length];
            for (int i = 0; i < tones.length; i++) {
                amplitudes[i] = tones[i].sense().amplitude();
            }
            toneThd = MultisineCapture.currentThd(scaled(c.points().get(0).sense(), a1), c.points().get(0).intervalSecond(),
                    c.points().stream().mapToDouble(TraceArchive.Point::frequencyHz).toArray(), amplitudes);
        }
        List<Row> rows = new ArrayList<>();
        for (int i = 0; i < c.points().size(); i++) {
            TraceArchive.Point p = c.points().get(i);
            FixturePhasors.Result phasors = tones != null ? tones[i]
                    : FixturePhasors.of(p.sense(), p.part(), p.intervalSecond(), p.frequencyHz(), a1, a2, lowSide);
            ImpedancePoint z = PhasorImpedance.of(p.frequencyHz(), phasors.sense(), phasors.part(), rs);
            double thd = multisine ? toneThd[i] : SweepRunner.currentThd(scaled(p.sense(), a1), p.intervalSecond(),
                    p.frequencyHz());
            Double oldR = old != null && old.size() > i ? old.get(i).get("resistance_ohm").asDouble() : null;
            Double oldL = old != null && old.size() > i ? old.get(i).get("inductance_h").asDouble() : null;
            // as the sweep hands a point to the analysis; the traces themselves stay in the archive
            rows.add(new Row(new PointResult(z, phasors.sense(), phasors.part(), p.senseRange(), p.partRange(),
                    p.intervalSecond(), p.sense().length, 1, thd, null, null, phasors.senseCorrection(),
                    phasors.partCorrection()), oldR, oldL));
        }
        return rows;
    }

    private static Rejudged rejudge(JsonNode stored, Path planFile, BenchConfig bench, Calibration corrections,
                                    List<Row> rows) throws ProblemsException {
        Path planPath = planFile != null ? planFile : Path.of(stored.get("plan_path").asText());
        if (!Files.isRegularFile(planPath)) {
            throw new Refused("plan " + planPath + ": no such file (give it with --plan)");
        }
        if (!PlanIdentity.sha256(planPath).equals(stored.get("plan_sha256").asText())) {
            throw new Refused(planPath + " is not the plan the part was measured with (its content differs"
                    + " from the stored SHA-256); give the original with --plan");
        }
        Plan plan = PlanLoader.load(planPath, bench.maxAmplitudeVolt());
        Map<String, Double> storedValues = new HashMap<>();
        for (JsonNode l : stored.path("limits")) {
            storedValues.put(l.get("name").asText(), l.get("value").isNumber() ? l.get("value").asDouble() : null);
        }
        PartRun.Reassessment now = PartRun.reassess(plan, bench, corrections, rows.stream().map(Row::point).toList());
        return new Rejudged(stored.get("verdict").asText(), now, storedValues,
                stored.path("corrections").path("channel_match_measured_at").asText(null),
                corrections.channels() == null ? null : corrections.channels().measuredAt());
    }

    private static double[] scaled(double[] v, double factor) {
        double[] out = new double[v.length];
        for (int i = 0; i < v.length; i++) {
            out[i] = v[i] * factor;
        }
        return out;
    }

    /** The analysis record beside the archive, under a name never used before; the original is untouched. */
    private static Path write(Path archive, String name, String programVersion, List<Row> rows, Rejudged judged)
            throws IOException {
        String stamp = Instant.now().truncatedTo(ChronoUnit.SECONDS).toString().replace(":", "");
        Path record = archive.resolveSibling(name + ".analysis-" + stamp + ".json");
        for (int k = 2; Files.exists(record); k++) {
            record = archive.resolveSibling(name + ".analysis-" + stamp + "-" + k + ".json");
        }
        Map<String, Object> analysis = new LinkedHashMap<>();
        analysis.put("schema", SCHEMA);
        analysis.put("program_version", programVersion);
        analysis.put("archive", archive.toString());
        analysis.put("analysed_at", Instant.now().toString());
        analysis.put("method", "three-parameter sine fits, Z = Rs V2 / V1 per point (before bench corrections)");
        List<Map<String, Object>> points = new ArrayList<>();
        for (Row r : rows) {
            Map<String, Object> row = new LinkedHashMap<>();
            row.put("frequency_hz", r.now().frequencyHz());
            row.put("resistance_ohm", r.now().resistanceOhm());
            row.put("reactance_ohm", r.now().reactanceOhm());
            row.put("inductance_h", r.now().inductanceHenry());
            // null where not worked out again (a multisine's tones): never a number that was not computed
            row.put("current_thd", Double.isFinite(r.currentThd()) ? r.currentThd() : null);
            row.put("previous_resistance_ohm", r.previousResistanceOhm());
            row.put("previous_inductance_h", r.previousInductanceH());
            points.add(row);
        }
        analysis.put("points", points);
        if (judged != null) {
            analysis.put("stored_verdict", judged.storedVerdict());
            analysis.put("verdict", judged.now().verdict().word());
            analysis.put("error", judged.now().error());
            List<Map<String, Object>> limits = new ArrayList<>();
            for (var l : judged.now().limits()) {
                Map<String, Object> m = new LinkedHashMap<>();
                m.put("name", l.limit().name());
                m.put("value", l.value());
                m.put("expanded_uncertainty", l.expandedUncertainty());
                m.put("pass", l.pass());
                m.put("stored_value", judged.storedValues().get(l.limit().name()));
                limits.add(m);
            }
            analysis.put("limits", limits);
            analysis.put("warnings", judged.now().warnings());
        }
        ResultFiles.writeNew(record, ResultFiles.JSON.writeValueAsBytes(analysis));
        return record;
    }
}
