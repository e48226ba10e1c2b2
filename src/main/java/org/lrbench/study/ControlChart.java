package org.lrbench.study;

import java.util.List;
import java.util.Locale;

/**
 * The check standard's individuals control chart. Until the history holds {@code baseline}
 * readings, each reading is judged against the certificate by its normalized error
 * En = (x - certified) / sqrt(U_x^2 + U_cert^2), in control when |En| <= 1 (ISO 13528, from
 * memory). From then on the first {@code baseline} readings set the chart: centre their mean,
 * limits the centre +/- 2.66 times their mean moving range (3 / d2 with d2 = 1.128 for ranges of
 * two; NIST/SEMATECH e-Handbook of Statistical Methods, individuals charts, from memory), and a
 * reading is out of control beyond a limit or as the eighth in a row on one side of the centre
 * (the Western Electric run rule, from memory).
 */
public final class ControlChart {
    static final double E2 = 2.66;
    static final int RUN = 8;

    private ControlChart() {
    }

    /** One reading with its expanded uncertainty. */
    public record Reading(double value, double expandedUncertainty) {
    }

    /** The chart for the latest reading: centre, limits (NaN before a baseline), and the verdict with its reason. */
    public record State(double centre, double lower, double upper, boolean fromHistory, boolean inControl, String reason) {
    }

    public static State of(List<Reading> history, double certified, double certifiedExpanded, int baseline) {
        if (history.isEmpty()) {
            throw new IllegalArgumentException("no reading of the check standard yet");
        }
        Reading last = history.get(history.size() - 1);
        if (history.size() <= baseline) {
            double en = (last.value() - certified) / Math.hypot(last.expandedUncertainty(), certifiedExpanded);
            double half = Math.hypot(last.expandedUncertainty(), certifiedExpanded);
            boolean ok = Math.abs(en) <= 1;
            return new State(certified, certified - half, certified + half, false, ok, String.format(Locale.ROOT,
                    "against the certificate (%d of %d readings before the chart's own limits): En = %.2f%s",
                    history.size(), baseline, en, ok ? "" : ", beyond 1"));
        }
        double mean = 0;
        for (int i = 0; i < baseline; i++) {
            mean += history.get(i).value() / baseline;
        }
        double mr = 0;
        for (int i = 1; i < baseline; i++) {
            mr += Math.abs(history.get(i).value() - history.get(i - 1).value()) / (baseline - 1);
        }
        double lower = mean - E2 * mr;
        double upper = mean + E2 * mr;
        if (last.value() < lower || last.value() > upper) {
            return new State(mean, lower, upper, true, false, "the latest reading is beyond the control limits");
        }
        int n = history.size();
        if (n >= RUN) {
            int above = 0;
            int below = 0;
            for (int i = n - RUN; i < n; i++) {
                above += history.get(i).value() > mean ? 1 : 0;
                below += history.get(i).value() < mean ? 1 : 0;
            }
            if (above == RUN || below == RUN) {
                return new State(mean, lower, upper, true, false, "the latest " + RUN + " readings are all on one side of the centre");
            }
        }
        return new State(mean, lower, upper, true, true, "within the control limits of the first " + baseline + " readings");
    }
}
