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
 * channels' gain ratio: with no match, the bench's specifications; with a match, each point's own
 * gain ratio and its standard uncertainty, its linked pair's where the range links solve it, else the
 * match's (one line, all points moved together by their own amounts); and for the points on pairs
 * neither linked nor matched, the bench's bound for a gain ratio on other ranges, with the pairs named
 * in a warning.
 *
 * @param perPoint  each point's relative standard uncertainty of its gain ratio
 * @param uncovered 1 for each point on a pair neither linked nor matched, else 0
 */
record RangeMatch(ChannelMatch match, double[] perPoint, double[] uncovered, int degreesOfFreedom,
                  List<String> unmatched) {

    static RangeMatch of(ChannelMatch match, List<PointResult> points) {
        double[] each = new double[points.size()];
        double[] uncovered = new double[points.size()];
        if (match == null) {
            return new RangeMatch(null, each, uncovered, 0, List.of());
        }
        Set<String> unmatched = new LinkedHashSet<>();
        boolean anyLinked = false;
        for (int i = 0; i < points.size(); i++) {
            PointResult p = points.get(i);
            RangeLinks.Pair pair = match.linked(p.senseRangeVolt(), p.partRangeVolt());
            if (pair != null) {
                each[i] = pair.relativeUncertainty();
                anyLinked = true;
                continue;
            }
            each[i] = match.gainUncertainty();
            if (!match.measuredOn(p.senseRangeVolt(), p.partRangeVolt())) {
                uncovered[i] = 1;
                unmatched.add(String.format(Locale.ROOT, "%.4g V / %.4g V", p.senseRangeVolt(), p.partRangeVolt()));
            }
        }
        int dof = anyLinked ? Math.min(match.links().degreesOfFreedom(), Math.max(1, match.points() - 1))
                : Math.max(1, match.points() - 1);
        return new RangeMatch(match, each, uncovered, dof, new ArrayList<>(unmatched));
    }

    /** Each point's relative standard uncertainty of its gain ratio (zeros without a match: the specification's line). */
    double[] perPointUncertainty() {
        return perPoint.clone();
    }

    /** The points the bench's bound for other ranges moves, or null for all (no match). */
    double[] uncoveredPoints() {
        return match == null ? null : uncovered.clone();
    }

    /** The bench's accuracies as the match leaves them for this sweep. */
    BenchAccuracy accuracy(BenchAccuracy bench) {
        if (match == null) {
            return bench;
        }
        // each point's gain ratio is a line of its own (perPointUncertainty): no specification line
        BenchAccuracy a = bench.afterChannelMatch(0, match.skewUncertaintySecond(), degreesOfFreedom + 1);
        return unmatched.isEmpty() ? a.withRangeGainMatch(0) : a;
    }

    /** A warning naming the pairs the match does not cover, or none. */
    List<String> warnings() {
        if (unmatched.isEmpty()) {
            return List.of();
        }
        return List.of("the channel match does not cover the range pair(s) " + String.join(", ", unmatched)
                + " (channel 1 / channel 2 full scale): U keeps the bench's bound for the gain ratio on other ranges"
                + " for those points; lrbench calibrate with this plan links the ranges a sweep uses");
    }
}
