package org.lrbench.measure;

import java.util.HashSet;
import java.util.Set;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.plan.Plan;

/**
 * What the previous part of the same plan showed, kept while the instruments stay open for a lot
 * (a tray behind a switch): the first sweep point's impedance, the multisine record's and the
 * triangle capture's peaks. The
 * next part is ranged from them at once instead of from short ranging records; the auto-ranger
 * still judges every capture, so a part unlike the one before costs a capture again, never a wrong
 * range. The first point's settle is the plan's in full: the memory only chooses ranges. It also
 * keeps which time bases the digitizer granted as asked, so that those can go in the acquisition's
 * own message.
 */
public final class RangeMemory {
    private Plan plan;
    private ImpedancePoint firstPoint;
    private double[] trianglePeaks;
    private double[] multisinePeaks;
    /** Time bases the digitizer granted as asked (enough cycles and samples per cycle): the same instrument's. */
    private final Set<TimeBase.Request> grantedAsAsked = new HashSet<>();

    /** The previous part's first point under this plan, or null. */
    synchronized ImpedancePoint firstPoint(Plan p) {
        return p.equals(plan) ? firstPoint : null;
    }

    /** The previous part's triangle peaks (channel volts) under this plan, or null. */
    synchronized double[] trianglePeaks(Plan p) {
        return p.equals(plan) && trianglePeaks != null ? trianglePeaks.clone() : null;
    }

    /** The previous part's multisine record peaks (channel volts) and its samples per period under this plan, or null. */
    synchronized double[] multisinePeaks(Plan p) {
        return p.equals(plan) && multisinePeaks != null ? multisinePeaks.clone() : null;
    }

    /** Whether this time base was granted as asked before: it may then go with the acquisition. */
    synchronized boolean grantedAsAsked(TimeBase.Request r) {
        return grantedAsAsked.contains(r);
    }

    synchronized void rememberGranted(TimeBase.Request r) {
        grantedAsAsked.add(r);
    }

    synchronized void remember(Plan p, ImpedancePoint first, double[] triangle) {
        keyed(p);
        firstPoint = first;
        if (triangle != null) {
            trianglePeaks = triangle.clone();
        }
    }

    synchronized void rememberMultisine(Plan p, double[] peaks) {
        keyed(p);
        multisinePeaks = peaks.clone();
    }

    private void keyed(Plan p) {
        if (!p.equals(plan)) {
            plan = p;
            firstPoint = null;
            trianglePeaks = null;
            multisinePeaks = null;
        }
    }
}
