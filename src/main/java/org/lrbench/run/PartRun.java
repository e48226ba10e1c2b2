package org.lrbench.run;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.CopperResistance;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.LumpedModel;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.analysis.SweepAnalysis;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.analysis.fit.FitException;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.SenseTrace;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.Judge;
import org.lrbench.judge.Limit;
import org.lrbench.judge.LimitResult;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.MeasurementException;
import org.lrbench.measure.MeasurementStopped;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.StopToken;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.uncertainty.Budget;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Measures one part: checks the plan against the bench's amplitude ceiling, runs the sweep with the
 * output guarded, fits the sweep model, works out each reported quantity's uncertainty budget,
 * judges the limits under their decision rules and builds the result. Any fault on the way makes
 * the verdict {@code error}, with the reason; it never yields a pass.
 */
public final class PartRun {
    static final String METHOD = "lumped-model sweep fit of sine-fit phasors";
    /**
     * A fit whose residuals are more than this many times the variance noise and the corrections
     * explain (a reduced chi-square above 4, the residual scatter twice the expected) warns that the
     * model misses something (common practice, no source: a chi-square that large at the few to tens
     * of degrees of freedom of a sweep is far beyond chance).
     */
    static final double RESIDUAL_WARNING = 4;
    /**
     * A point's phasor inductance and the model's differ by a warning only when they differ by more
     * than this fraction as well (0.01 %, below any purchase specification's resolution; common
     * practice, no source), so that a fit with tiny uncertainties does not warn on nothing.
     */
    static final double POINT_AGREEMENT_FLOOR = 1e-4;

    /** What identifies the measurement in its record. */
    public record Request(Plan plan, String planSha256, BenchConfig bench, String lot, String serial,
                          boolean simulated, String programVersion, Calibration calibration) {

        public Request(Plan plan, String planSha256, BenchConfig bench, String lot, String serial, boolean simulated,
                       String programVersion) {
            this(plan, planSha256, bench, lot, serial, simulated, programVersion, Calibration.NONE);
        }
    }

    private PartRun() {
    }

    public static PartResult measure(Request request, BenchInstruments instruments, BenchClock clock,
                                     SweepListener listener) {
        return measure(request, instruments, clock, listener, StopToken.NEVER).result();
    }

    /** A part's result with the sweep points it was made from (their traces are what an archive keeps). */
    public record Measured(PartResult result, List<PointResult> points) {
    }

