package org.lrbench.measure;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.FourParameterSineFit;
import org.lrbench.analysis.FrequencyEstimate;
import org.lrbench.analysis.SineFit;
import org.lrbench.analysis.SineFitResult;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;
import org.lrbench.plan.Plan;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Proves the level before it is used. A factor common to both channels (a driver that sends Vpp
 * where the instrument takes peak EMF, a load setting, a digitizer's range convention or scale
 * factor) cancels in every impedance ratio, so L and R come out right while the part is driven at
 * another level than the plan's. Before a part is driven at the plan's level, the generator plays a
 * sine at a tenth of it at the plan's first frequency; the two channels give the voltage across the
 * fixture (sense resistor plus part) and the current (through the sense resistor), and so the EMF
 * the generator actually makes: V_sense + V_part + I Z_source. Where that differs from the EMF asked
 * for by more than the generator's and digitizer's accuracies allow, or a trace is flat, stuck, at
 * the converter's limits, not a sine or at another frequency, the check fails, naming what it saw
 * and the driver key most likely wrong. The output is off again when it returns.
 */
public final class LevelCheck {
    /**
     * The probe's level as a fraction of the plan's amplitude: a driver slip of a factor 2 or 2.8
     * (Vpp for peak, rms for peak) drives at most 28 % of the plan's level, never above the ceiling.
     */
    public static final double FRACTION = 0.1;
    /**
     * A function generator's amplitude accuracy, setting to output: 2 % (makers state about 1 % of
     * setting plus a few millivolts at 1 kHz, and flatness over frequency adds to it; common
     * practice, no source).
     */
    static final double GENERATOR_ACCURACY = 0.02;
    /** The generator's output impedance is known to 10 % (common practice, no source). */
    static final double SOURCE_IMPEDANCE_TOLERANCE = 0.10;
    /** A frequency read from the record this far from the generator's says the time base is wrong. */
    static final double FREQUENCY_TOLERANCE = 0.01;
    /** A clipped probe is captured once more on ranges this many times wider. */
    static final double WIDER = 4;
    /** A channel with more than this share of its samples at the converter's limits is stuck there. */
    static final double STUCK_SHARE = 0.01;

    /** One thing the probe saw wrong, with the driver key most likely behind it. */
    public record Finding(String problem, String likelyKey) {
        @Override
        public String toString() {
            return problem + " (check " + likelyKey + ")";
        }
    }

    /**
     * What the probe found: the frequency and the peak EMF asked for, the peak EMF measured (NaN
     * when the traces could not give it), the relative difference the accuracies allow, and the
     * findings (empty when the level is proven).
     */
    public record Result(double frequencyHz, double askedVolt, double measuredVolt, double allowedRelative,
                         List<Finding> findings) {

        public boolean proven() {
            return findings.isEmpty();
        }

        /** One paragraph for a refusal: asked, measured, allowed, and each finding. */
        public String describe() {
            StringBuilder s = new StringBuilder(String.format(Locale.ROOT,
                    "level check at %s: asked %s peak EMF, measured %s (allowed +/- %.1f %%)",
                    Units.format(frequencyHz, Dimension.FREQUENCY), Units.format(askedVolt, Dimension.VOLTAGE),
                    Double.isFinite(measuredVolt) ? Units.format(measuredVolt, Dimension.VOLTAGE) : "nothing usable",
                    100 * allowedRelative));
            for (Finding f : findings) {
                s.append("; ").append(f);
            }
            return s.toString();
        }
    }

    private LevelCheck() {
    }

    /**
     * Plays the probe, captures both channels, switches the output off and judges what came back.
     *
     * @param sourceOhm the generator's output impedance
     */
    public static Result probe(Plan plan, Generator generator, Digitizer digitizer, BenchClock clock, double sourceOhm,
                               BenchAccuracy accuracy) {
        double f = plan.sweep().frequenciesHz().get(0);
        double asked = FRACTION * plan.sweep().amplitudeVolt();
        int cycles = Math.max(4, Math.min(plan.sweep().cycles(), 20));
        int samplesPerCycle = plan.sweep().samplesPerCycle();
        TimeBase.Request r = TimeBase.request(f, cycles, samplesPerCycle);
        double range = SweepRunner.START_RANGE_PER_PEAK * asked;
        Trace t1;
        Trace t2;
        try {
            // free running: a channel that reads nothing would never trigger, and the fit needs no trigger
            SweepRunner.prepareInputs(digitizer, TriggerSource.IMMEDIATE);
            digitizer.setTimingAndRanges(r.intervalSecond(), r.points(), range, range, new double[2]);
            generator.batch(() -> {
                generator.prepare();
                generator.setWaveform(Waveform.SINE);
                generator.setFrequency(f);
                generator.setAmplitude(asked);
                generator.setOffset(0.0);
                generator.outputOn();
            });
            long on = clock.nanoTime();
            clock.sleep(clock.remaining(Settle.seconds(plan.sweep(), plan.senseResistanceOhm(), null,
                    generator.frequencySettleSecond()), on));
            digitizer.acquire();
            t1 = digitizer.fetch(1);
            t2 = digitizer.fetch(2);
            if (clipped(t1) || clipped(t2)) {
                // far more than asked for, or garbage: a wider range tells which (the level is still a tenth)
                double wide1 = clipped(t1) ? WIDER * range : range;
                double wide2 = clipped(t2) ? WIDER * range : range;
                digitizer.setTimingAndRanges(r.intervalSecond(), r.points(), wide1, wide2, new double[2]);
                digitizer.acquire();
                t1 = digitizer.fetch(1);
                t2 = digitizer.fetch(2);
            }
        } finally {
            generator.outputOff();
        }
        return judge(plan, f, asked, t1, t2, sourceOhm, accuracy);
    }

