package org.lrbench.measure;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.HarmonicFit;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.plan.Plan;
import org.lrbench.plan.SineSweep;
import org.lrbench.plan.TriangleCheck;

/**
 * Runs a plan's sine sweep on a generator and a digitizer: per frequency it sets the generator,
 * chooses a time base of the requested cycles at no fewer than the requested samples per cycle,
 * waits for settling, auto-ranges both channels, fits both traces at the known frequency and
 * turns the phasors into the part's impedance. Each point is analysed on a worker thread while
 * the instruments move on to the next ({@link PointWork}: computing only, no instrument); on
 * instruments kept open the ranges of a part's first capture come from the part before
 * ({@link RangeMemory}). The caller owns the generator output's safety:
 * this class switches it on and off, and the caller switches it off again on every exit path.
 */
public final class SweepRunner {
    /** Harmonics 2..9 enter the current's distortion figure. */
    static final int THD_HARMONICS = 9;
    /**
     * The first range (peak-to-peak) per volt of peak EMF: no node of the passive fixture exceeds the
     * EMF, so twice it holds every signal, and 10 % more keeps the peak off the converter's last codes.
     */
    static final double START_RANGE_PER_PEAK = 2.2;
    /** Cycles per record while the first point's ranges are found. */
    static final int RANGING_CYCLES = 2;
    private final Generator generator;
    private final Digitizer digitizer;
    private final BenchClock clock;

    private final boolean openCircuit;
    private final RangeMemory memory;
    /** Set once the output is off after the last capture (the part is no longer driven). */
    private boolean outputOff;
    /** When the triangle's settings took effect (the bench clock's time). */
    private long triangleSet;

    public SweepRunner(Generator generator, Digitizer digitizer, BenchClock clock) {
        this(generator, digitizer, clock, false);
    }

    /** A sweep runner that ranges from, and keeps for the next part, what a part of the same plan showed. */
    public SweepRunner(Generator generator, Digitizer digitizer, BenchClock clock, RangeMemory memory) {
        this(generator, digitizer, clock, false, memory);
    }


    /**
     * @param openCircuit true when the fixture is open: a point whose current is lost in noise is then
     *                    a reading (its impedance NaN: beyond what the bench can see), not an error
     */
    public SweepRunner(Generator generator, Digitizer digitizer, BenchClock clock, boolean openCircuit) {
        this(generator, digitizer, clock, openCircuit, null);
    }

    private SweepRunner(Generator generator, Digitizer digitizer, BenchClock clock, boolean openCircuit,
                        RangeMemory memory) {
        this.generator = generator;
        this.digitizer = digitizer;
        this.clock = clock;
        this.openCircuit = openCircuit;
        this.memory = openCircuit ? null : memory;
    }

    /** The sweep points and, when the plan asks for it, the triangle-wave check. */
    public record Measurement(List<PointResult> points, TriangleExtraction.Result triangle) {
    }

    public Measurement run(Plan plan, SweepListener listener) {
        return run(plan, listener, StopToken.NEVER, AfterSweep.NOTHING);
    }