    /**
     * Measures one part; {@code stop} is checked between sweep points, and a stop requested ends
     * the measurement with {@link MeasurementStopped} (the output off, nothing of it kept).
     */
    public static Measured measure(Request request, BenchInstruments instruments, BenchClock clock,
                                   SweepListener listener, StopToken stop) {
        Plan plan = request.plan();
        double peak = plan.sweep().peakEmfVolt();
        if (peak > request.bench().maxAmplitudeVolt()) {
            throw new IllegalArgumentException("plan amplitude " + peak + " V exceeds the bench's maximum "
                    + request.bench().maxAmplitudeVolt() + " V");
        }
        Instant started = Instant.now();
        Map<String, String> identities = new LinkedHashMap<>();
        List<PointResult> points = List.of();
        TriangleExtraction.Result triangle = null;
        String error = null;
        OutputGuard guard = new OutputGuard(instruments.generator());
        // the sweep's fit starts once its last point is in, while the triangle and the meter are measured
        FitAhead fitAhead = new FitAhead(plan, request.bench(), request.calibration());
        try {
            identities.put("generator", instruments.generator().identity().toString());
            identities.put("digitizer", instruments.digitizer().identity().toString());
            // a factor common to both channels cancels in every ratio: the level is measured first, low
            instruments.proveLevel(plan, request.bench(), clock);
            SweepRunner.Measurement m = new SweepRunner(instruments.generator(), instruments.digitizer(), clock,
                    instruments.rangeMemory())
                    .run(plan, listener, stop, fitAhead);
            points = m.points();
            triangle = m.triangle();
        } catch (InstrumentException | MeasurementException | IllegalArgumentException e) {
            error = e.getMessage();
        } finally {
            guard.close();
        }
        if (guard.failure() != null) {
            error = error == null ? guard.failure() : error + "; " + guard.failure();
        }
        // DC resistance with the multimeter: only once the generator output is off
        double dcOhm = Double.NaN;
        boolean noMeter = false;
        if (error == null && plan.dcResistance() != null) {
            if (instruments.multimeter() == null) {
                // the step is a cross-check of the sweep's R_dc, which the limits are judged on
                noMeter = true;
            } else {
                try {
                    identities.put("meter", instruments.multimeter().identity().toString());
                    // its preparation and the reading in one message
                    dcOhm = instruments.multimeter().preparedResistance(plan.dcResistance().fourWire());
                } catch (InstrumentException e) {
                    error = e.getMessage();
                }
            }
        }
        Analysis analysis = null;
        if (error == null) {
            try {
                analysis = judge(plan, fitAhead.fit(), triangle);
            } catch (FitException e) {
                error = "the sweep could not be fitted: " + e.getMessage();
            }
        }
        Verdict verdict = error != null ? Verdict.ERROR : Judge.verdict(analysis.judged);
        PartResult.DcResistanceRecord dc = null;
        if (noMeter && analysis != null) {
            analysis.warnings().add("the plan's dc_resistance step was not done: no multimeter reachable on this bench"
                    + " (bench key meter)");
        }
        if (error == null && plan.dcResistance() != null && !noMeter) {
            var step = plan.dcResistance();
            var r = analysis.sweep().budgets().get(Readings.RESISTANCE);
            // agreement: the sweep's expanded uncertainty with 0.1 % for the multimeter reading
            // (common practice, no source, for a bench DMM's resistance range)
            double combined = Math.hypot(r.expandedUncertainty(), 2 * 0.001 * dcOhm);
            boolean agrees = Math.abs(dcOhm - r.value()) <= combined;
            dc = new PartResult.DcResistanceRecord(step.fourWire() ? "four_wire" : "two_wire", dcOhm, step.temperatureC(),
                    step.referenceTemperatureC(), CopperResistance.toReference(dcOhm,
                    step.temperatureC(), step.referenceTemperatureC()), r.value(), agrees);
            if (!agrees) {
                analysis.warnings().add(String.format(Locale.ROOT, "the multimeter's %s resistance %s and the sweep's"
                        + " R_dc %s differ by more than their combined expanded uncertainty %s",
                        step.fourWire() ? "4-wire" : "2-wire", Units.format(dcOhm, Dimension.RESISTANCE),
                        Units.format(r.value(), Dimension.RESISTANCE), Units.format(combined, Dimension.RESISTANCE)));
            }
        }
        return new Measured(ResultRecord.of(request, started, Instant.now(), verdict, error, analysis, points, identities, dc),
                points);
    }

    /** A sweep judged again from archived points: the verdict, each limit's result, the warnings. */
    public record Reassessment(Verdict verdict, List<LimitResult> limits, List<String> warnings, String error) {
    }

    /**
     * Re-fits the model, recomputes the budgets and re-judges every limit from the sweep points of
     * an archive, as the measurement did (the triangle check is not repeated); a fit that fails is
     * an {@code error} with its reason.
     */
    public static Reassessment reassess(Plan plan, BenchConfig bench, Calibration calibration, List<PointResult> points) {
        try {
            Analysis a = analyse(plan, bench, calibration, points, null);
            return new Reassessment(Judge.verdict(a.judged()), List.copyOf(a.judged()), List.copyOf(a.warnings()), null);
        } catch (IllegalArgumentException e) {
            // FitException is one: the fit failed, or the corrections do not cover the archived frequencies
            return new Reassessment(Verdict.ERROR, List.of(), List.of(), e.getMessage());
        }
    }

