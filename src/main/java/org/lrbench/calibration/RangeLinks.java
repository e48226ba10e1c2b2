package org.lrbench.calibration;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.lrbench.measure.RangeLinkCapture;

/**
 * The channels' gain ratio G2(b) / G1(a) on every pair of ranges (a of channel 1, b of channel 2, full
 * scale at the fixture), solved from readings of some pairs: each reading is the difference of two ln
 * gains (channel 2's on b less channel 1's on a, or one channel's on two ranges) with its standard
 * uncertainty, and weighted least squares over all readings gives every channel's ln gain on every
 * range (the first range met held at 0: only ratios are seen), with their
 * covariance (scaled by the Birge ratio where the readings scatter more than their uncertainties
 * say; R. T. Birge, Phys. Rev. 40, 1932, from memory). A pair's ratio is then known with the
 * uncertainty of that difference, on pairs never read together too. Only ranges linked to the first
 * one through readings are solved.
 *
 * @param frequencyHz      the frequency of the readings
 * @param pairs            every pair solved
 * @param readings         every reading, as read (kept, so that more can be solved with them)
 * @param degreesOfFreedom readings less unknowns (at least 1)
 * @param unread           the pairs that could not be read, in words
 */
public record RangeLinks(String measuredAt, double frequencyHz, List<Pair> pairs,
                         List<RangeLinkCapture.Reading> readings, int degreesOfFreedom, List<String> unread) {

    /** One pair: its ranges at the fixture, peak-to-peak volts, the ratio and its relative standard uncertainty. */
    public record Pair(double senseRangeVolt, double partRangeVolt, double gainRatio, double relativeUncertainty) {
    }

    /** The pair on these ranges (to 1e-6), or null when it was not solved. */
    public Pair pair(double senseRangeVolt, double partRangeVolt) {
        if (pairs == null) {
            return null;
        }
        for (Pair p : pairs) {
            if (Math.abs(p.senseRangeVolt - senseRangeVolt) <= 1e-6 * senseRangeVolt
                    && Math.abs(p.partRangeVolt - partRangeVolt) <= 1e-6 * partRangeVolt) {
                return p;
            }
        }
        return null;
    }

    /** Solves the readings of a capture; null when there are none. */
    public static RangeLinks solve(String measuredAt, RangeLinkCapture.Result capture) {
        return solve(measuredAt, capture.frequencyHz(), capture.readings(), capture.unread());
    }

    /**
     * Solves readings of any kind (both channels on one signal, or one channel on two ranges); null when
     * there are none.
     */
    public static RangeLinks solve(String measuredAt, double frequencyHz, List<RangeLinkCapture.Reading> all,
                                   List<String> unreadBefore) {
        if (all.isEmpty()) {
            return null;
        }
        Solution sol = Solution.of(all);
        List<Pair> pairs = new ArrayList<>();
        for (double[] a : sol.nodes) {
            for (double[] b : sol.nodes) {
                if (a[0] != 1 || b[0] != 2) {
                    continue;
                }
                double[] c = row(sol.index, sol.n, 1, a[1], 2, b[1]);
                double y = 0;
                for (int i = 0; i < sol.n; i++) {
                    y += c[i] * sol.x[i];
                }
                double v = quadratic(c, sol.cov, c);
                pairs.add(new Pair(a[1], b[1], Math.exp(y), Math.sqrt(Math.max(0, v * sol.scale))));
            }
        }
        List<String> unread = new ArrayList<>(unreadBefore);
        if (sol.readings.size() < all.size()) {
            unread.add((all.size() - sol.readings.size()) + NOT_LINKED);
        }
        return new RangeLinks(measuredAt, frequencyHz, List.copyOf(pairs), List.copyOf(all), Math.max(1, sol.dof),
                List.copyOf(unread));
    }

    /** The weighted least-squares solution of the largest linked group of readings: ln G of every node but the first. */
    private record Solution(List<RangeLinkCapture.Reading> readings, Map<String, Integer> index, List<double[]> nodes,
                            int n, RealMatrix cov, double[] x, double scale, int dof) {

        static Solution of(List<RangeLinkCapture.Reading> all) {
            List<RangeLinkCapture.Reading> readings = connected(all);
            // unknowns: ln G of every (channel, range) but the first one met (held at 0)
            Map<String, Integer> index = new LinkedHashMap<>();
            List<double[]> nodes = new ArrayList<>();
            for (RangeLinkCapture.Reading r : readings) {
                for (double[] node : new double[][] {{r.channelA(), r.rangeA()}, {r.channelB(), r.rangeB()}}) {
                    if (index.putIfAbsent(key(node[0], node[1]), index.size()) == null) {
                        nodes.add(node);
                    }
                }
            }
            int n = index.size() - 1;
            int m = readings.size();
            RealMatrix normal = new Array2DRowRealMatrix(n, n);
            ArrayRealVector rhs = new ArrayRealVector(n);
            double[][] rows = new double[m][];
            for (int i = 0; i < m; i++) {
                RangeLinkCapture.Reading r = readings.get(i);
                double[] row = row(index, n, r.channelA(), r.rangeA(), r.channelB(), r.rangeB());
                rows[i] = row;
                double w = 1 / (r.relativeUncertainty() * r.relativeUncertainty());
                double y = Math.log(r.gainRatio());
                for (int a = 0; a < n; a++) {
                    if (row[a] == 0) {
                        continue;
                    }
                    rhs.addToEntry(a, w * row[a] * y);
                    for (int b = 0; b < n; b++) {
                        normal.addToEntry(a, b, w * row[a] * row[b]);
                    }
                }
            }
            RealMatrix cov = n == 0 ? new Array2DRowRealMatrix(0, 0) : new LUDecomposition(normal).getSolver().getInverse();
            double[] x = n == 0 ? new double[0] : cov.operate(rhs.toArray());
            double chi2 = 0;
            for (int i = 0; i < m; i++) {
                double fit = 0;
                for (int a = 0; a < n; a++) {
                    fit += rows[i][a] * x[a];
                }
                double d = (Math.log(readings.get(i).gainRatio()) - fit) / readings.get(i).relativeUncertainty();
                chi2 += d * d;
            }
            int dof = m - n;
            double scale = dof > 0 ? Math.max(1, chi2 / dof) : 1;
            return new Solution(readings, index, nodes, n, cov, x, scale, dof);
        }

        /** The design row of a pair's ln ratio (channel 1 on a, channel 2 on b), or null when either range is not solved. */
        double[] pairRow(double senseRangeVolt, double partRangeVolt) {
            double a = solved(1, senseRangeVolt);
            double b = solved(2, partRangeVolt);
            return Double.isNaN(a) || Double.isNaN(b) ? null : row(index, n, 1, a, 2, b);
        }

        /** The range as solved (to 1e-6), or NaN. */
        private double solved(int channel, double range) {
            for (double[] node : nodes) {
                if (node[0] == channel && Math.abs(node[1] - range) <= 1e-6 * range) {
                    return node[1];
                }
            }
            return Double.NaN;
        }
    }

    /**
     * The correlation of the gain ratios of these pairs (ranges at the fixture, channel 1 then channel 2), solved
     * again from the readings kept: pairs sharing a range, or linked through a chain of readings, err together.
     * Null where the readings are not kept or a pair is not solved by them (a caller then takes the pairs as
     * fully correlated, the larger of the possible sums).
     */
    public double[][] correlation(List<double[]> rangePairs) {
        if (readings == null || readings.isEmpty()) {
            return null;
        }
        Solution sol = Solution.of(readings);
        int k = rangePairs.size();
        double[][] rows = new double[k][];
        for (int i = 0; i < k; i++) {
            rows[i] = sol.pairRow(rangePairs.get(i)[0], rangePairs.get(i)[1]);
            if (rows[i] == null) {
                return null;
            }
        }
        double[][] c = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < k; j++) {
                c[i][j] = quadratic(rows[i], sol.cov, rows[j]);
            }
        }
        double[][] r = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < k; j++) {
                double d = Math.sqrt(c[i][i] * c[j][j]);
                // a pair known exactly (both ranges the first node's): no error to share
                r[i][j] = i == j ? 1 : d > 0 ? Math.max(-1, Math.min(1, c[i][j] / d)) : 0;
            }
        }
        return r;
    }

    private static double quadratic(double[] a, RealMatrix cov, double[] b) {
        double v = 0;
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < b.length; j++) {
                v += a[i] * cov.getEntry(i, j) * b[j];
            }
        }
        return v;
    }

    private static final String NOT_LINKED = " reading(s) on ranges not linked to the others";

    /** The same links with more readings, all solved again together. */
    public RangeLinks plus(String at, List<RangeLinkCapture.Reading> more, List<String> moreUnread) {
        List<RangeLinkCapture.Reading> all = new ArrayList<>(readings);
        all.addAll(more);
        // solved again, so the old count of readings left out is replaced by the new one
        List<String> notes = new ArrayList<>(unread.stream().filter(u -> !u.endsWith(NOT_LINKED)).toList());
        notes.addAll(moreUnread);
        return solve(at, frequencyHz, all, notes);
    }

    private static String key(double channel, double range) {
        return (int) channel + "@" + range;
    }

    /** The design row of ln G_B(rangeB) - ln G_A(rangeA); the first node has no column. */
    private static double[] row(Map<String, Integer> index, int n, int channelA, double rangeA, int channelB,
                                double rangeB) {
        double[] row = new double[n];
        int ia = index.get(key(channelA, rangeA));
        int ib = index.get(key(channelB, rangeB));
        if (ia > 0) {
            row[ia - 1] -= 1;
        }
        if (ib > 0) {
            row[ib - 1] += 1;
        }
        return row;
    }

    /**
     * The readings of the largest group linked through shared ranges (the most readings; the rest cannot
     * be put on its scale). A pair lost at the smallest ranges (clipped on noise) can leave one reading on
     * its own there; the group is never chosen by the order in which the pairs were read.
     */
    static List<RangeLinkCapture.Reading> connected(List<RangeLinkCapture.Reading> all) {
        List<RangeLinkCapture.Reading> best = List.of();
        java.util.Set<String> placed = new java.util.HashSet<>();
        for (RangeLinkCapture.Reading start : all) {
            if (placed.contains(key(start.channelA(), start.rangeA()))) {
                continue;
            }
            java.util.Set<String> seen = new java.util.HashSet<>();
            seen.add(key(start.channelA(), start.rangeA()));
            boolean grown = true;
            while (grown) {
                grown = false;
                for (RangeLinkCapture.Reading r : all) {
                    String a = key(r.channelA(), r.rangeA());
                    String b = key(r.channelB(), r.rangeB());
                    if ((seen.contains(a) || seen.contains(b)) && (seen.add(a) | seen.add(b))) {
                        grown = true;
                    }
                }
            }
            placed.addAll(seen);
            List<RangeLinkCapture.Reading> group = all.stream()
                    .filter(r -> seen.contains(key(r.channelA(), r.rangeA()))).toList();
            if (group.size() > best.size()) {
                best = group;
            }
        }
        return best;
    }
}