    /**
     * Runs the sweep and the triangle check. {@code observer} hears each point (isolated: it cannot
     * change the measurement); {@code stop} is checked before each capture, and a stop requested ends
     * the run with {@link MeasurementStopped}; {@code afterSweep} gets the sweep's points once they are
     * all in, before the triangle check.
     */
    public Measurement run(Plan plan, SweepListener observer, StopToken stop, AfterSweep afterSweep) {
        SineSweep sweep = plan.sweep();
        SweepListener listener = SweepListener.isolated(observer);
        listener.sweepStarted();
        // each instrument's identity is known (asked once per session) before its settings are batched
        generator.identity();
        digitizer.identity();
        MultisineDesign.Design multisine = sweep.multisine()
                ? MultisineCapture.design(sweep, generator.maxArbitrarySamples()) : null;
        // each instrument's reset and settings in one message where its driver can; the generator's
        // output comes on in its message, last
        digitizer.batch(() -> {
            digitizer.prepare();
            for (int ch = 1; ch <= 2; ch++) {
                digitizer.setCoupling(ch, Coupling.DC);
                digitizer.setOffset(ch, 0.0);
            }
            // the sense-resistor voltage is the current: trigger on its rising zero crossing; with a DC
            // offset the crossing level is unknown, so let the digitizer run free (the fit needs no trigger)
            if (sweep.offsetVolt() == 0) {
                digitizer.setTrigger(TriggerSource.CHANNEL1, 0.0, true);
            } else {
                digitizer.setTrigger(TriggerSource.IMMEDIATE, 0.0, true);
            }
        });
        // no node of this passive circuit exceeds the source EMF: start both channels above it
        double start = START_RANGE_PER_PEAK * sweep.peakEmfVolt();
        AutoRanger ranger = new AutoRanger(digitizer, start, start);
        List<PointResult> points = new ArrayList<>();
        outputOff = false;
        try {
            generator.batch(() -> {
                generator.prepare();
                if (multisine != null) {
                    MultisineCapture.load(generator, multisine, sweep);
                } else {
                    generator.setWaveform(Waveform.SINE);
                    generator.setFrequency(sweep.frequenciesHz().get(0));
                    generator.setAmplitude(sweep.amplitudeVolt());
                    generator.setOffset(sweep.offsetVolt());
                }
                generator.outputOn();
            });
            long outputOnAt = clock.nanoTime();
            if (multisine != null) {
                stop.checkpoint();
                points.addAll(MultisineCapture.measure(plan, multisine, digitizer, ranger, clock,
                        Settle.seconds(sweep, plan.senseResistanceOhm(), null, generator.frequencySettleSecond()),
                        openCircuit, memory));
                for (int i = 0; i < points.size(); i++) {
                    listener.pointMeasured(i, points.size(), points.get(i));
                }
                afterSweep.sweepComplete(List.copyOf(points));
                stop.checkpoint();
                double[] peaks = new double[2];
                TriangleExtraction.Result triangle = plan.triangle() == null || openCircuit ? null
                        : triangle(plan, points.get(points.size() - 1).impedance(), peaks);
                if (memory != null && triangle != null) {
                    memory.remember(plan, points.get(0).impedance(), peaks);
                }
                return new Measurement(points, triangle);
            }
            int count = sweep.frequenciesHz().size();
            ImpedancePoint remembered = memory == null ? null : memory.firstPoint(plan);
            // each point is analysed while the instruments move on to the next (its frequency change
            // and settle), so lrbench's own work overlaps the instruments' time
            try (PointWork work = new PointWork()) {
                for (int i = 0; i < count; i++) {
                    stop.checkpoint();
                    double f = sweep.frequenciesHz().get(i);
                    if (i > 0) {
                        // the first frequency went with the waveform's settings, before the output came on
                        generator.setFrequency(f);
                    }
                    // the settle runs from here: the wait for the last point's analysis is part of it
                    long changed = i == 0 ? outputOnAt : clock.nanoTime();
                    if (work.pending()) {
                        PointResult done = work.result();
                        points.add(done);
                        listener.pointMeasured(i - 1, count, done);
                    }
                    // ranges from the point before, or at the first point from the part before
                    ImpedancePoint basis = !points.isEmpty() ? points.get(points.size() - 1).impedance()
                            : i == 0 ? remembered : null;
                    boolean predicted = false;
                    if (basis != null && sweep.offsetVolt() == 0 && !openCircuit) {
                        double[] peaks = RangePrediction.next(basis, sweep.amplitudeVolt(), plan.senseResistanceOhm(), f);
                        if (peaks != null) {
                            ranger.expect(peaks[0], peaks[1]);
                            predicted = true;
                        }
                    }
                    Captured c = capturePoint(plan, f, ranger,
                            points.isEmpty() ? null : points.get(points.size() - 1).impedance(), predicted, changed);
                    work.submit(() -> analysePoint(plan, c));
                }
                if (plan.triangle() != null && !openCircuit) {
                    // the triangle's settings go out while the last point is analysed; its settle runs from here
                    setTriangle(plan.triangle());
                    triangleSet = clock.nanoTime();
                }
                PointResult last = work.result();
                points.add(last);
                listener.pointMeasured(count - 1, count, last);
            }
            afterSweep.sweepComplete(List.copyOf(points));
            stop.checkpoint();
            double[] trianglePeaks = new double[2];
            TriangleExtraction.Result triangle = plan.triangle() == null || openCircuit ? null
                    : triangle(plan, points.get(points.size() - 1).impedance(), trianglePeaks);
            if (memory != null) {
                memory.remember(plan, points.get(0).impedance(), triangle == null ? null : trianglePeaks);
            }
            return new Measurement(points, triangle);
        } finally {
            if (!outputOff) {
                generator.outputOff();
            }
        }
    }

    private void setTriangle(TriangleCheck t) {
        generator.batch(() -> {
            generator.setWaveform(Waveform.TRIANGLE);
            generator.setAmplitude(t.amplitudeVolt());
            generator.setFrequency(t.frequencyHz());
        });
    }