    /** The model fit, budgets, judged limits and warnings of a completed sweep. */
    record Analysis(SweepAnalysis.Result sweep, List<ImpedancePoint> corrected, List<LimitResult> judged, Double srfHz,
                    Double srfAboveHz, TriangleExtraction.Result triangle, List<String> warnings) {
    }

    static Analysis analyse(Plan plan, BenchConfig bench, Calibration corrections, List<PointResult> points,
                            TriangleExtraction.Result triangle) {
        return judge(plan, fitSweep(plan, bench, corrections, points), triangle);
    }

    /** The sweep's corrected points and their model fit with budgets: pure computing, no instrument. */
    record SweepFit(Calibration calibration, List<ImpedancePoint> corrected, SweepAnalysis.Result sweep,
                    List<PointResult> points, List<String> warnings) {
    }

    static SweepFit fitSweep(Plan plan, BenchConfig bench, Calibration corrections, List<PointResult> points) {
        // the channel match taken out as the plan's wiring needs it (before the low side's difference)
        Calibration calibration = corrections.forWiring(plan.wiring());
        if (calibration.fixture() != null) {
            Double sense = calibration.fixture().senseOhm();
            if (sense != null && Math.abs(sense / plan.senseResistanceOhm() - 1) > 1e-6) {
                // its short and open are in ohms of that sense resistor's scale: never applied to another
                throw new FitException("the fixture compensation of " + calibration.fixture().measuredAt() + " was"
                        + " measured with a " + Units.format(sense, Dimension.RESISTANCE) + " sense resistor"
                        + (calibration.fixture().plan() == null ? "" : " (plan " + calibration.fixture().plan() + ")")
                        + "; this plan's is " + Units.format(plan.senseResistanceOhm(), Dimension.RESISTANCE)
                        + ": run ./lrbench calibrate with this plan", null);
            }
            for (PointResult p : points) {
                if (!calibration.fixture().covers(p.impedance().frequencyHz())) {
                    throw new FitException("the fixture compensation of " + calibration.fixture().measuredAt()
                            + " has no reading at " + Units.format(p.impedance().frequencyHz(), Dimension.FREQUENCY)
                            + ": run ./lrbench calibrate with this plan", null);
                }
            }
        }
        List<ImpedancePoint> z = calibration.apply(points.stream().map(PointResult::impedance).toList(),
                points.stream().map(p -> new double[] {p.senseRangeVolt(), p.partRangeVolt()}).toList());
        SenseTrace traced = calibration.sense();
        if (traced != null) {
            if (Math.abs(traced.nominalOhm() / plan.senseResistanceOhm() - 1) > 1e-6) {
                throw new FitException("the sense resistor traced on " + traced.measuredAt() + " is a "
                        + Units.format(traced.nominalOhm(), Dimension.RESISTANCE) + " one; this plan's is "
                        + Units.format(plan.senseResistanceOhm(), Dimension.RESISTANCE)
                        + ": run ./lrbench calibrate with this plan", null);
            }
            // Z = R_s V2 / V1 was formed with the nominal R_s: the traced value scales every point
            double k = traced.valueOhm() / traced.nominalOhm();
            z = z.stream().map(p -> p.times(new Complex(k, 0))).toList();
        }
        RangeMatch ranges = RangeMatch.of(calibration.channels(), points);
        var accuracy = ranges.accuracy(bench.accuracy());
        if (calibration.fixture() != null) {
            // the fixture is compensated: its own uncertainty enters through the corrected points
            accuracy = accuracy.withFixture(null);
        }
        if (traced != null) {
            accuracy = accuracy.withTracedSense(new BenchAccuracy.TracedSense(traced.meterRelativeHalfWidth(),
                    traced.scatterRelativeUncertainty(), accuracy.senseAcDc()));
        }
        SweepAnalysis.Result sweep = SweepAnalysis.analyse(z, plan.sweep().modelTerms(),
                Readings.evaluations(plan.limits()), accuracy,
                points.stream().mapToDouble(PointResult::quantizationRelativeUncertainty).toArray(),
                ranges.pointCovariance(), ranges.uncoveredPoints());
        return new SweepFit(calibration, z, sweep, List.copyOf(points), ranges.warnings());
    }

