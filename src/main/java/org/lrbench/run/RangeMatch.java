package org.lrbench.run;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.RangeLinks;
import org.lrbench.measure.PointResult;
import org.lrbench.uncertainty.BenchAccuracy;

/**
 * How well the channel match covers the range pairs a sweep used, and so what the budget keeps of the
 * channels' gain ratio: with no match, the bench's specifications; with a match whose range links
 * solve every pair used, the largest of those pairs' own standard uncertainties (and no bound for
 * other ranges); with pairs neither linked nor matched, the bench's bound for a gain ratio on other
 * ranges stays, and the pairs are named in a warning.
 */
record RangeMatch(ChannelMatch match, double linkedUncertainty, int linkedDegreesOfFreedom, List<String> unmatched,
                  double[] perPoint) {

    static RangeMatch of(ChannelMatch match, List<PointResult> points) {
        double[] each = new double[points.size()];
        if (match == null) {
            return new RangeMatch(null, 0, 0, List.of(), each);
        }
        double worst = 0;
        Set<String> unmatched = new LinkedHashSet<>();
        boolean anyLinked = false;
        for (int i = 0; i < points.size(); i++) {
            PointResult p = points.get(i);
            RangeLinks.Pair pair = match.linked(p.senseRangeVolt(), p.partRangeVolt());
            if (pair != null) {
                worst = Math.max(worst, pair.relativeUncertainty());
                each[i] = pair.relativeUncertainty();
                anyLinked = true;
            } else if (!match.measuredOn(p.senseRangeVolt(), p.partRangeVolt())) {
                unmatched.add(String.format(Locale.ROOT, "%.4g V / %.4g V", p.senseRangeVolt(), p.partRangeVolt()));
            }
        }
        int dof = anyLinked ? match.links().degreesOfFreedom() : 0;
        return new RangeMatch(match, worst, dof, new ArrayList<>(unmatched), each);
    }

    /** Whether every point's gain ratio is its own linked pair's. */
    boolean allLinked() {
        return linkedUncertainty > 0 && unmatched.isEmpty()
                && java.util.Arrays.stream(perPoint).allMatch(u -> u > 0);
    }

    /** Each point's pair's relative standard uncertainty when every point is linked, else zeros (one line covers them). */
    double[] perPointUncertainty() {
        return allLinked() ? perPoint.clone() : new double[perPoint.length];
    }

    /** The bench's accuracies as the match leaves them for this sweep. */
    BenchAccuracy accuracy(BenchAccuracy bench) {
        if (match == null) {
            return bench;
        }
        // every point on a linked pair: each point's own ratio is in force, known to its pair's u (a line of
        // its own, perPointUncertainty); otherwise one line, the larger of the match's and the links' u
        double gain = allLinked() ? 0 : Math.max(match.gainUncertainty(), linkedUncertainty);
        int points = allLinked() ? linkedDegreesOfFreedom + 1 : match.points();
        BenchAccuracy a = bench.afterChannelMatch(gain, match.skewUncertaintySecond(), points);
        return unmatched.isEmpty() ? a.withRangeGainMatch(0) : a;
    }

    /** A warning naming the pairs the match does not cover, or none. */
    List<String> warnings() {
        if (unmatched.isEmpty()) {
            return List.of();
        }
        return List.of("the channel match does not cover the range pair(s) " + String.join(", ", unmatched)
                + " (channel 1 / channel 2 full scale): U keeps the bench's bound for the gain ratio on other ranges;"
                + " lrbench calibrate with this plan links the ranges a sweep uses");
    }
}
