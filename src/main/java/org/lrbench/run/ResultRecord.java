package org.lrbench.run;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.LumpedFit;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.calibration.Calibration;
import org.lrbench.judge.LimitResult;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.PointResult;
import org.lrbench.results.PartResult;
import org.lrbench.uncertainty.Budget;
import org.lrbench.uncertainty.Contribution;

/** Turns a part's measurement and analysis into its {@link PartResult} record. */
final class ResultRecord {

    private ResultRecord() {
    }

    static PartResult of(PartRun.Request request, Instant started, Instant finished, Verdict verdict, String error,
                         PartRun.Analysis analysis, List<PointResult> points, Map<String, String> identities,
                         PartResult.DcResistanceRecord dc) {
        boolean have = analysis != null && error == null;
        List<PartResult.LimitRecord> limits = new ArrayList<>();
        List<String> failed = new ArrayList<>();
        Map<String, PartResult.BudgetRecord> budgets = new LinkedHashMap<>();
        Map<String, String> methods = new LinkedHashMap<>();
        PartResult.ModelRecord model = null;
        Budget l = null;
        Budget r = null;
        if (have) {
            for (LimitResult lr : analysis.judged()) {
                limits.add(limit(lr));
                if (!lr.pass()) {
                    failed.add(lr.reason());
                }
            }
            analysis.sweep().budgets().forEach((name, b) -> {
                if (Double.isFinite(b.value()) && Double.isFinite(b.standardUncertainty())) {
                    budgets.put(name, budget(b));
                }
            });
            l = analysis.sweep().budgets().get(Readings.INDUCTANCE);
            r = analysis.sweep().budgets().get(Readings.RESISTANCE);
            model = model(analysis.sweep().fit(), analysis.sweep().reported());
            for (String key : List.of("inductance_h", "series_resistance_ohm", "self_resonance_hz")) {
                methods.put(key, PartRun.METHOD);
            }
            for (LimitResult lr : analysis.judged()) {
                methods.put("limit: " + lr.limit().name(), PartRun.METHOD);
            }
            if (analysis.triangle() != null) {
                methods.put("triangle", "triangle-wave time-domain regression v = R i + L di/dt (cross-check only)");
            }
        }
        List<PartResult.PointRecord> pointRecords = new ArrayList<>();
        // the corrected points are the ones the model was fitted to, corrected once (PartRun.fitSweep);
        // without a fit there are none
        List<ImpedancePoint> corrected = have ? analysis.corrected() : null;
        for (int i = 0; i < points.size(); i++) {
            PointResult p = points.get(i);
            ImpedancePoint z = p.impedance();
            ImpedancePoint c = corrected == null || !Double.isFinite(z.resistanceOhm()) ? null : corrected.get(i);
            pointRecords.add(new PartResult.PointRecord(z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm(),
                    z.inductanceHenry(), z.qualityFactor(), z.componentUncertaintyOhm(), z.currentAmpere().abs(),
                    p.currentThd(), p.senseRangeVolt(), p.partRangeVolt(), p.sampleIntervalSecond(), p.samples(),
                    p.acquisitions(), c == null ? null : finite(c.resistanceOhm()),
                    c == null ? null : finite(c.reactanceOhm())));
        }
        return new PartResult(PartResult.SCHEMA, request.programVersion(), request.lot(), request.serial(),
                request.plan().partNumber(), request.plan().source(), request.planSha256(), request.bench().name(),
                request.simulated(), started.truncatedTo(ChronoUnit.MILLIS).toString(),
                finished.truncatedTo(ChronoUnit.MILLIS).toString(), verdict, error, failed,
                have ? analysis.warnings() : List.of(),
                have ? l.value() : null, have ? l.standardUncertainty() : null, have ? l.expandedUncertainty() : null,
                have ? r.value() : null, have ? r.standardUncertainty() : null, have ? r.expandedUncertainty() : null,
                have ? analysis.srfHz() : null, have ? analysis.srfAboveHz() : null,
                methods, corrections(request.calibration()), model,
                have && analysis.triangle() != null ? triangle(analysis.triangle()) : null, dc,
                limits, pointRecords, budgets, identities, null);
    }

    private static PartResult.TriangleRecord triangle(TriangleExtraction.Result t) {
        return new PartResult.TriangleRecord(t.frequencyHz(), t.resistanceOhm(), t.resistanceUncertainty(),
                t.inductanceHenry(), t.inductanceUncertainty(), t.residualRmsVolt(), t.harmonics());
    }

    private static PartResult.CorrectionsRecord corrections(Calibration c) {
        var ch = c.channels();
        var fx = c.fixture();
        var sense = c.sense();
        String words = PartResult.CorrectionsRecord.words(ch != null, fx != null);
        if (sense != null) {
            words = (words.equals("none") ? "" : words + " and ") + "traced sense resistor";
        }
        return new PartResult.CorrectionsRecord(ch == null ? null : ch.measuredAt(), ch == null ? null : ch.gainRatio(),
                ch == null ? null : ch.skewSecond(), fx == null ? null : fx.measuredAt(),
                fx == null ? null : fx.points().size(), words, sense == null ? null : sense.measuredAt(),
                sense == null ? null : sense.valueOhm());
    }

    private static PartResult.LimitRecord limit(LimitResult r) {
        return new PartResult.LimitRecord(r.limit().name(), r.limit().characteristic().key(), r.limit().atFrequencyHz(),
                r.limit().spec(), r.limit().rule().key(), finite(r.value()), finite(r.uncertainty()),
                finite(r.expandedUncertainty()), finite(r.limit().lower()), finite(r.limit().upper()),
                finite(r.acceptanceLower()), finite(r.acceptanceUpper()), r.zone().name().toLowerCase(Locale.ROOT),
                r.pass(), finite(r.margin()), r.reason());
    }

    /** The model as recorded: its free parameters at their reported values (see SweepAnalysis.Result). */
    private static PartResult.ModelRecord model(LumpedFit.Result fit, double[] reported) {
        Map<String, PartResult.ParameterRecord> params = new LinkedHashMap<>();
        for (LumpedParameter p : fit.free()) {
            params.put(p.key(), new PartResult.ParameterRecord(p.in(reported), fit.uncertainty(p)));
        }
        boolean series = fit.free().stream().noneMatch(LumpedParameter::optional);
        String terms = String.join(", ", fit.free().stream().map(LumpedParameter::key).toList());
        return new PartResult.ModelRecord(series ? "series R-L" : "lumped model (" + terms + ")", params,
                fit.dropped(), finite(fit.reducedChiSquare()), fit.degreesOfFreedom());
    }

    private static PartResult.BudgetRecord budget(Budget b) {
        List<PartResult.ContributionRecord> lines = new ArrayList<>();
        for (Contribution c : b.contributions()) {
            lines.add(new PartResult.ContributionRecord(c.source(), c.type(), c.distribution().name().toLowerCase(
                    Locale.ROOT), finite(c.inputUncertainty()), c.inputUnit(), c.sensitivity(), c.contribution(),
                    c.share()));
        }
        return new PartResult.BudgetRecord(b.value(), b.standardUncertainty(), b.expandedUncertainty(), b.coverageFactor(),
                finite(b.effectiveDegreesOfFreedom()), lines);
    }

    static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }
}
