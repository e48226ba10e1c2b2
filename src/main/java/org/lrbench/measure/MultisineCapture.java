package org.lrbench.measure;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.analysis.MultisineFit;
import org.lrbench.analysis.MultisineQuantization;
import org.lrbench.analysis.MultisineTimeBase;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.analysis.Quantization;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Timing;
import org.lrbench.plan.Plan;
import org.lrbench.plan.SineSweep;

/**
 * The sweep as one multisine: every frequency on a bin of a common period
 * ({@link MultisineDesign}), loaded once into the generator's arbitrary-waveform memory at the
 * plan's amplitude as its peak, ranged on one period at a coarse rate, its record's samples sized
 * from that probe for the stepped sweep's certainty ({@link MultisineRecord}), then captured once and fitted
 * at all tones together ({@link MultisineFit}). Each tone becomes a sweep point with the fit's own
 * covariance. Bins that carry no tone, at the second and third harmonics of each tone, are fitted
 * too: what a non-linear core puts there is each point's distortion figure.
 */
public final class MultisineCapture {
    /** Samples per cycle of the highest tone while ranging on one period. */
    static final int RANGING_SAMPLES_PER_TOP_CYCLE = 8;
    /** Harmonics of each tone whose bins are watched for distortion. */
    static final int[] WATCHED_HARMONICS = {2, 3};

    private MultisineCapture() {
    }

    /** Designs made, by sweep and memory: every part of a lot has the same. */
    private static final Map<List<Object>, MultisineDesign.Design> DESIGNS = new java.util.concurrent.ConcurrentHashMap<>();

    /** The design for a plan's sweep on this generator. */
    static MultisineDesign.Design design(SineSweep sweep, int maxSamples) {
        List<Object> key = List.of(sweep.frequenciesHz(), sweep.multisineTolerance(), maxSamples);
        if (DESIGNS.size() > 16) {
            DESIGNS.clear();
        }
        return DESIGNS.computeIfAbsent(key, k -> MultisineDesign.of(sweep.frequenciesHz(), sweep.multisineTolerance(),
                maxSamples));
    }

    /** Whole periods of the common period that hold the plan's cycles of the lowest tone. */
    static int periods(SineSweep sweep, MultisineDesign.Design d) {
        return MultisineDesign.periods(d, sweep.cycles());
    }

    /** Loads the waveform and sets its peak to the plan's amplitude; the caller switches the output on. */
    static void load(Generator generator, MultisineDesign.Design d, SineSweep sweep) {
        generator.loadArbitrary(d.samples(), d.playbackRateHz());
        generator.setAmplitude(sweep.amplitudeVolt());
        generator.setOffset(sweep.offsetVolt());
    }

    /**
     * Samples per common period before {@link MultisineRecord} sizes the record for the stepped
     * sweep's certainty: the plan's samples per cycle of the lowest tone, raised to
     * {@value MultisineDesign#MIN_CAPTURE_SAMPLES_PER_TOP_CYCLE} per cycle of the highest, which keeps
     * the highest tone's third harmonic below half the sample rate.
     */
    static int samplesPerPeriod(SineSweep sweep, MultisineDesign.Design d) {
        return MultisineDesign.captureSamplesPerPeriod(d, sweep.samplesPerCycle());
    }

    /**
     * The multisine's record as the digitizer gave it, not yet analysed: what {@link #analyse} needs,
     * so the instruments can go on (to the triangle check) while its tones are fitted.
     */
    record Taken(Plan plan, MultisineDesign.Design design, AutoRanger.Capture capture, Timing timing, int ranging,
                 boolean openCircuit) {
    }

    /**
     * Ranges on one period and captures the plan's record. The probe runs while the output settles
     * (it only sets ranges): the capture starts once {@code settleSecond} has passed since the output
     * came on, probe included.
     */
    static Taken capture(Plan plan, MultisineDesign.Design d, Digitizer digitizer, AutoRanger ranger,
                         BenchClock clock, double settleSecond, boolean openCircuit, RangeMemory memory) {
        SineSweep sweep = plan.sweep();
        long on = clock.nanoTime();
        double[] known = memory == null ? null : memory.multisinePeaks(plan);
        int ranging = 0;
        int perPeriod;
        if (known != null) {
            // ranges and the record's samples from the part before on instruments kept open: no probe
            ranger.expect(known[0], known[1]);
            perPeriod = (int) known[2];
        } else {
            TimeBase.setWithRanges(digitizer, ranger, d.baseHz(), 1, RANGING_SAMPLES_PER_TOP_CYCLE * top(d));
            ranging = ranger.probe();
            perPeriod = MultisineRecord.samplesPerPeriod(sweep, d, ranger.probed(),
                    new double[] {ranger.range(1), ranger.range(2)}, new double[] {ranger.minRange(1), ranger.minRange(2)},
                    digitizer.inputNoiseVolt(), samplesPerPeriod(sweep, d), periods(sweep, d), digitizer.maxRecordLength(),
                    digitizer.minIntervalSecond());
        }
        double left = settleSecond - (clock.nanoTime() - on) / 1e9;
        if (left > 0) {
            clock.sleep(left);
        }
        // the record's time base and the ranges in one message
        Timing timing = TimeBase.setWithRanges(digitizer, ranger, d.baseHz(), periods(sweep, d), perPeriod);
        AutoRanger.Capture capture = ranger.acquire();
        if (memory != null) {
            memory.rememberMultisine(plan, new double[] {SweepRunner.peak(capture.sense().volts()),
                SweepRunner.peak(capture.part().volts()), perPeriod});
        }
        return new Taken(plan, d, capture, timing, ranging, openCircuit);
    }

