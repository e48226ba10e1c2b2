package org.lrbench.run;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.SeriesModel;
import org.lrbench.analysis.SeriesModelFit;
import org.lrbench.bench.BenchConfig;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.judge.Judge;
import org.lrbench.judge.LimitResult;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.MeasurementException;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;

/**
 * Measures one part: checks the plan against the bench's amplitude ceiling, runs the sweep with the
 * output guarded, fits the series model, judges the limits and builds the result. Any fault on the
 * way makes the verdict {@code error}, with the reason; it never yields a pass.
 */
public final class PartRun {

    /** What identifies the measurement in its record. */
    public record Request(Plan plan, String planSha256, BenchConfig bench, String lot, String serial,
                          boolean simulated, String programVersion) {
    }

    private PartRun() {
    }

    public static PartResult measure(Request request, BenchInstruments instruments, Sleeper sleeper,
                                     SweepListener listener) {
        Plan plan = request.plan();
        double peak = plan.sweep().amplitudeVolt() + Math.abs(plan.sweep().offsetVolt());
        if (peak > request.bench().maxAmplitudeVolt()) {
            throw new IllegalArgumentException("plan amplitude " + peak + " V exceeds the bench's maximum "
                    + request.bench().maxAmplitudeVolt() + " V");
        }
        Instant started = Instant.now();
        Map<String, String> identities = new LinkedHashMap<>();
        List<PointResult> points = List.of();
        SeriesModel model = null;
        List<LimitResult> judged = List.of();
        String error = null;
        OutputGuard guard = new OutputGuard(instruments.generator());
        try {
            identities.put("generator", instruments.generator().identity().toString());
            identities.put("digitizer", instruments.digitizer().identity().toString());
            points = new SweepRunner(instruments.generator(), instruments.digitizer(), sleeper).run(plan, listener);
            model = SeriesModelFit.fit(points.stream().map(PointResult::impedance).toList());
            judged = Judge.judge(plan.limits(), model);
        } catch (InstrumentException | MeasurementException | IllegalArgumentException e) {
            error = e.getMessage();
        } finally {
            guard.close();
        }
        String outputFailure = guard.failure();
        if (outputFailure != null) {
            error = error == null ? outputFailure : error + "; " + outputFailure;
        }
        Verdict verdict = error != null ? Verdict.ERROR : Judge.verdict(judged);
        return record(request, started, verdict, error, model, judged, points, identities);
    }

    private static PartResult record(Request request, Instant started, Verdict verdict, String error,
                                     SeriesModel model, List<LimitResult> judged, List<PointResult> points,
                                     Map<String, String> identities) {
        List<PartResult.LimitRecord> limits = new ArrayList<>();
        List<String> failed = new ArrayList<>();
        if (error == null) {
            for (LimitResult r : judged) {
                limits.add(new PartResult.LimitRecord(r.limit().name(), r.limit().characteristic().key(),
                        r.limit().atFrequencyHz(), r.limit().spec(), r.value(), r.uncertainty(),
                        finite(r.limit().lower()), finite(r.limit().upper()), r.pass(), r.margin(), r.reason()));
                if (!r.pass()) {
                    failed.add(r.reason());
                }
            }
        }
        List<PartResult.PointRecord> pointRecords = new ArrayList<>();
        for (PointResult p : points) {
            ImpedancePoint z = p.impedance();
            pointRecords.add(new PartResult.PointRecord(z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm(),
                    z.inductanceHenry(), z.qualityFactor(), z.componentUncertaintyOhm(), z.currentAmpere().abs(),
                    p.senseRangeVolt(), p.partRangeVolt(), p.sampleIntervalSecond(), p.samples(), p.acquisitions()));
        }
        boolean haveModel = model != null && error == null;
        return new PartResult(PartResult.SCHEMA, request.programVersion(), request.lot(), request.serial(),
                request.plan().partNumber(), request.plan().source(), request.planSha256(), request.bench().name(),
                request.simulated(), started.truncatedTo(ChronoUnit.MILLIS).toString(),
                Instant.now().truncatedTo(ChronoUnit.MILLIS).toString(), verdict.word(), error, failed,
                haveModel ? model.inductanceHenry() : null, haveModel ? model.inductanceUncertaintyHenry() : null,
                haveModel ? model.resistanceOhm() : null, haveModel ? model.resistanceUncertaintyOhm() : null,
                "series R-L", haveModel && Double.isFinite(model.reducedChiSquare()) ? model.reducedChiSquare() : null,
                limits, pointRecords, identities);
    }

    private static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }
}
