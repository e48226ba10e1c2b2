package org.lrbench.measure;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.analysis.RecordFrequency;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.Timing;
import org.lrbench.plan.Plan;
import org.lrbench.plan.SineSweep;

/**
 * The stepped sine sweep, one frequency after another with the output on: per frequency the
 * generator set, the settle waited (counted from the frequency change), the ranges predicted from
 * the point before (or at the first point from the part before), the record captured and handed to
 * a worker for its analysis while the instruments move on ({@link PointWork}). The triangle's
 * settings go out while the last point is analysed.
 */
final class SteppedSweep {
    private final SweepBench bench;
    private final Plan plan;

    SteppedSweep(SweepBench bench, Plan plan) {
        this.bench = bench;
        this.plan = plan;
    }

    /**
     * The sweep's points, in order, each reported to {@code listener} once analysed.
     *
     * @param outputOnAt when the output came on at the first frequency (the bench clock's time)
     * @param triangle   sent its settings while the last point is analysed, when it is wanted
     */
    List<PointResult> run(AutoRanger ranger, SweepListener listener, StopToken stop, long outputOnAt,
                          TriangleCapture triangle) {
        SineSweep sweep = plan.sweep();
        List<PointResult> points = new ArrayList<>();
        int count = sweep.frequenciesHz().size();
        RangeMemory memory = bench.memory();
        ImpedancePoint remembered = memory == null ? null : memory.firstPoint(plan);
        // each point is analysed while the instruments move on to the next (its frequency change
        // and settle), so lrbench's own work overlaps the instruments' time
        try (PointWork work = new PointWork()) {
            for (int i = 0; i < count; i++) {
                stop.checkpoint();
                double f = sweep.frequenciesHz().get(i);
                if (i > 0) {
                    // the first frequency went with the waveform's settings, before the output came on
                    bench.generator().setFrequency(f);
                }
                // the settle runs from here: the wait for the last point's analysis is part of it
                long changed = i == 0 ? outputOnAt : bench.clock().nanoTime();
                if (work.pending()) {
                    PointResult done = work.result();
                    points.add(done);
                    listener.pointMeasured(i - 1, count, done);
                }
                // ranges from the point before, or at the first point from the part before
                ImpedancePoint basis = !points.isEmpty() ? points.get(points.size() - 1).impedance()
                        : i == 0 ? remembered : null;
                boolean predicted = false;
                if (basis != null && sweep.offsetVolt() == 0 && !bench.openCircuit()) {
                    double[] peaks = RangePrediction.next(basis, sweep.amplitudeVolt(), plan.senseResistanceOhm(), f);
                    if (peaks != null) {
                        ranger.expect(peaks[0], peaks[1]);
                        predicted = true;
                    }
                }
                TimedCapture.Captured c = capturePoint(plan, f, ranger,
                        points.isEmpty() ? null : points.get(points.size() - 1).impedance(), predicted, changed);
                work.submit(() -> analysePoint(plan, c));
            }
            if (triangle.wanted()) {
                // the triangle's settings go out while the last point is analysed; its settle runs from here
                triangle.set();
            }
            PointResult last = work.result();
            points.add(last);
            listener.pointMeasured(count - 1, count, last);
        }
        return points;
    }

    /**
     * Captures one point with the generator already at its frequency: settle, time base, ranges, record.
     *
     * @param predicted the ranges were predicted (from the point or the part before): no ranging records
     * @param changed when the generator reached the frequency (the bench clock's time): the settle counts from there
     */
    private TimedCapture.Captured capturePoint(Plan plan, double f, AutoRanger ranger, ImpedancePoint previous, boolean predicted,
                                  long changed) {
        SineSweep sweep = plan.sweep();
        int ranging = 0;
        if (previous == null && !predicted && sweep.cycles() > SweepRunner.RANGING_CYCLES) {
            // nothing predicts the first point's ranges: find them on short records, then take the
            // plan's record once on ranges already right
            TimeBase.setWithRanges(bench.digitizer(), ranger, f, SweepRunner.RANGING_CYCLES, sweep.samplesPerCycle());
            bench.clock().sleep(bench.remaining(Settle.seconds(sweep, plan.senseResistanceOhm(), null,
                    bench.generator().frequencySettleSecond()), changed));
            ranging = ranger.acquire().acquisitions();
        }
        double settle = ranging == 0 ? Settle.seconds(sweep, plan.senseResistanceOhm(), previous,
                bench.generator().frequencySettleSecond()) : 0;
        TimedCapture.Captured found = TimedCapture.capture(bench, ranger, f, sweep.cycles(), sweep.samplesPerCycle(), settle, changed);
        AutoRanger.Capture c = found.capture();
        return new TimedCapture.Captured(f, new AutoRanger.Capture(c.sense(), c.part(), c.acquisitions() + ranging), found.timing());
    }

    /** A captured point's phasors, impedance and distortion: pure computing, no instrument. */
    private PointResult analysePoint(Plan plan, TimedCapture.Captured c) {
        double f = c.f();
        AutoRanger.Capture capture = c.capture();
        Timing timing = c.timing();
        double[][] v = SweepRunner.volts(plan, capture);
        FixtureWiring w = plan.wiring();
        // the sines at the frequency the record shows where the runner asks for it (long records), else the setting
        double fitHz = bench.frequencyFromRecord() ? RecordFrequency.of(capture.sense().volts(), capture.part().volts(),
                capture.sense().intervalSecond(), f) : f;
        FixturePhasors.Result phasors = FixturePhasors.of(capture.sense().volts(), capture.part().volts(),
                capture.sense().intervalSecond(), fitHz, SweepRunner.attenuation(plan, 1), SweepRunner.attenuation(plan, 2),
                FixtureWiring.lowSide(w));
        SineFitResult sense = phasors.sense();
        SineFitResult part = phasors.part();
        if (sense.amplitude() <= 3 * sense.residualRms() * Math.sqrt(2.0 / sense.samples())) {
            if (bench.openCircuit()) {
                ImpedancePoint none = new ImpedancePoint(f, new Complex(Double.NaN, Double.NaN),
                        Double.NaN, Complex.ZERO);
                return new PointResult(none, sense, part, capture.sense().rangeVolt() * SweepRunner.attenuation(plan, 1),
                        capture.part().rangeVolt() * SweepRunner.attenuation(plan, 2),
                        timing.sampleIntervalSecond(), capture.sense().length(), capture.acquisitions(), Double.NaN,
                        capture.sense(), capture.part(), phasors.senseCorrection(), phasors.partCorrection());
            }
            throw new MeasurementException(String.format(Locale.ROOT,
                    "no measurable current at %.6g Hz: the sense-resistor voltage is lost in noise (open fixture?)", f));
        }
        ImpedancePoint z = PhasorImpedance.of(f, sense, part, plan.senseResistanceOhm());
        double thd = SweepRunner.currentThd(v[0], capture.sense().intervalSecond(), f);
        return new PointResult(z, sense, part, capture.sense().rangeVolt() * SweepRunner.attenuation(plan, 1),
                capture.part().rangeVolt() * SweepRunner.attenuation(plan, 2),
                timing.sampleIntervalSecond(), capture.sense().length(), capture.acquisitions(), thd,
                capture.sense(), capture.part(), phasors.senseCorrection(), phasors.partCorrection());
    }
}
