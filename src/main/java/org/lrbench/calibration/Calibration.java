package org.lrbench.calibration;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.ImpedancePoint;

/**
 * The corrections in force on a bench: the channel match (or null) and the fixture compensation
 * (or null). Applied to every measured point before the model fit: Z / H(f) first, then the
 * open/short correction. A point's uncertainty is carried through both, with the short reading's
 * own uncertainty added where the short is subtracted.
 */
public record Calibration(ChannelMatch channels, FixtureCompensation fixture) {

    public static final Calibration NONE = new Calibration(null, null);

    public List<ImpedancePoint> apply(List<ImpedancePoint> points) {
        return points.stream().map(this::apply).toList();
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
            z = z.divide(channels.ratio(frequencyHz));
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
        var z = p.impedanceOhm();
        double u = p.componentUncertaintyOhm();
        if (channels != null) {
            var ratio = channels.ratio(p.frequencyHz());
            z = z.divide(ratio);
            u = u / ratio.abs();
        }
        if (fixture != null) {
            double carried = fixture.uncertainty(p.frequencyHz(), z, u);
            z = fixture.correct(p.frequencyHz(), z);
            u = carried;
        }
        return new ImpedancePoint(p.frequencyHz(), z, u, p.currentAmpere());
    }
}