    /** The limits judged on a sweep's fit, and the warnings of the cross-checks (the triangle's among them). */
    static Analysis judge(Plan plan, SweepFit fitted, TriangleExtraction.Result triangle) {
        SweepAnalysis.Result sweep = fitted.sweep();
        List<ImpedancePoint> z = fitted.corrected();
        Calibration calibration = fitted.calibration();
        List<PointResult> points = fitted.points();
        double fMax = plan.sweep().highestHz();
        // the reported L (averaged where the model test could not decide on a term): one L per part
        double l = sweep.reported(LumpedParameter.L);
        Double srf = null;
        Double srfAbove = null;
        if (sweep.fit().free().contains(LumpedParameter.C_P)) {
            double f = LumpedModel.selfResonanceHz(l, sweep.fit().value(LumpedParameter.C_P));
            if (f <= fMax) {
                srf = f;
            } else {
                srfAbove = Math.max(fMax, LumpedModel.selfResonanceHz(l, sweep.fit().capacitanceUpperBound()));
            }
        } else if (Double.isFinite(sweep.fit().capacitanceUpperBound()) && sweep.fit().capacitanceUpperBound() > 0) {
            srfAbove = Math.max(fMax, LumpedModel.selfResonanceHz(l, sweep.fit().capacitanceUpperBound()));
        } else {
            srfAbove = fMax;
        }
        List<LimitResult> judged = new ArrayList<>();
        for (Limit limit : plan.limits()) {
            Budget b = sweep.budgets().get(limit.name());
            Judge.Reading reading;
            if (limit.characteristic() == Characteristic.SELF_RESONANCE && srf == null) {
                // not inside the sweep: only a lower bound is known, which can prove a minimum only
                String note = "above " + Units.format(srfAbove, Dimension.FREQUENCY) + " (not reached by the sweep)";
                reading = new Judge.Reading(Double.isFinite(limit.upper()) ? Double.POSITIVE_INFINITY : srfAbove, 0, 0,
                        note);
            } else if (limit.characteristic() == Characteristic.SERIES_RESISTANCE && plan.dcResistance() != null) {
                // a winding-resistance specification means the reference temperature: the sweep's R_dc,
                // measured at the entered bench temperature, is corrected like the meter's reading
                var step = plan.dcResistance();
                double factor = CopperResistance.toReference(1.0, step.temperatureC(),
                        step.referenceTemperatureC());
                reading = new Judge.Reading(b.value() * factor, b.standardUncertainty() * factor,
                        b.expandedUncertainty() * factor, String.format(Locale.ROOT, "at %s (copper, from %s)",
                        Units.format(step.referenceTemperatureC(), Dimension.TEMPERATURE),
                        Units.format(step.temperatureC(), Dimension.TEMPERATURE)));
            } else {
                reading = new Judge.Reading(b.value(), b.standardUncertainty(), b.expandedUncertainty());
            }
            judged.add(Judge.judge(limit, reading));
        }
        List<String> warnings = new ArrayList<>();
        for (PointResult p : points) {
            if (p.currentThd() > plan.sweep().distortionLimit()) {
                warnings.add(String.format(Locale.ROOT, "current distorted at %s: THD %.2f %% over %.2f %%"
                        + " (core saturation? lower the amplitude)", Units.format(p.impedance().frequencyHz(),
                        Dimension.FREQUENCY), 100 * p.currentThd(), 100 * plan.sweep().distortionLimit()));
            }
        }
        warnings.addAll(fitted.warnings());
        warnings.addAll(crossChecks(z, sweep));
        if (triangle != null) {
            warnings.addAll(triangleCheck(triangle, sweep, calibration));
        }
        if (sweep.fit().covarianceScale() > RESIDUAL_WARNING) {
            warnings.add(String.format(Locale.ROOT, "the model leaves residuals %.1f times the variance that noise and"
                    + " the bench's corrections explain: uncertainties were scaled up; consider more model terms",
                    sweep.fit().covarianceScale()));
        }
        return new Analysis(sweep, z, judged, srf, srfAbove, triangle, warnings);
    }

