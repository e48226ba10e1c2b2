package org.lrbench.calibration;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * What a bench's corrections can physically be, checked before they are kept: a calibration made
 * with the wiring never changed (the operator pressed Enter at every prompt) measures the part, not
 * the channels, the short or the open, and must not be believed.
 */
public final class Plausibility {
    /**
     * A short's resistance above 1 ohm is no shorting bar (a bar and a fixture's leads are tens of
     * milliohms; common practice, no source).
     */
    static final double SHORT_MAX_OHM = 1.0;
    /** A short's inductance above 2 uH is no shorting bar (leads are about 1 uH per metre; common practice, no source). */
    static final double SHORT_MAX_HENRY = 2e-6;
    /** An open fixture's stray capacitance above 200 pF is no open (common practice, no source). */
    static final double OPEN_MAX_FARAD = 200e-12;
    /** An open fixture's leakage above 10 uS (below 100 kohm) is no open (common practice, no source). */
    static final double OPEN_MAX_SIEMENS = 1e-5;
    /**
     * An open reading below 1 kohm is a part, not an empty fixture: a bench resolves an open far less
     * well than that at low frequencies, where noise decides its reading (common practice, no source).
     */
    static final double OPEN_MIN_OHM = 1e3;
    /**
     * How many standard uncertainties a reading may stray past a bound: 5, so that a good bench is
     * refused less than once in a million points (a normal tail; at 3 the coverage benchmark saw a good
     * calibration refused for a 0.02 degree phase); miswiring is off by far more.
     */
    static final double COVERAGE = 5;

    private Plausibility() {
    }

    /**
     * The channel match against the bench's declared accuracies: each channel's gain within its
     * accuracy (so their ratio within twice it) and the skew within the declared skew plus two of the
     * finest sample intervals used; an empty list when it is plausible.
     */
    public static List<String> channelMatch(ChannelMatch m, double[] frequencyHz, List<Complex> ratio,
                                            double[] relativeUncertainty, BenchAccuracy accuracy,
                                            double finestIntervalSecond) {
        List<String> out = new ArrayList<>();
        double skewLimit = accuracy.skewSecond() + 2 * finestIntervalSecond;
        // point by point, each against its own measurement uncertainty: a fit through readings of a
        // part has a large scatter that would otherwise widen its own limits
        for (int i = 0; i < frequencyHz.length; i++) {
            double u = COVERAGE * relativeUncertainty[i];
            double gain = ratio.get(i).abs();
            double phaseLimit = 2 * Math.PI * frequencyHz[i] * skewLimit + u;
            String at = " at " + Units.format(frequencyHz[i], Dimension.FREQUENCY);
            if (!(Math.abs(gain - 1) <= 2 * accuracy.gainAccuracy() + u)) {
                out.add(String.format(Locale.ROOT, "channel 2 reads %.4f of channel 1%s, where the channels' accuracies"
                        + " (%.1f %% each) allow 1 +/- %.4f (fitted over the sweep: gain %.4f, skew %s)", gain, at,
                        100 * accuracy.gainAccuracy(), 2 * accuracy.gainAccuracy() + u, m.gainRatio(),
                        Units.format(m.skewSecond(), Dimension.TIME)));
                break;
            }
            if (!(Math.abs(ratio.get(i).getArgument()) <= phaseLimit)) {
                out.add(String.format(Locale.ROOT, "channel 2 is %.2f degrees off channel 1%s, where the declared skew and"
                        + " two sample intervals (%s) allow %.2f (fitted over the sweep: skew %s)",
                        Math.toDegrees(ratio.get(i).getArgument()), at, Units.format(skewLimit, Dimension.TIME),
                        Math.toDegrees(phaseLimit), Units.format(m.skewSecond(), Dimension.TIME)));
                break;
            }
        }
        return out;
    }

    /** The short and the open at every frequency where they were read; an empty list when plausible. */
    public static List<String> fixture(FixtureCompensation f) {
        List<String> out = new ArrayList<>();
        // the short over the whole sweep, so that one noisy point decides nothing: its resistance as the
        // median reading, its inductance as the least-squares slope of X against w (weights the high
        // frequencies, where a short reads best)
        double[] r = f.points().stream().mapToDouble(FixtureCompensation.Point::shortReal).sorted().toArray();
        double median = r.length % 2 == 1 ? r[r.length / 2] : (r[r.length / 2 - 1] + r[r.length / 2]) / 2;
        double sxw = 0;
        double sww = 0;
        double suu = 0;
        double uMin = Double.POSITIVE_INFINITY;
        for (FixtureCompensation.Point p : f.points()) {
            double omega = 2 * Math.PI * p.frequencyHz();
            double u = p.shortUncertaintyOhm() == null ? 0 : p.shortUncertaintyOhm();
            sxw += omega * p.shortImag();
            sww += omega * omega;
            suu += omega * omega * u * u;
            uMin = Math.min(uMin, u);
        }
        double henry = sxw / sww;
        double uHenry = Math.sqrt(suu) / sww;
        if (median > SHORT_MAX_OHM + COVERAGE * uMin || henry > SHORT_MAX_HENRY + COVERAGE * uHenry) {
            out.add("the short reads " + Units.format(median, Dimension.RESISTANCE) + " and "
                    + Units.format(henry, Dimension.INDUCTANCE) + " over the sweep, where a shorting bar is below "
                    + Units.format(SHORT_MAX_OHM, Dimension.RESISTANCE) + " and "
                    + Units.format(SHORT_MAX_HENRY, Dimension.INDUCTANCE));
        }
        // the open, read where the bench could read it: refused when most of those readings are a part
        int readable = 0;
        int low = 0;
        String first = null;
        for (FixtureCompensation.Point p : f.points()) {
            if (Double.isNaN(p.openReal()) || Boolean.TRUE.equals(p.openModelled())) {
                continue;
            }
            readable++;
            double omega = 2 * Math.PI * p.frequencyHz();
            Complex z = new Complex(p.openReal(), p.openImag()).subtract(p.shortZ());
            // the open's own reading uncertainty in ohm (kept as that of its admittance, u_Y = u_Z / |Z|^2)
            double uz = p.openAdmittanceUncertainty() == null ? 0 : p.openAdmittanceUncertainty() * z.abs() * z.abs();
            // an empty fixture's impedance is at least that of the largest stray and leakage it may have;
            // where that is beyond what the bench can resolve (a reading lost in noise), at least 1 kohm
            double least = Math.min(1 / Math.hypot(OPEN_MAX_SIEMENS, omega * OPEN_MAX_FARAD), OPEN_MIN_OHM);
            if (z.abs() + COVERAGE * uz < least) {
                low++;
                if (first == null) {
                    first = "the open reads only " + Units.format(z.getReal(), Dimension.RESISTANCE) + " + j "
                            + Units.format(z.getImaginary(), Dimension.RESISTANCE) + " above the short at "
                            + Units.format(p.frequencyHz(), Dimension.FREQUENCY) + ", where an empty fixture reads at"
                            + " least " + Units.format(least, Dimension.RESISTANCE) + " (" + Units.format(OPEN_MAX_FARAD,
                            Dimension.CAPACITANCE) + " and " + Units.format(1 / OPEN_MAX_SIEMENS, Dimension.RESISTANCE)
                            + " of leakage at most, read to 1 kohm)";
                }
            }
        }
        if (readable > 0 && 2 * low > readable) {
            out.add(first + "; " + low + " of " + readable + " readable frequencies read so");
        }
        return out;
    }
}