    /**
     * Drives the triangle, captures both channels, switches the output off (the last capture) and
     * extracts R and L in the time domain.
     *
     * @param peaks filled with the capture's peak on each channel (channel volts), for the next part
     */
    private TriangleExtraction.Result triangle(Plan plan, ImpedancePoint last, double[] peaks) {
        TriangleCheck t = plan.triangle();
        if (plan.sweep().multisine()) {
            setTriangle(t);
            triangleSet = clock.nanoTime();
        }
        double start = START_RANGE_PER_PEAK * t.amplitudeVolt();
        AutoRanger ranger = new AutoRanger(digitizer, start, start);
        double[] known = memory == null ? null : memory.trianglePeaks(plan);
        if (known != null) {
            ranger.expect(known[0], known[1]);
        }
        double settle = Settle.seconds(plan.sweep(), plan.senseResistanceOhm(), last, generator.frequencySettleSecond());
        if (known == null && t.cycles() > RANGING_CYCLES) {
            // the ranges found on short records first, as at the sweep's first point
            clock.sleep(remaining(settle, triangleSet));
            TimeBase.setWithRanges(digitizer, ranger, t.frequencyHz(), RANGING_CYCLES, t.samplesPerCycle());
            ranger.acquire();
        }
        Captured found = timedCapture(ranger, t.frequencyHz(), t.cycles(), t.samplesPerCycle(), settle, triangleSet);
        Timing timing = found.timing();
        AutoRanger.Capture capture = found.capture();
        // the last capture: the part is not driven while its time-domain values are worked out
        generator.outputOff();
        outputOff = true;
        peaks[0] = peak(capture.sense().volts());
        peaks[1] = peak(capture.part().volts());
        double[][] v = volts(plan, capture);
        return TriangleExtraction.extract(v[0], v[1], timing.sampleIntervalSecond(),
                t.frequencyHz(), plan.senseResistanceOhm(), t.harmonics());
    }

    /**
     * The sense-resistor and part voltages at the fixture from the two traces: each multiplied by
     * its probe's attenuation; with the low-side wiring the part's voltage is channel 2 minus
     * channel 1 (channel 2 sees the part and the sense resistor to ground).
     */
    static double attenuation(Plan plan, int channel) {
        return plan.wiring() == null ? 1 : plan.wiring().attenuation(channel);
    }

    static double[][] volts(Plan plan, AutoRanger.Capture capture) {
        FixtureWiring w = plan.wiring();
        double a1 = w == null ? 1 : w.attenuation1();
        double a2 = w == null ? 1 : w.attenuation2();
        boolean lowSide = FixtureWiring.lowSide(w);
        double[] s = capture.sense().volts();
        double[] p = capture.part().volts();
        double[] sense = new double[s.length];
        double[] part = new double[p.length];
        for (int i = 0; i < s.length; i++) {
            sense[i] = s[i] * a1;
            part[i] = p[i] * a2 - (lowSide ? sense[i] : 0);
        }
        return new double[][] {sense, part};
    }

    /** One point's capture, before its analysis. */
    private record Captured(double f, AutoRanger.Capture capture, Timing timing) {
    }

    /** What is left of a settle that started at {@code since} (the bench clock's time). */
    private double remaining(double settleSecond, long since) {
        return clock.remaining(settleSecond, since);
    }

    /**
     * The current's total harmonic distortion (harmonics 2 to {@value #THD_HARMONICS}) from the sense
     * resistor's voltage at the fixture: the figure each stepped point records, and a re-analysis
     * of its archived trace works out again.
     */
    public static double currentThd(double[] senseVolts, double intervalSecond, double frequencyHz) {
        return HarmonicFit.fit(senseVolts, intervalSecond, frequencyHz, THD_HARMONICS).thd();
    }

    static double peak(double[] v) {
        double m = 0;
        for (double x : v) {
            m = Math.max(m, Math.abs(x));
        }
        return m;
    }

    /**
     * Captures one point with the generator already at its frequency: settle, time base, ranges, record.
     *
     * @param predicted the ranges were predicted (from the point or the part before): no ranging records
     * @param changed when the generator reached the frequency (the bench clock's time): the settle counts from there
     */
    private Captured capturePoint(Plan plan, double f, AutoRanger ranger, ImpedancePoint previous, boolean predicted,
                                  long changed) {
        SineSweep sweep = plan.sweep();
        int ranging = 0;
        if (previous == null && !predicted && sweep.cycles() > RANGING_CYCLES) {
            // nothing predicts the first point's ranges: find them on short records, then take the
            // plan's record once on ranges already right
            TimeBase.setWithRanges(digitizer, ranger, f, RANGING_CYCLES, sweep.samplesPerCycle());
            clock.sleep(remaining(Settle.seconds(sweep, plan.senseResistanceOhm(), null,
                    generator.frequencySettleSecond()), changed));
            ranging = ranger.acquire().acquisitions();
        }
        double settle = ranging == 0 ? Settle.seconds(sweep, plan.senseResistanceOhm(), previous,
                generator.frequencySettleSecond()) : 0;
        Captured found = timedCapture(ranger, f, sweep.cycles(), sweep.samplesPerCycle(), settle, changed);
        AutoRanger.Capture c = found.capture();
        return new Captured(f, new AutoRanger.Capture(c.sense(), c.part(), c.acquisitions() + ranging), found.timing());
    }

