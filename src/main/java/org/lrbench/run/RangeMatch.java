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
 * match's; how the points' gain ratios err together (pairs solved from the same readings share their
 * errors as the links' least-squares solution says; points on the match's own ratio share one number;
 * the two kinds are taken as independent: the match's readings enter the links too, but how much of
 * the match's own ratio a linked pair shares is not kept, and a point on a pair no link solved is
 * rare, a pair no signal could fill); and for the points on pairs
 * neither linked nor matched, the bench's bound for a gain ratio on other ranges, with the pairs named
 * in a warning.
 *
 * @param covariance the relative covariance of the points' gain ratios (all 0 without a match)
 * @param uncovered  1 for each point on a pair neither linked nor matched, else 0
 */
record RangeMatch(ChannelMatch match, double[][] covariance, double[] uncovered, int degreesOfFreedom,
                  List<String> unmatched) {

    static RangeMatch of(ChannelMatch match, List<PointResult> points) {
        double[] each = new double[points.size()];
        double[] uncovered = new double[points.size()];
        if (match == null) {
            return new RangeMatch(null, new double[points.size()][points.size()], uncovered, 0, List.of());
        }
        Set<String> unmatched = new LinkedHashSet<>();
        boolean anyLinked = false;
        // each point's linked pair's index in the list of distinct pairs, or -1 on the match's own ratio
        int[] pairOf = new int[points.size()];
        List<double[]> distinct = new ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            PointResult p = points.get(i);
            RangeLinks.Pair pair = match.linked(p.senseRangeVolt(), p.partRangeVolt());
            pairOf[i] = -1;
            if (pair != null) {
                each[i] = pair.relativeUncertainty();
                anyLinked = true;
                pairOf[i] = indexOf(distinct, pair);
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
        double[][] rho = anyLinked ? match.links().correlation(distinct) : null;
        double[][] cov = new double[points.size()][points.size()];
        for (int i = 0; i < cov.length; i++) {
            for (int j = 0; j < cov.length; j++) {
                double r;
                if (pairOf[i] < 0 || pairOf[j] < 0) {
                    r = pairOf[i] == pairOf[j] ? 1 : 0;
                } else {
                    // readings not kept: fully correlated, the larger of the possible sums
                    r = rho == null ? 1 : rho[pairOf[i]][pairOf[j]];
                }
                cov[i][j] = each[i] * each[j] * r;
            }
        }
        return new RangeMatch(match, cov, uncovered, dof, new ArrayList<>(unmatched));
    }

    private static int indexOf(List<double[]> distinct, RangeLinks.Pair pair) {
        for (int k = 0; k < distinct.size(); k++) {
            if (distinct.get(k)[0] == pair.senseRangeVolt() && distinct.get(k)[1] == pair.partRangeVolt()) {
                return k;
            }
        }
        distinct.add(new double[] {pair.senseRangeVolt(), pair.partRangeVolt()});
        return distinct.size() - 1;
    }

    /** The relative covariance of the points' gain ratios (zeros without a match: the specification's line). */
    double[][] pointCovariance() {
        double[][] out = new double[covariance.length][];
        for (int i = 0; i < out.length; i++) {
            out[i] = covariance[i].clone();
        }
        return out;
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
