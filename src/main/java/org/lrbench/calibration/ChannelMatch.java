package org.lrbench.calibration;

import java.util.List;
import org.apache.commons.math3.complex.Complex;

/**
 * The digitizer's channel match: with both channels across the same node, the measured ratio
 * H(f) = V2 / V1 should be 1. Its magnitude gives channel 2's gain against channel 1 (a weighted
 * mean over the frequencies), its phase the time skew tau from the least-squares line through the
 * origin of phase against -2 pi f. Corrected readings divide V2 by g exp(-j 2 pi f tau). The
 * standard uncertainties come from the scatter of the points about these two numbers.
 */
public record ChannelMatch(String measuredAt, double gainRatio, double gainUncertainty, double skewSecond,
                           double skewUncertaintySecond, int points, List<double[]> rangePairs, RangeLinks links) {

    /** A match without range links (kept before they were measured). */
    public ChannelMatch(String measuredAt, double gainRatio, double gainUncertainty, double skewSecond,
                        double skewUncertaintySecond, int points, List<double[]> rangePairs) {
        this(measuredAt, gainRatio, gainUncertainty, skewSecond, skewUncertaintySecond, points, rangePairs, null);
    }

    /** A match whose ranges were not recorded (kept before they were): every range pair counts as other. */
    public ChannelMatch(String measuredAt, double gainRatio, double gainUncertainty, double skewSecond,
                        double skewUncertaintySecond, int points) {
        this(measuredAt, gainRatio, gainUncertainty, skewSecond, skewUncertaintySecond, points, List.of());
    }

    /** The same match with the {channel 1, channel 2} full-scale ranges (volts at the fixture) it was measured on. */
    public ChannelMatch withRangePairs(List<double[]> pairs) {
        return new ChannelMatch(measuredAt, gainRatio, gainUncertainty, skewSecond, skewUncertaintySecond, points,
                List.copyOf(pairs), links);
    }

    /** The same match with the gain ratio on every range pair the links solved. */
    public ChannelMatch withLinks(RangeLinks l) {
        return new ChannelMatch(measuredAt, gainRatio, gainUncertainty, skewSecond, skewUncertaintySecond, points,
                rangePairs, l);
    }

    /** The linked pair on these ranges (full scale at the fixture), or null when the links do not cover it. */
    public RangeLinks.Pair linked(double senseRangeVolt, double partRangeVolt) {
        return links == null ? null : links.pair(senseRangeVolt, partRangeVolt);
    }

    /**
     * The correction factor H(f) for a point read on these ranges: the linked pair's gain ratio where
     * the links cover it, else the match's own; the skew's phase either way.
     */
    public Complex ratio(double frequencyHz, double senseRangeVolt, double partRangeVolt) {
        RangeLinks.Pair p = linked(senseRangeVolt, partRangeVolt);
        double g = p == null ? gainRatio : p.gainRatio();
        double phase = -2 * Math.PI * frequencyHz * skewSecond;
        return new Complex(g * Math.cos(phase), g * Math.sin(phase));
    }

    /** Whether the match was measured with the channels on these ranges (to 1e-6). */
    public boolean measuredOn(double range1, double range2) {
        return rangePairs != null && rangePairs.stream().anyMatch(r -> Math.abs(r[0] - range1) <= 1e-6 * range1
                && Math.abs(r[1] - range2) <= 1e-6 * range2);
    }

    /**
     * Fits gain and skew to measured ratios at their frequencies, each point weighted alike: the
     * mean magnitude and the least-squares slope of the phase, their standard uncertainties from the
     * points' scatter with n - 1 degrees of freedom.
     */
    public static ChannelMatch fit(String measuredAt, double[] frequencyHz, List<Complex> ratio) {
        int n = frequencyHz.length;
        if (n < 2) {
            throw new IllegalArgumentException("a channel match needs at least 2 frequencies");
        }
        double sumG = 0;
        double sumW2 = 0;
        double sumWPhi = 0;
        for (int i = 0; i < n; i++) {
            sumG += ratio.get(i).abs();
            double w = -2 * Math.PI * frequencyHz[i];
            sumW2 += w * w;
            sumWPhi += w * ratio.get(i).getArgument();
        }
        double g = sumG / n;
        double tau = sumWPhi / sumW2;
        double rg = 0;
        double rp = 0;
        for (int i = 0; i < n; i++) {
            double dg = ratio.get(i).abs() - g;
            double dp = ratio.get(i).getArgument() - (-2 * Math.PI * frequencyHz[i] * tau);
            rg += dg * dg;
            rp += dp * dp;
        }
        return new ChannelMatch(measuredAt, g, Math.sqrt(rg / (n - 1) / n), tau, Math.sqrt(rp / (n - 1) / sumW2), n);
    }

    /**
     * Fits gain and skew to measured ratios at their frequencies: the gain a mean of the magnitudes
     * weighted by the inverse square of each ratio's relative standard uncertainty (a point on a
     * range where the signal is small counts for little), its standard uncertainty the larger of what
     * the points' own uncertainties give and what their scatter gives (the Birge ratio,
     * sqrt(chi^2 / (n - 1)), when above 1; R. T. Birge, Phys. Rev. 40, 1932, from memory), with
     * n - 1 degrees of freedom; the skew the weighted least-squares line through the origin of
     * phase against -2 pi f, each point's phase uncertainty its relative uncertainty, with its
     * standard uncertainty found the same way (an unweighted slope follows the noisiest point, the
     * highest frequency with the least signal: on the coverage benchmark's 22 mH part it erred by
     * five times the uncertainty its scatter gave).
     */
    public static ChannelMatch fit(String measuredAt, double[] frequencyHz, List<Complex> ratio, double[] relativeU) {
        return fit(measuredAt, frequencyHz, ratio, relativeU, relativeU);
    }

    /**
     * As above, each point's phase with its own standard uncertainty {@code phaseU} (radians) where it
     * differs from the magnitude's relative one: a converter's quantization correction scales a fitted
     * sine's amplitude and leaves its phase alone, so its uncertainty belongs to the gain only (counted in
     * the phase too, it overstated the skew's uncertainty 1.6 times once records were long).
     */
    public static ChannelMatch fit(String measuredAt, double[] frequencyHz, List<Complex> ratio, double[] relativeU,
                                   double[] phaseU) {
        ChannelMatch alike = fit(measuredAt, frequencyHz, ratio);
        int n = frequencyHz.length;
        // the gain: the weighted mean of the magnitudes; the skew: the weighted least-squares line
        // through the origin of phase against omega = -2 pi f, each point's phase uncertainty its
        // relative uncertainty (radians)
        double sw = 0;
        double sumG = 0;
        double swo = 0;
        double swop = 0;
        for (int i = 0; i < n; i++) {
            double u = relativeU[i];
            if (u > 0 && Double.isFinite(u)) {
                double w = 1 / (u * u);
                sw += w;
                sumG += w * ratio.get(i).abs();
            }
            double up = phaseU[i];
            if (up > 0 && Double.isFinite(up)) {
                double wp = 1 / (up * up);
                double omega = -2 * Math.PI * frequencyHz[i];
                swo += wp * omega * omega;
                swop += wp * omega * ratio.get(i).getArgument();
            }
        }
        if (!(sw > 0) || !(swo > 0)) {
            return alike;
        }
        double g = sumG / sw;
        double tau = swop / swo;
        double chiG = 0;
        double chiP = 0;
        for (int i = 0; i < n; i++) {
            double u = relativeU[i];
            if (u > 0 && Double.isFinite(u)) {
                double dg = (ratio.get(i).abs() / g - 1) / u;
                chiG += dg * dg;
            }
            double up = phaseU[i];
            if (up > 0 && Double.isFinite(up)) {
                double dp = (ratio.get(i).getArgument() + 2 * Math.PI * frequencyHz[i] * tau) / up;
                chiP += dp * dp;
            }
        }
        // weights of relative u: the internal uncertainty 1 / sqrt(sum w) is relative
        double ug = g / Math.sqrt(sw) * Math.max(1, Math.sqrt(chiG / (n - 1)));
        double uTau = 1 / Math.sqrt(swo) * Math.max(1, Math.sqrt(chiP / (n - 1)));
        return new ChannelMatch(measuredAt, g, ug, tau, uTau, n);
    }

    /** The correction factor H(f) that a measured Z is divided by. */
    public Complex ratio(double frequencyHz) {
        double phase = -2 * Math.PI * frequencyHz * skewSecond;
        return new Complex(gainRatio * Math.cos(phase), gainRatio * Math.sin(phase));
    }
}