    /**
     * The time base, both ranges and the record, the settle (counted from {@code since}) waited
     * before the record. A time base the digitizer granted as asked before (on instruments kept
     * open) goes in the acquisition's own message when what is left of the settle would hide less
     * than half of a message of its own (as long as the last one took); while more of the settle
     * is left, a message of its own is hidden behind it and the acquisition's stays short. Any
     * other time base is set first, in one message with the ranges, checked, and remembered when
     * it was granted as asked.
     */
    private Captured timedCapture(AutoRanger ranger, double f, int cycles, int samplesPerCycle, double settleSecond,
                                  long since) {
        TimeBase.Request r = TimeBase.request(f, cycles, samplesPerCycle);
        if (memory != null && memory.grantedAsAsked(r)
                && remaining(settleSecond, since) < memory.timeBaseSecond() / 2) {
            clock.sleep(remaining(settleSecond, since));
            Timing[] granted = new Timing[1];
            AutoRanger.Capture c = ranger.acquireWithTiming(r.intervalSecond(), r.points(),
                    t -> TimeBase.holds(t, f, cycles, samplesPerCycle), granted);
            if (c != null) {
                return new Captured(f, c, granted[0]);
            }
            // the digitizer granted another time base this time: set one that holds, and capture again
        }
        long sent = clock.nanoTime();
        Timing timing = TimeBase.setWithRanges(digitizer, ranger, f, cycles, samplesPerCycle);
        if (memory != null) {
            memory.rememberTimeBaseSecond((clock.nanoTime() - sent) / 1e9);
            if (TimeBase.holds(timing, f, cycles, samplesPerCycle)) {
                memory.rememberGranted(r);
            }
        }
        clock.sleep(remaining(settleSecond, since));
        return new Captured(f, ranger.acquire(), timing);
    }

    /** A captured point's phasors, impedance and distortion: pure computing, no instrument. */
    private PointResult analysePoint(Plan plan, Captured c) {
        double f = c.f();
        AutoRanger.Capture capture = c.capture();
        Timing timing = c.timing();
        double[][] v = volts(plan, capture);
        FixtureWiring w = plan.wiring();
        FixturePhasors.Result phasors = FixturePhasors.of(capture.sense().volts(), capture.part().volts(),
                capture.sense().intervalSecond(), f, attenuation(plan, 1), attenuation(plan, 2),
                FixtureWiring.lowSide(w));
        SineFitResult sense = phasors.sense();
        SineFitResult part = phasors.part();
        if (sense.amplitude() <= 3 * sense.residualRms() * Math.sqrt(2.0 / sense.samples())) {
            if (openCircuit) {
                ImpedancePoint none = new ImpedancePoint(f, new Complex(Double.NaN, Double.NaN),
                        Double.NaN, Complex.ZERO);
                return new PointResult(none, sense, part, capture.sense().rangeVolt() * attenuation(plan, 1),
                        capture.part().rangeVolt() * attenuation(plan, 2),
                        timing.sampleIntervalSecond(), capture.sense().length(), capture.acquisitions(), Double.NaN,
                        capture.sense(), capture.part(), phasors.senseCorrection(), phasors.partCorrection());
            }
            throw new MeasurementException(String.format(Locale.ROOT,
                    "no measurable current at %.6g Hz: the sense-resistor voltage is lost in noise (open fixture?)", f));
        }
        ImpedancePoint z = PhasorImpedance.of(f, sense, part, plan.senseResistanceOhm());
        double thd = currentThd(v[0], capture.sense().intervalSecond(), f);
        return new PointResult(z, sense, part, capture.sense().rangeVolt() * attenuation(plan, 1),
                capture.part().rangeVolt() * attenuation(plan, 2),
                timing.sampleIntervalSecond(), capture.sense().length(), capture.acquisitions(), thd,
                capture.sense(), capture.part(), phasors.senseCorrection(), phasors.partCorrection());
    }
}
