package org.lrbench.calibration;

import java.util.List;
import java.util.function.UnaryOperator;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.fixture.FixtureWiring;

/**
 * The corrections in force on a bench: the channel match (or null) and the fixture compensation
 * (or null). Applied to every measured point before the model fit: Z / H(f) first, then the
 * open/short correction. A point's uncertainty is carried through both, with the short reading's
 * own uncertainty added where the short is subtracted.
 * <p>
 * With low-side wiring ({@code lowSideSenseOhm} above 0) channel 2 sees the part and the sense
 * resistor, and the part's voltage is channel 2 less channel 1: channel 2's response must be taken
 * out before the difference. As Z_m = R_s (V2 - V1) / V1, that is Z = (Z_m + R_s) / H - R_s.
 */
public record Calibration(ChannelMatch channels, FixtureCompensation fixture, double lowSideSenseOhm,
                          SenseTrace sense) {

    public static final Calibration NONE = new Calibration(null, null);

    /** Corrections for differential wiring. */
    public Calibration(ChannelMatch channels, FixtureCompensation fixture) {
        this(channels, fixture, 0, null);
    }

    /** Corrections without a traced sense resistor. */
    public Calibration(ChannelMatch channels, FixtureCompensation fixture, double lowSideSenseOhm) {
        this(channels, fixture, lowSideSenseOhm, null);
    }

    /** The same corrections with the sense resistor traced by the meter (null: its nominal). */
    public Calibration withSense(SenseTrace s) {
        return new Calibration(channels, fixture, lowSideSenseOhm, s);
    }

    /** The same corrections for a fixture wired low side with this sense resistor (0: differential). */
    public Calibration forLowSide(double senseOhm) {
        return new Calibration(channels, fixture, senseOhm, sense);
    }

    /** These corrections for a plan's fixture wiring (null: differential, unity probes). */
    public Calibration forWiring(FixtureWiring wiring) {
        return FixtureWiring.lowSide(wiring) ? forLowSide(wiring.senseOhm())
                : forLowSide(0);
    }

    /** Z divided by channel 2's response as the wiring needs it (ranges NaN: the match's own gain ratio). */
    private Complex matched(double frequencyHz, Complex z, double senseRangeVolt, double partRangeVolt) {
        var ratio = Double.isNaN(senseRangeVolt) ? channels.ratio(frequencyHz)
                : channels.ratio(frequencyHz, senseRangeVolt, partRangeVolt);
        return lowSideSenseOhm > 0 ? z.add(lowSideSenseOhm).divide(ratio).subtract(lowSideSenseOhm) : z.divide(ratio);
    }

    public List<ImpedancePoint> apply(List<ImpedancePoint> points) {
        return points.stream().map(this::apply).toList();
    }

    /**
     * Points each read on its own ranges ({sense, part} full scale at the fixture, one pair per point):
     * channel 2's response is the one of each point's pair where the match's range links cover it.
     */
    public List<ImpedancePoint> apply(List<ImpedancePoint> points, List<double[]> ranges) {
        List<ImpedancePoint> out = new java.util.ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            out.add(apply(points.get(i), ranges.get(i)[0], ranges.get(i)[1]));
        }
        return List.copyOf(out);
    }

    /**
     * A series resistance and inductance measured directly at {@code frequencyHz} (the triangle
     * check), corrected like the sweep: divided by channel 2's response at that frequency, then the
     * leads of the short reading nearest in frequency subtracted. Returns {R, L}.
     */
    public double[] correctSeries(double frequencyHz, double resistanceOhm, double inductanceHenry) {
        double omega = 2 * Math.PI * frequencyHz;
        var z = new Complex(resistanceOhm, omega * inductanceHenry);
        if (channels != null) {
            z = matched(frequencyHz, z, Double.NaN, Double.NaN);
        }
        double r = z.getReal();
        double l = z.getImaginary() / omega;
        if (fixture != null) {
            double[] lead = fixture.shortSeriesNear(frequencyHz);
            r -= lead[0];
            l -= lead[1];
        }
        return new double[] {r, l};
    }

    public ImpedancePoint apply(ImpedancePoint p) {
        return apply(p, Double.NaN, Double.NaN);
    }

    private ImpedancePoint apply(ImpedancePoint p, double senseRangeVolt, double partRangeVolt) {
        ImpedancePoint q = p;
        if (channels != null) {
            // matched(z) is holomorphic in z: its derivative turns and scales the covariance
            Complex z = matched(p.frequencyHz(), p.impedanceOhm(), senseRangeVolt, partRangeVolt);
            q = p.corrected(z, slope(x -> matched(p.frequencyHz(), x, senseRangeVolt, partRangeVolt),
                    p.impedanceOhm()), 0);
        }
        if (fixture != null) {
            Complex z = q.impedanceOhm();
            double u = q.componentUncertaintyOhm();
            Complex slope = slope(x -> fixture.correct(p.frequencyHz(), x), z);
            // what the short and open readings add, beyond the measured point's own carried through
            double carried = fixture.uncertainty(p.frequencyHz(), z, u);
            double own = slope.abs() * u;
            q = q.corrected(fixture.correct(p.frequencyHz(), z), slope, Math.max(0, carried * carried - own * own));
        }
        return q;
    }

    /** The derivative of a holomorphic correction at z, by a central difference along the real axis. */
    private static Complex slope(UnaryOperator<Complex> f, Complex z) {
        double h = Math.max(1e-12, 1e-6 * z.abs());
        return f.apply(z.add(h)).subtract(f.apply(z.subtract(h))).divide(2 * h);
    }

    /**
     * Which corrections are in force, when they were measured and with which plan, in one line for
     * the console, the record and the operator's page; with none, that U includes the bench's bounds.
     */
    public String inForce() {
        if (channels == null && fixture == null && sense == null) {
            return "no corrections in force: U includes the fixture's and the channels' bench bounds (lrbench"
                    + " calibrate measures them)";
        }
        return "corrections in force: channel match " + (channels == null ? "none" : "of " + channels.measuredAt())
                + ", fixture short/open " + (fixture == null ? "none (U includes the fixture's bench bounds)"
                : "of " + fixture.measuredAt() + (fixture.plan() == null ? "" : " (measured with " + fixture.plan() + ")"))
                + ", sense resistor " + (sense == null ? "nominal (its tolerance in U; no meter reading)"
                : String.format(java.util.Locale.ROOT, "%.6g ohm +/- %.2g ohm traced on %s", sense.valueOhm(),
                sense.standardUncertaintyOhm(), sense.measuredAt()));
    }
}
