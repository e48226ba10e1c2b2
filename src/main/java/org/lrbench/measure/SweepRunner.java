package org.lrbench.measure;

import java.util.List;
import org.lrbench.analysis.HarmonicFit;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.plan.Plan;
import org.lrbench.plan.SineSweep;

/**
 * Runs a plan's sweep on a generator and a digitizer: sets both instruments up, switches the
 * output on, measures the sweep by its excitation ({@link SteppedSweep}, one frequency after
 * another; {@link MultisineCapture}, every frequency in one record), hands the points over
 * ({@link AfterSweep}), then the plan's triangle check ({@link TriangleCapture}; a multisine's tones
 * are fitted while it is measured, {@link MultisineAhead}); each record is
 * taken by {@link TimedCapture}. On instruments kept open the ranges of a part's first capture
 * come from the part before ({@link RangeMemory}). The caller owns the generator output's safety:
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
    private final boolean frequencyFromRecord;

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
        this(generator, digitizer, clock, openCircuit, memory, false);
    }

    private SweepRunner(Generator generator, Digitizer digitizer, BenchClock clock, boolean openCircuit,
                        RangeMemory memory, boolean frequencyFromRecord) {
        this.generator = generator;
        this.digitizer = digitizer;
        this.clock = clock;
        this.openCircuit = openCircuit;
        this.memory = openCircuit ? null : memory;
        this.frequencyFromRecord = frequencyFromRecord;
    }

    /**
     * The same runner with each stepped point's sines fitted at the frequency its record shows (see
     * {@link org.lrbench.analysis.RecordFrequency}) rather than the generator's setting: for records of hundreds of cycles,
     * where a generator whose time base is off the digitizer's by a few ppm walks a visible phase.
     */
    public SweepRunner fittingFrequency() {
        return new SweepRunner(generator, digitizer, clock, openCircuit, memory, true);
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
        // the sense-resistor voltage is the current: trigger on its rising zero crossing; with a DC
        // offset the crossing level is unknown, so let the digitizer run free (the fit needs no trigger)
        prepareInputs(digitizer, sweep.offsetVolt() == 0 ? TriggerSource.CHANNEL1 : TriggerSource.IMMEDIATE);
        // no node of this passive circuit exceeds the source EMF: start both channels above it
        double start = START_RANGE_PER_PEAK * sweep.peakEmfVolt();
        AutoRanger ranger = new AutoRanger(digitizer, start, start);
        SweepBench bench = new SweepBench(generator, digitizer, clock, memory, openCircuit, frequencyFromRecord);
        TriangleCapture triangle = new TriangleCapture(bench, plan);
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
                MultisineCapture.Taken taken = MultisineCapture.capture(plan, multisine, digitizer, ranger, clock,
                        Settle.seconds(sweep, plan.senseResistanceOhm(), null, generator.frequencySettleSecond()),
                        openCircuit, memory);
                return new MultisineAhead(taken, listener, afterSweep).thenTriangle(triangle, stop, memory, plan);
            }
            List<PointResult> points = new SteppedSweep(bench, plan).run(ranger, listener, stop, outputOnAt, triangle);
            afterSweep.sweepComplete(List.copyOf(points));
            stop.checkpoint();
            double[] peaks = new double[2];
            TriangleExtraction.Result t = triangle.wanted()
                    ? triangle.measure(points.get(points.size() - 1).impedance(), peaks) : null;
            if (memory != null) {
                // the stepped sweep's first point's ranges (a multisine keeps its own: MultisineAhead)
                memory.remember(plan, points.get(0).impedance(), t == null ? null : peaks);
            }
            return new Measurement(List.copyOf(points), t);
        } finally {
            if (!triangle.outputOff()) {
                generator.outputOff();
            }
        }
    }

    /**
     * The digitizer reset and both inputs DC-coupled without offset, triggered as given, in one message
     * where its driver can: how every capture of lrbench starts.
     */
    static void prepareInputs(Digitizer digitizer, TriggerSource trigger) {
        digitizer.batch(() -> {
            digitizer.prepare();
            for (int ch = 1; ch <= 2; ch++) {
                digitizer.setCoupling(ch, Coupling.DC);
                digitizer.setOffset(ch, 0.0);
            }
            digitizer.setTrigger(trigger, 0.0, true);
        });
    }

    /** The probe attenuation of a channel under the plan's wiring (1 without wiring). */
    static double attenuation(Plan plan, int channel) {
        return plan.wiring() == null ? 1 : plan.wiring().attenuation(channel);
    }

    /**
     * The sense-resistor and part voltages at the fixture from the two traces: each multiplied by
     * its probe's attenuation; with the low-side wiring the part's voltage is channel 2 minus
     * channel 1 (channel 2 sees the part and the sense resistor to ground).
     */
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

}