    /**
     * One point per tone of a captured record. Computing only, no instrument: it may run on a thread
     * of its own while the instruments go on.
     */
    static List<PointResult> analyse(Taken taken) {
        Plan plan = taken.plan();
        MultisineDesign.Design d = taken.design();
        AutoRanger.Capture capture = taken.capture();
        Timing timing = taken.timing();
        int ranging = taken.ranging();
        boolean openCircuit = taken.openCircuit();
        double[][] v = SweepRunner.volts(plan, capture);
        double dt = capture.sense().intervalSecond();
        double[] tones = d.frequenciesHz();
        // the phasors from the tones alone (as a re-analysis of the archive fits them), while another
        // thread fits the current again with the empty bins at the tones' harmonics for the distortion figure
        java.util.concurrent.CompletableFuture<double[]> distortionFit = java.util.concurrent.CompletableFuture
                .supplyAsync(() -> distortion(v[0], dt, d.frequenciesHz()));
        FixturePhasors.Result[] fits = refit(capture.sense().volts(), capture.part().volts(), dt, tones,
                SweepRunner.attenuation(plan, 1), SweepRunner.attenuation(plan, 2),
                FixtureWiring.lowSide(plan.wiring()));
        double[] distortion = joined(distortionFit);
        List<PointResult> points = new ArrayList<>();
        double senseRange = capture.sense().rangeVolt() * SweepRunner.attenuation(plan, 1);
        double partRange = capture.part().rangeVolt() * SweepRunner.attenuation(plan, 2);
        for (int i = 0; i < tones.length; i++) {
            SineFitResult s = fits[i].sense();
            SineFitResult partFit = fits[i].part();
            int acquisitions = i == 0 ? capture.acquisitions() + ranging : 0;
            double thd = Math.sqrt(distortion[i]) / s.amplitude();
            if (s.amplitude() <= 3 * s.residualRms() * Math.sqrt(2.0 / s.samples())) {
                if (!openCircuit) {
                    throw new MeasurementException(String.format(Locale.ROOT, "no measurable current at %.6g Hz in the"
                            + " multisine: the sense-resistor voltage is lost in noise (open fixture?)", tones[i]));
                }
                ImpedancePoint none = new ImpedancePoint(tones[i], new Complex(Double.NaN, Double.NaN), Double.NaN,
                        Complex.ZERO);
                points.add(new PointResult(none, s, partFit, senseRange, partRange, timing.sampleIntervalSecond(),
                        capture.sense().length(), acquisitions, Double.NaN, capture.sense(), capture.part()));
                continue;
            }
            ImpedancePoint z = PhasorImpedance.of(tones[i], s, partFit, plan.senseResistanceOhm());
            points.add(new PointResult(z, s, partFit, senseRange, partRange, timing.sampleIntervalSecond(),
                    capture.sense().length(), acquisitions, thd, capture.sense(), capture.part()));
        }
        return points;
    }