    /** The traces of a probe judged: each channel on its own, then the EMF they give together. */
    static Result judge(Plan plan, double f, double asked, Trace t1, Trace t2, double sourceOhm,
                        BenchAccuracy accuracy) {
        List<Finding> findings = new ArrayList<>();
        boolean usable = channel(1, t1, f, findings) & channel(2, t2, f, findings);
        double allowed = GENERATOR_ACCURACY + 2 * accuracy.gainAccuracy() + accuracy.senseTolerance();
        double measured = Double.NaN;
        if (usable) {
            FixtureWiring w = plan.wiring();
            FixturePhasors.Result p = FixturePhasors.of(t1.volts(), t2.volts(), t1.intervalSecond(), f,
                    SweepRunner.attenuation(plan, 1), SweepRunner.attenuation(plan, 2), FixtureWiring.lowSide(w));
            Complex vs = SineFit.phasor(p.sense());
            Complex vp = SineFit.phasor(p.part());
            Complex current = vs.divide(plan.senseResistanceOhm());
            measured = vs.add(vp).add(current.multiply(sourceOhm)).abs();
            // what the source impedance's own tolerance and the noise leave open
            allowed += current.abs() * sourceOhm * SOURCE_IMPEDANCE_TOLERANCE / asked
                    + 3 * (noise(p.sense()) + noise(p.part())) / asked;
            if (Math.abs(measured / asked - 1) > allowed) {
                findings.add(new Finding(String.format(Locale.ROOT,
                        "the generator makes %.3g times the EMF asked for", measured / asked), likelyCause(measured / asked)));
            }
        }
        return new Result(f, asked, measured, allowed, List.copyOf(findings));
    }

    private static boolean clipped(Trace t) {
        return t.clippedSamples() > STUCK_SHARE * t.length();
    }

    /** The standard deviation of a fitted amplitude from its residual noise. */
    private static double noise(SineFitResult r) {
        return r.residualRms() * Math.sqrt(2.0 / Math.max(1, r.samples()));
    }

    /** Judges one channel on its own; false when its trace cannot give a level. */
    private static boolean channel(int ch, Trace t, double f, List<Finding> findings) {
        String name = "channel " + ch;
        if (t.length() < 8) {
            findings.add(new Finding(name + " returned " + t.length() + " samples", "fetch, trace_format"));
            return false;
        }
        if (t.peakToPeak() == 0) {
            findings.add(new Finding(String.format(Locale.ROOT, "%s reads a flat trace at %s", name,
                    Units.format(t.volts()[0], Dimension.VOLTAGE)), t.volts()[0] == 0
                    ? "scaling (the field positions count from 1; y_increment, scale_query)"
                    : "scaling (y_increment) and trace_format"));
            return false;
        }
        if (clipped(t)) {
            findings.add(new Finding(String.format(Locale.ROOT, "%s has %d of %d samples at the converter's limits",
                    name, t.clippedSamples(), t.length()),
                    "trace_format (byte order, signed or unsigned words), or the level is far above the one asked"
                            + " for (the generator's amplitude template: {amplitude_vpp} or {amplitude_vpk})"));
            return false;
        }
        SineFitResult fit = SineFit.fit(t.volts(), t.intervalSecond(), f);
        if (fit.amplitude() > 5 * fit.residualRms()) {
            return true; // a clean sine at the generator's frequency
        }
        // not a sine at f: a clean sine at another frequency says the time base is not what was read back
        double seen;
        SineFitResult there;
        try {
            FourParameterSineFit.Result four = FourParameterSineFit.fit(t.volts(), t.intervalSecond(),
                    FrequencyEstimate.peakHz(t.volts(), t.intervalSecond()));
            there = four.fit();
            seen = four.frequencyHz();
        } catch (RuntimeException noSine) {
            return true; // noise only: judged with the other channel, as the EMF
        }
        if (there.amplitude() > 5 * there.residualRms() && Math.abs(seen / f - 1) > FREQUENCY_TOLERANCE) {
            findings.add(new Finding(String.format(Locale.ROOT, "%s shows %s where the generator plays %s", name,
                    Units.format(seen, Dimension.FREQUENCY), Units.format(f, Dimension.FREQUENCY)),
                    "the digitizer's time base (timebase.setting, interval, interval_query) or the generator's"
                            + " frequency template"));
            return false;
        }
        // a channel with only noise is a reading too (no current through an open fixture, no voltage
        // across a short): the EMF the two give together is judged next
        return true;
    }

    /** The driver key a level off by this ratio points at first. */
    private static String likelyCause(double ratio) {
        if (ratio < 0.2 || ratio > 5) {
            return "far off any level convention: the digitizer's scaling (the field positions count from 1;"
                    + " y_increment, scale_query, full_scale_codes) or trace_format";
        }
        String all = "the generator's amplitude template ({amplitude_vpp} or {amplitude_vpk}), its load setting"
                + " (levels.referred_to, the prepare command's load), the digitizer's range convention"
                + " (vertical.setting) or scale (scaling: full_scale_codes, fields, scale_query), or the bench's"
                + " generator.output_impedance";
        if (Math.abs(ratio - 2) < 0.15 || Math.abs(ratio - 0.5) < 0.04) {
            return "a factor of 2: " + all;
        }
        if (Math.abs(ratio - 2 * Math.sqrt(2)) < 0.2 || Math.abs(ratio - Math.sqrt(2)) < 0.1) {
            return "a factor of sqrt 2 or 2 sqrt 2 (rms against peak): " + all;
        }
        return all;
    }
}
