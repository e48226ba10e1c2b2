package org.lrbench.run;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.CalibrationRefused;
import org.lrbench.calibration.FixtureCompensation;
import org.lrbench.calibration.Plausibility;
import org.lrbench.calibration.RangeLinks;
import org.lrbench.calibration.SenseTrace;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.fixture.FixturePosition;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.RangeLinkCapture;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.plan.SineSweep;

/**
 * Measures a bench's corrections at a plan's sweep frequencies: the channel match (both channels
 * on the sense resistor), then the fixture's short and open. The generator output is guarded as
 * in every measurement and is off whenever the operator changes the wiring.
 */
public final class CalibrationRun {

    private CalibrationRun() {
    }

    public static ChannelMatch channels(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper) {
        return channels(plan, inst, change, sleeper, BenchAccuracy.defaults());
    }

    /**
     * The channel match, refused ({@link CalibrationRefused}, nothing kept) when the channels' gain
     * ratio or skew is beyond what the bench's declared accuracies allow: then the digitizer's inputs
     * were not both put on the sense resistor.
     */
    public static ChannelMatch channels(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper,
                                        BenchAccuracy accuracy) {
        // both channels on the sense resistor: their raw ratio, at the fixture (probe attenuations), so
        // with low-side wiring channel 1 is not taken from channel 2 here
        Plan raw = plan;
        if (FixtureWiring.lowSide(plan.wiring())) {
            FixtureWiring w = plan.wiring();
            raw = new Plan(plan.source(), plan.partNumber(), plan.description(), plan.senseResistanceOhm(), plan.sweep(),
                    plan.triangle(), plan.limits(), plan.sampling(), new FixtureWiring(w.senseOhm(),
                    FixtureWiring.Topology.DIFFERENTIAL, w.attenuation1(), w.attenuation2(), w.channel1Differential(),
                    w.channel2Differential()), plan.dcResistance());
        }
        RangeLinkCapture.Result[] linked = new RangeLinkCapture.Result[1];
        Plan asWired = raw;
        List<PointResult> points = sweep(raw, inst, change, FixturePosition.CHANNEL_MATCH, sleeper, false,
                matched -> linked[0] = links(asWired, inst, sleeper, matched));
        double[] f = new double[points.size()];
        double[] u = new double[points.size()];
        double[] phaseU = new double[points.size()];
        List<Complex> ratio = new ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            ImpedancePoint z = points.get(i).impedance();
            f[i] = z.frequencyHz();
            ratio.add(z.impedanceOhm().divide(plan.senseResistanceOhm()));
            // each point's magnitude: its phasors' scatter along Z and its quantization correction's; its
            // phase: the scatter across Z alone (the correction scales amplitudes, not phases)
            phaseU[i] = z.phaseUncertainty();
            u[i] = Math.hypot(z.magnitudeRelativeUncertainty(), points.get(i).quantizationRelativeUncertainty());
        }
        String at = now();
        RangeLinkCapture.Result read = linked[0];
        ChannelMatch m = ChannelMatch.fit(at, f, ratio, u, phaseU).withRangePairs(points.stream()
                .map(p -> new double[] {p.senseRangeVolt(), p.partRangeVolt()}).toList())
                .withLinks(RangeLinks.solve(at, read.frequencyHz(), withMatchReadings(read.readings(), points, ratio, u),
                        read.unread()));
        double finest = points.stream().mapToDouble(PointResult::sampleIntervalSecond).min().orElse(0);
        List<String> problems = Plausibility.channelMatch(m, f, ratio, u, accuracy, finest);
        if (!problems.isEmpty()) {
            throw new CalibrationRefused("the channel match", problems, "Were both digitizer inputs put across the"
                    + " sense resistor? Channel 2 still across the part reads the part, not the channels");
        }
        return m;
    }

    /**
     * The range links' readings and the match's own points, each one more reading of its range pair (the
     * magnitude of V2 / V1 with its relative standard uncertainty), so that the least-squares solution
     * gives a pair the match read directly the weight of those readings. Without them a pair's ratio came
     * from the links alone: on a low-side fixture, where the short is the small difference of two large
     * channel readings, the links' ratio for the match's own range pair was 2.5e-4 off the match's
     * readings on it (twice the links' uncertainty, eight times the readings'), and every short read 25
     * mohm low. A point's ranges are put on the links' own range values where they agree to 1e-6.
     */
    static List<RangeLinkCapture.Reading> withMatchReadings(List<RangeLinkCapture.Reading> links,
                                                            List<PointResult> points, List<Complex> ratio, double[] u) {
        List<RangeLinkCapture.Reading> all = new ArrayList<>(links);
        for (int i = 0; i < points.size(); i++) {
            if (!(u[i] > 0) || !Double.isFinite(u[i]) || !(ratio.get(i).abs() > 0)) {
                continue;
            }
            double r1 = onLinks(links, 1, points.get(i).senseRangeVolt());
            double r2 = onLinks(links, 2, points.get(i).partRangeVolt());
            all.add(new RangeLinkCapture.Reading(1, r1, 2, r2, ratio.get(i).abs(), u[i]));
        }
        return all;
    }

    /** The links' value of a channel's range equal to this one to 1e-6, or this one where they read none. */
    private static double onLinks(List<RangeLinkCapture.Reading> links, int channel, double range) {
        for (RangeLinkCapture.Reading r : links) {
            for (double[] node : new double[][] {{r.channelA(), r.rangeA()}, {r.channelB(), r.rangeB()}}) {
                if (node[0] == channel && Math.abs(node[1] - range) <= 1e-6 * range) {
                    return node[1];
                }
            }
        }
        return range;
    }

    /**
     * Every correction in turn: the channel match, the fixture measured with it in force, and the
     * sense resistor where the bench has a meter.
     */
    public static Calibration calibrate(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper) {
        return calibrate(plan, inst, change, sleeper, BenchAccuracy.defaults());
    }

    /** As above, the sense resistor's trace under the bench's own meter accuracy and resistor tolerance. */
    public static Calibration calibrate(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper,
                                        BenchAccuracy accuracy) {
        ChannelMatch m = channels(plan, inst, change, sleeper);
        Fixtured f = fixtureAndLinks(plan, inst, change, sleeper, m);
        // the sense resistor traced too where the bench has a meter, as calibrate does
        return new Calibration(f.match(), f.fixture()).withSense(senseResistor(plan, inst, change, accuracy));
    }

    /** The fixture's short and open, and the channel match with channel 2's upper ranges linked on the open. */
    public record Fixtured(FixtureCompensation fixture, ChannelMatch match) {
    }

    /**
     * Short and open of the fixture as {@link #fixture}; on the open, where the channel match's links
     * did not reach channel 2's upper ranges (both channels on the sense resistor see only its small
     * voltage), channel 2 alone links them on the open terminals (see {@link RangeLinkCapture#channel2Alone}),
     * and the links are solved again with those readings.
     */
    public static Fixtured fixtureAndLinks(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper,
                                           ChannelMatch channels) {
        RangeLinkCapture.Result[] more = new RangeLinkCapture.Result[1];
        FixtureCompensation f = fixture(plan, inst, change, sleeper, channels, opens -> {
            if (channels != null && channels.links() != null) {
                more[0] = upperLinks(plan, inst, sleeper, channels.links(), opens);
            }
        });
        ChannelMatch m = channels;
        if (more[0] != null && !more[0].readings().isEmpty()) {
            m = channels.withLinks(channels.links().plus(channels.links().measuredAt(), more[0].readings(),
                    more[0].unread()));
        }
        return new Fixtured(f, m);
    }

    /** Channel 2's ranges from the second largest the match's links read upward, linked on the open terminals. */
    private static RangeLinkCapture.Result upperLinks(Plan plan, BenchInstruments inst, BenchClock clock,
                                                      org.lrbench.calibration.RangeLinks links, List<PointResult> opens) {
        List<Double> read = links.readings().stream().filter(r -> r.channelB() == 2).map(r -> r.rangeB()).distinct()
                .sorted().toList();
        if (read.isEmpty()) {
            return null;
        }
        double from = read.size() > 1 ? read.get(read.size() - 2) : read.get(0);
        PointResult at = opens.stream().filter(p -> Math.abs(p.impedance().frequencyHz() / links.frequencyHz() - 1) < 1e-9)
                .findFirst().orElse(opens.get(0));
        double node = at.partFit().amplitude();
        if (!(node > 0)) {
            return null;
        }
        return RangeLinkCapture.channel2Alone(plan, inst.generator(), inst.digitizer(), clock,
                at.impedance().frequencyHz(), node, from);
    }

    /** Short and open of the fixture, each corrected by the channel match when there is one. */
    public static FixtureCompensation fixture(Plan plan, BenchInstruments inst, FixtureChange change, BenchClock sleeper,
                                              ChannelMatch channels) {
        return fixture(plan, inst, change, sleeper, channels, opens -> { });
    }

    private static FixtureCompensation fixture(Plan plan, BenchInstruments inst, FixtureChange change,
                                               BenchClock sleeper, ChannelMatch channels,
                                               java.util.function.Consumer<List<PointResult>> onOpen) {
        Calibration match = new Calibration(channels, null).forWiring(plan.wiring());
        List<PointResult> shorts = sweep(plan, inst, change, FixturePosition.SHORT, sleeper, false);
        List<PointResult> opens = sweep(plan, inst, change, FixturePosition.OPEN, sleeper, true, onOpen);
        List<FixtureCompensation.Point> out = new ArrayList<>();
        for (int i = 0; i < shorts.size(); i++) {
            // each reading corrected by the channel ratio of the range pair it was read on
            ImpedancePoint s = match.apply(List.of(shorts.get(i).impedance()), List.of(ranges(shorts.get(i)))).get(0);
            ImpedancePoint o = opens.get(i).impedance();
            boolean lost = Double.isNaN(o.impedanceOhm().getReal());
            ImpedancePoint oc = lost ? null : match.apply(List.of(o), List.of(ranges(opens.get(i)))).get(0);
            Complex open = lost ? new Complex(Double.NaN, Double.NaN) : oc.impedanceOhm();
            // u(Y_o) = u(Z_open) / |Z_open - Z_s|^2, first order
            Double uy = lost ? null : oc.componentUncertaintyOhm() / Math.pow(open.subtract(s.impedanceOhm()).abs(), 2);
            out.add(new FixtureCompensation.Point(s.frequencyHz(), s.resistanceOhm(), s.reactanceOhm(),
                    open.getReal(), open.getImaginary(), s.componentUncertaintyOhm(), false, uy));
        }
        change.moveTo(FixturePosition.PART);
        FixtureCompensation f = new FixtureCompensation(now(), strayEverywhere(out))
                .measuredWith(plan.source(), plan.senseResistanceOhm());
        List<String> problems = Plausibility.fixture(f);
        if (!problems.isEmpty()) {
            throw new CalibrationRefused("the fixture compensation", problems, "Was the part taken out and the shorting"
                    + " bar put in its place for the short, and the place left empty for the open?");
        }
        return f;
    }

    /**
     * The open reading is lost in noise where the fixture's stray admittance is tiny (low
     * frequencies), which is where it matters least, but a stray that is removed at some frequencies
     * and kept at others would be taken for the part's own capacitance. So the stray is modelled as
     * a conductance and a capacitance, Y_o = G + j w C (least squares over the readable opens,
     * weighting each by its frequency's square for C), and used at every frequency whose open was lost.
     */
    static List<FixtureCompensation.Point> strayEverywhere(List<FixtureCompensation.Point> points) {
        double sc = 0;
        double sw = 0;
        double sg = 0;
        double su = 0;
        int readable = 0;
        for (FixtureCompensation.Point p : points) {
            if (Double.isNaN(p.openReal())) {
                continue;
            }
            double omega = 2 * Math.PI * p.frequencyHz();
            Complex y = new Complex(p.openReal(), p.openImag()).subtract(new Complex(p.shortReal(), p.shortImag()))
                    .reciprocal();
            // Im(Y) = w C: least squares with equal weights on Im(Y) gives C = sum(w Im Y) / sum(w^2)
            sc += omega * y.getImaginary();
            sw += omega * omega;
            double uy = p.openAdmittanceUncertainty() == null ? 0 : p.openAdmittanceUncertainty();
            su += omega * omega * uy * uy;
            sg += y.getReal();
            readable++;
        }
        if (readable == 0 || readable == points.size()) {
            return List.copyOf(points);
        }
        double c = sc / sw;
        double g = Math.max(0, sg / readable);
        if (!(c > 0)) {
            return List.copyOf(points);
        }
        List<FixtureCompensation.Point> out = new ArrayList<>();
        for (FixtureCompensation.Point p : points) {
            if (!Double.isNaN(p.openReal())) {
                out.add(p);
                continue;
            }
            double omega = 2 * Math.PI * p.frequencyHz();
            Complex open = new Complex(p.shortReal(), p.shortImag()).add(new Complex(g, omega * c).reciprocal());
            // u(C) = sqrt(sum w^2 u(Y)^2) / sum w^2 for the line through the origin; u(Y) = w u(C)
            out.add(new FixtureCompensation.Point(p.frequencyHz(), p.shortReal(), p.shortImag(), open.getReal(),
                    open.getImaginary(), p.shortUncertaintyOhm(), true, omega * Math.sqrt(su) / sw));
        }
        return List.copyOf(out);
    }

    /**
     * The channels' ratio on the range pairs around the match's, both channels still on the sense
     * resistor, at the match's frequency with the most signal (see {@link RangeLinkCapture}).
     */
    private static RangeLinkCapture.Result links(Plan plan, BenchInstruments inst, BenchClock clock,
                                                 List<PointResult> matched) {
        PointResult most = matched.stream().max(java.util.Comparator.comparingDouble(p -> p.senseFit().amplitude()))
                .orElseThrow();
        // the links are read with a sine of the plan's amplitude, as the matched points were (a multisine
        // plan's too: see sweep)
        return RangeLinkCapture.measure(plan, inst.generator(), inst.digitizer(), clock,
                most.impedance().frequencyHz(), most.senseFit().amplitude());
    }

    private static List<PointResult> sweep(Plan plan, BenchInstruments inst, FixtureChange change,
                                           FixturePosition position, BenchClock sleeper, boolean open) {
        return sweep(plan, inst, change, position, sleeper, open, points -> { });
    }

    /** A sweep in a position, then {@code after} with its points, in the same position with the output guarded. */
    private static List<PointResult> sweep(Plan plan, BenchInstruments inst, FixtureChange change,
                                           FixturePosition position, BenchClock sleeper, boolean open,
                                           java.util.function.Consumer<List<PointResult>> after) {
        OutputGuard guard = new OutputGuard(inst.generator());
        try {
            guard.switchOff();
            change.moveTo(position);
            Plan sweepOnly = new Plan(plan.source(), plan.partNumber(), plan.description(), plan.senseResistanceOhm(),
                    readingSweep(plan.sweep(), inst), null, plan.limits(), plan.sampling(), plan.wiring(), null);
            List<PointResult> points = new SweepRunner(inst.generator(), inst.digitizer(), sleeper, open)
                    .fittingFrequency().run(sweepOnly, SweepListener.NONE).points();
            after.accept(points);
            return points;
        } finally {
            guard.close();
            if (guard.failure() != null) {
                throw new InstrumentException(guard.failure());
            }
        }
    }

    /**
     * The fewest cycles each correction's record holds: with its noise (and the converter's
     * quantization error, which spreads like noise over a record whose samples fall at phases all over
     * the period) about a sixth of a 10-cycle part reading's.
     */
    static final int CORRECTION_CYCLES = 400;

    /**
     * The sweep the corrections are read with. A correction is read once and applied to every part, so
     * its error is the same in every part measured with it and never averages away: it is read the
     * slower, surer way. Each frequency's record holds at least {@value #CORRECTION_CYCLES} cycles (the
     * plan's where more; as many as the digitizer's longest record holds at the plan's samples per cycle,
     * where fewer), and its sines are fitted at the frequency the record shows ({@link
     * SweepRunner#fittingFrequency}). At the plan's 10 cycles, an 8-bit digitizer's quantization error
     * left the channels' skew about 800 ps uncertain on a 1 mH part swept to 20 kHz (four times a bench's
     * usual 200 ps specification), and the skew's error, of either sign, pulled the part's winding
     * resistance low through the model's skin-effect term (0.8 sigma in the coverage benchmark); at 400
     * cycles it is about 80 ps. A multisine plan's corrections are the stepped sweep at its tones'
     * frequencies: each frequency with the plan's whole amplitude on ranges fitted to it, where a tone of
     * the multisine has a share of it; the range links carry the match to the multisine's ranges.
     */
    static SineSweep readingSweep(SineSweep sweep, BenchInstruments inst) {
        SineSweep s = sweep;
        if (sweep.multisine()) {
            double[] tones = org.lrbench.analysis.MultisineDesign.of(sweep.frequenciesHz(), sweep.multisineTolerance(),
                    inst.generator().maxArbitrarySamples()).frequenciesHz();
            s = sweep.withMultisine(false).withFrequencies(java.util.Arrays.stream(tones).boxed().toList());
        }
        long held = Math.max(1, (inst.digitizer().maxRecordLength() - 2L) / s.samplesPerCycle());
        int cycles = (int) Math.max(s.cycles(), Math.min(CORRECTION_CYCLES, held));
        return s.withCycles(cycles);
    }

    private static double[] ranges(PointResult p) {
        return new double[] {p.senseRangeVolt(), p.partRangeVolt()};
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }

    /** Readings of the sense resistor averaged into its traced value (the meter's own scatter enters as type A). */
    static final int SENSE_READINGS = 5;

    /**
     * The sense resistor traced by the bench's multimeter, 4-wire, {@value #SENSE_READINGS} readings
     * averaged: its value and standard uncertainty (the meter's specification as a rectangle, and the
     * readings' scatter over their number). Null on a bench without a meter. Refused, nothing kept,
     * when the reading is outside the resistor's tolerance by more than its uncertainty: the leads
     * were not on the sense resistor.
     */
    public static SenseTrace senseResistor(Plan plan, BenchInstruments inst, FixtureChange change, BenchAccuracy accuracy) {
        if (inst.multimeter() == null) {
            return null;
        }
        inst.generator().outputOff();
        change.moveTo(FixturePosition.SENSE_RESISTOR);
        inst.multimeter().prepare();
        double[] r = new double[SENSE_READINGS];
        for (int i = 0; i < r.length; i++) {
            r[i] = inst.multimeter().resistance(true);
        }
        change.moveTo(FixturePosition.PART);
        double mean = java.util.Arrays.stream(r).average().orElseThrow();
        double var = java.util.Arrays.stream(r).map(x -> (x - mean) * (x - mean)).sum() / (r.length - 1);
        double limit = accuracy.meterAccuracy() * mean;
        double u = Math.sqrt(Math.pow(limit / Math.sqrt(3), 2) + var / r.length);
        double nominal = plan.senseResistanceOhm();
        if (!(Math.abs(mean / nominal - 1) <= accuracy.senseTolerance() + 3 * u / nominal)) {
            throw new CalibrationRefused("the sense resistor's reading", java.util.List.of(String.format(
                    java.util.Locale.ROOT, "the meter reads %.6g ohm (+/- %.2g), where the %.6g ohm resistor is"
                    + " within %.3g %%", mean, u, nominal, 100 * accuracy.senseTolerance())),
                    "Were the meter's four leads on the sense resistor, with the part's place empty?");
        }
        return new SenseTrace(now(), nominal, mean, u, r.length, plan.source(), limit);
    }
}