    /**
     * The tones of an archived multisine capture fitted again as the sweep fitted them: the channels
     * at the fixture (probe attenuations, low-side difference), all tones together, each at the frequency
     * the record shows ({@link MultisineTimeBase}; the points keep the design frequencies).
     */
    public static FixturePhasors.Result[] refit(double[] channel1, double[] channel2, double intervalSecond,
                                                double[] tonesHz, double attenuation1, double attenuation2, boolean lowSide) {
        // the tones where the record holds them: a generator off the digitizer's time base plays them all
        // a few ppm off their design (see MultisineTimeBase)
        double[] seen = MultisineTimeBase.tones(channel1, channel2, intervalSecond, tonesHz);
        // each channel fitted as it came out of its quantizer, the repeatable quantization error taken off
        // (the two channels on two threads: each is independent, so the result is the same either way)
        java.util.concurrent.CompletableFuture<SineFitResult[]> second = java.util.concurrent.CompletableFuture
                .supplyAsync(() -> MultisineQuantization.corrected(channel2, intervalSecond, seen,
                        MultisineFit.fit(channel2, intervalSecond, seen)));
        SineFitResult[] raw1 = MultisineQuantization.corrected(channel1, intervalSecond, seen,
                MultisineFit.fit(channel1, intervalSecond, seen));
        SineFitResult[] raw2 = joined(second);
        SineFitResult[] s = new SineFitResult[tonesHz.length];
        SineFitResult[] p = new SineFitResult[tonesHz.length];
        for (int i = 0; i < tonesHz.length; i++) {
            s[i] = raw1[i].scaled(attenuation1);
            SineFitResult two = raw2[i].scaled(attenuation2);
            // low side: channel 2 sees the part and the sense resistor
            p[i] = !lowSide ? two : new SineFitResult(two.frequencyHz(), two.cosineCoefficient() - s[i].cosineCoefficient(),
                    two.sineCoefficient() - s[i].sineCoefficient(), two.offset() - s[i].offset(), two.residualRms(),
                    two.varianceCosine() + s[i].varianceCosine(), two.varianceSine() + s[i].varianceSine(),
                    two.covarianceCosineSine() + s[i].covarianceCosineSine(), two.samples());
        }
        FixturePhasors.Result[] out = new FixturePhasors.Result[tonesHz.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = new FixturePhasors.Result(s[i], p[i], Quantization.Correction.NONE, Quantization.Correction.NONE);
        }
        return out;
    }

    /** A worker's result, or what it threw as it was thrown (not wrapped). */
    static <T> T joined(java.util.concurrent.CompletableFuture<T> f) {
        try {
            return f.join();
        } catch (java.util.concurrent.CompletionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            if (e.getCause() instanceof Error r) {
                throw r;
            }
            throw e;
        }
    }

    /**
     * Per tone, the current's distortion figure as the sweep records it: the root of the summed squared
     * amplitudes of its watched harmonics' bins over the tone's own amplitude ({@code toneAmplitudes},
     * the current's fitted phasors at the fixture).
     */
    public static double[] currentThd(double[] current, double dt, double[] tonesHz, double[] toneAmplitudes) {
        double[] d = distortion(current, dt, tonesHz);
        double[] out = new double[d.length];
        for (int i = 0; i < d.length; i++) {
            out[i] = Math.sqrt(d[i]) / toneAmplitudes[i];
        }
        return out;
    }

    /**
     * Per tone, the summed squared amplitudes of its watched harmonics' bins in the current. The bins
     * are found from the tones themselves (their common period), so that a re-analysis of the archive,
     * which keeps the tones but not the design, finds the very same ones.
     */
    private static double[] distortion(double[] current, double dt, double[] tones) {
        double baseHz = MultisineDesign.commonBase(tones);
        int[] bins = new int[tones.length];
        for (int i = 0; i < tones.length; i++) {
            bins[i] = (int) Math.round(tones[i] / baseHz);
        }
        Map<Integer, Integer> watched = watchedBins(bins, baseHz, 0.45 / dt);
        double[] distortion = new double[tones.length];
        if (watched.isEmpty()) {
            return distortion;
        }
        double[] withWatched = new double[tones.length + watched.size()];
        System.arraycopy(tones, 0, withWatched, 0, tones.length);
        int j = tones.length;
        for (int bin : watched.keySet()) {
            withWatched[j++] = bin * baseHz;
        }
        SineFitResult[] all = MultisineFit.fit(current, dt, withWatched);
        j = tones.length;
        for (Map.Entry<Integer, Integer> e : watched.entrySet()) {
            double a = all[j++].amplitude();
            distortion[e.getValue()] += a * a;
        }
        return distortion;
    }

    private static int top(MultisineDesign.Design d) {
        return Arrays.stream(d.bins()).max().orElseThrow();
    }

    /**
     * The bins at the watched harmonics of each tone that carry no tone and lie below {@code bandHz},
     * each with the tone it belongs to (a bin two tones share goes to the lower).
     */
    static Map<Integer, Integer> watchedBins(MultisineDesign.Design d, double bandHz) {
        return watchedBins(d.bins(), d.baseHz(), bandHz);
    }

    private static Map<Integer, Integer> watchedBins(int[] bins, double baseHz, double bandHz) {
        Set<Integer> toneBins = new HashSet<>();
        for (int b : bins) {
            toneBins.add(b);
        }
        Map<Integer, Integer> out = new LinkedHashMap<>();
        for (int h : WATCHED_HARMONICS) {
            for (int i = 0; i < bins.length; i++) {
                long bin = (long) h * bins[i];
                if (bin * baseHz < bandHz && !toneBins.contains((int) bin)) {
                    out.putIfAbsent((int) bin, i);
                }
            }
        }
        return out;
    }
}
