package org.lrbench.driver;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.plan.Plan;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Whether a plan asks of the bench's instruments no more than their drivers declare: every sweep
 * and triangle frequency within the generator's range, the peak EMF within its amplitude, and the
 * sample interval and record length each frequency needs within the digitizer's.
 */
public final class PlanFit {

    private PlanFit() {
    }

    /** One sentence per thing the plan asks that a driver says its instrument cannot do. */
    public static List<String> problems(Plan plan, DriverFile source, DriverFile digitizer) {
        List<String> out = new ArrayList<>();
        InstrumentLimits g = source.limits();
        List<double[]> asks = new ArrayList<>();   // {frequency, cycles, samples per cycle}
        for (double f : plan.sweep().frequenciesHz()) {
            asks.add(new double[] {f, plan.sweep().cycles(), plan.sweep().samplesPerCycle()});
        }
        if (plan.triangle() != null) {
            asks.add(new double[] {plan.triangle().frequencyHz(), plan.triangle().cycles(), plan.triangle().samplesPerCycle()});
        }
        String gen = "generator driver " + source.name() + " (" + source.source() + ")";
        String dig = "digitizer driver " + digitizer.name() + " (" + digitizer.source() + ")";
        for (double[] a : asks) {
            if (g.minFrequencyHz() != null && a[0] < g.minFrequencyHz()) {
                out.add(plan.source() + ": " + hz(a[0]) + " is below the " + hz(g.minFrequencyHz()) + " that the " + gen
                        + " declares");
            }
            if (g.maxFrequencyHz() != null && a[0] > g.maxFrequencyHz()) {
                out.add(plan.source() + ": " + hz(a[0]) + " is above the " + hz(g.maxFrequencyHz()) + " that the " + gen
                        + " declares");
            }
        }
        double peak = plan.sweep().amplitudeVolt() + Math.abs(plan.sweep().offsetVolt());
        if (plan.triangle() != null) {
            peak = Math.max(peak, plan.triangle().amplitudeVolt());
        }
        if (g.maxEmfPeakVolt() != null && peak > g.maxEmfPeakVolt() * (1 + 1e-12)) {
            out.add(plan.source() + ": a peak EMF of " + Units.format(peak, Dimension.VOLTAGE) + " is above the "
                    + Units.format(g.maxEmfPeakVolt(), Dimension.VOLTAGE) + " that the " + gen + " declares");
        }
        InstrumentLimits d = digitizer.limits();
        for (double[] a : asks) {
            double interval = 1 / (a[0] * a[2]);
            if (d.minIntervalSecond() != null && interval < d.minIntervalSecond() * (1 - 1e-9)) {
                out.add(String.format(Locale.ROOT, "%s: at %s the plan's %d samples per cycle need %s between samples;"
                                + " the %s declares %s at the shortest", plan.source(), hz(a[0]), (int) a[2],
                        Units.format(interval, Dimension.TIME), dig, Units.format(d.minIntervalSecond(), Dimension.TIME)));
            }
            long samples = (long) a[1] * (long) a[2] + 2;
            if (d.maxRecordLength() != null && samples > d.maxRecordLength()) {
                out.add(String.format(Locale.ROOT, "%s: at %s the plan's %d cycles of %d samples need a record of %d;"
                        + " the %s declares %d at the longest", plan.source(), hz(a[0]), (int) a[1], (int) a[2], samples,
                        dig, d.maxRecordLength()));
            }
        }
        return out;
    }

    private static String hz(double f) {
        return Units.format(f, Dimension.FREQUENCY);
    }
}
