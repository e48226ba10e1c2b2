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
 * scale at the fixture), solved from readings of some pairs: each reading is ln G2(b) - ln G1(a)
 * with its standard uncertainty, and weighted least squares over all readings gives every channel's
 * ln gain on every range (one range of channel 1 held at 0: only ratios are seen), with their
 * covariance (scaled by the Birge ratio where the readings scatter more than their uncertainties
 * say; R. T. Birge, Phys. Rev. 40, 1932, from memory). A pair's ratio is then known with the
 * uncertainty of that difference, on pairs never read together too. Only ranges linked to the first
 * one through readings are solved.
 *
 * @param frequencyHz      the frequency of the readings
 * @param pairs            every pair solved
 * @param readings         how many readings went in
 * @param degreesOfFreedom readings less unknowns (at least 1)
 * @param unread           the pairs that could not be read, in words
 */
public record RangeLinks(String measuredAt, double frequencyHz, List<Pair> pairs, int readings, int degreesOfFreedom,
                         List<String> unread) {

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
        List<RangeLinkCapture.Reading> all = capture.readings();
        if (all.isEmpty()) {
            return null;
        }
        List<RangeLinkCapture.Reading> readings = connected(all);
        Map<Double, Integer> one = new LinkedHashMap<>();
        Map<Double, Integer> two = new LinkedHashMap<>();
        for (RangeLinkCapture.Reading r : readings) {
            one.putIfAbsent(r.senseRangeVolt(), one.size());
            two.putIfAbsent(r.partRangeVolt(), two.size());
        }
        // unknowns: ln G1 of every range but the first (held at 0), then ln G2 of every range
        int n = one.size() - 1 + two.size();
        int m = readings.size();
        RealMatrix normal = new Array2DRowRealMatrix(n, n);
        ArrayRealVector rhs = new ArrayRealVector(n);
        double[][] rows = new double[m][];
        for (int i = 0; i < m; i++) {
            RangeLinkCapture.Reading r = readings.get(i);
            double[] row = row(one, two, n, r.senseRangeVolt(), r.partRangeVolt());
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
        RealMatrix cov = new LUDecomposition(normal).getSolver().getInverse();
        double[] x = cov.operate(rhs.toArray());
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
        List<Pair> pairs = new ArrayList<>();
        for (double a : one.keySet()) {
            for (double b : two.keySet()) {
                double[] c = row(one, two, n, a, b);
                double y = 0;
                double v = 0;
                for (int i = 0; i < n; i++) {
                    y += c[i] * x[i];
                    for (int j = 0; j < n; j++) {
                        v += c[i] * cov.getEntry(i, j) * c[j];
                    }
                }
                pairs.add(new Pair(a, b, Math.exp(y), Math.sqrt(Math.max(0, v * scale))));
            }
        }
        List<String> unread = new ArrayList<>(capture.unread());
        if (readings.size() < all.size()) {
            unread.add((all.size() - readings.size()) + " reading(s) on ranges not linked to the others");
        }
        return new RangeLinks(measuredAt, capture.frequencyHz(), List.copyOf(pairs), m, Math.max(1, dof),
                List.copyOf(unread));
    }

    /** The design row of ln G2(b) - ln G1(a). */
    private static double[] row(Map<Double, Integer> one, Map<Double, Integer> two, int n, double a, double b) {
        double[] row = new double[n];
        int ia = one.get(a);
        if (ia > 0) {
            row[ia - 1] = -1;
        }
        row[one.size() - 1 + two.get(b)] = 1;
        return row;
    }

    /** The readings linked to the first one through shared ranges (the rest cannot be put on its scale). */
    private static List<RangeLinkCapture.Reading> connected(List<RangeLinkCapture.Reading> all) {
        java.util.Set<Double> one = new java.util.HashSet<>();
        java.util.Set<Double> two = new java.util.HashSet<>();
        one.add(all.get(0).senseRangeVolt());
        boolean grown = true;
        while (grown) {
            grown = false;
            for (RangeLinkCapture.Reading r : all) {
                boolean in = one.contains(r.senseRangeVolt()) || two.contains(r.partRangeVolt());
                if (in && (one.add(r.senseRangeVolt()) | two.add(r.partRangeVolt()))) {
                    grown = true;
                }
            }
        }
        return all.stream().filter(r -> one.contains(r.senseRangeVolt())).toList();
    }
}