    /**
     * The triangle method against the sweep model. Both share the sense resistor, the digitizer
     * gains and the frequency, so only their own (type A) uncertainties enter the comparison.
     */
    private static List<String> triangleCheck(TriangleExtraction.Result t, SweepAnalysis.Result sweep,
                                              Calibration calibration) {
        List<String> out = new ArrayList<>();
        // the triangle's R and L corrected like the sweep (channel match, leads), so that only a real
        // disagreement warns
        double[] corrected = calibration.correctSeries(t.frequencyHz(), t.resistanceOhm(), t.inductanceHenry());
        if (calibration.sense() != null) {
            // formed with the nominal sense resistor, like the sweep's points
            double k = calibration.sense().valueOhm() / calibration.sense().nominalOhm();
            corrected = new double[] {corrected[0] * k, corrected[1] * k};
        }
        String[][] pairs = {{Readings.INDUCTANCE, "inductance"}, {Readings.RESISTANCE, "resistance"}};
        for (String[] pair : pairs) {
            boolean inductance = pair[1].equals("inductance");
            double model = sweep.reported(inductance ? LumpedParameter.L : LumpedParameter.R_DC);
            double tri = inductance ? corrected[1] : corrected[0];
            double uTri = inductance ? t.inductanceUncertainty() : t.resistanceUncertainty();
            double uModel = sweep.budgets().get(pair[0]).contributions().get(0).contribution();
            double limit = Budget.K * Math.hypot(uTri, uModel);
            Dimension d = inductance ? Dimension.INDUCTANCE : Dimension.RESISTANCE;
            if (Math.abs(tri - model) > limit) {
                out.add("triangle-wave " + pair[1] + " " + Units.format(tri, d) + " and the sweep model's "
                        + Units.format(model, d) + " differ by more than their combined expanded (type A) uncertainty "
                        + Units.format(limit, d));
            }
        }
        return out;
    }

    /**
     * Each point's own phasor inductance against the model's apparent inductance at that frequency:
     * where they differ by more than their combined expanded uncertainty, the result says so.
     */
    private static List<String> crossChecks(List<ImpedancePoint> points, SweepAnalysis.Result sweep) {
        List<String> out = new ArrayList<>();
        double[] p = sweep.reported();
        double uModel = sweep.budgets().get(Readings.INDUCTANCE).standardUncertainty();
        for (ImpedancePoint z : points) {
            double omega = 2 * Math.PI * z.frequencyHz();
            double model = LumpedModel.apparentInductance(p, z.frequencyHz());
            double uPoint = z.componentUncertaintyOhm() / omega;
            double combined = Budget.K * Math.hypot(uPoint, uModel * model / LumpedParameter.L.in(p));
            if (Math.abs(z.inductanceHenry() - model) > combined
                    && Math.abs(z.inductanceHenry() - model) > POINT_AGREEMENT_FLOOR * model) {
                out.add(String.format(Locale.ROOT, "at %s the point's phasor inductance %s and the sweep model's %s"
                        + " differ by more than their combined expanded uncertainty %s",
                        Units.format(z.frequencyHz(), Dimension.FREQUENCY), Units.format(z.inductanceHenry(), Dimension.INDUCTANCE),
                        Units.format(model, Dimension.INDUCTANCE), Units.format(combined, Dimension.INDUCTANCE)));
            }
        }
        return out;
    }
}
