package org.lrbench.measure;

import java.util.List;
import java.util.concurrent.CompletableFuture;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.plan.Plan;

/**
 * A multisine's record fitted on a thread of its own while the instruments go on to the triangle
 * check: the tones' fits (tens of milliseconds on a long record) overlap the triangle's settle and
 * capture, as each stepped point's analysis overlaps the next point's settle ({@link PointWork}).
 * The points are reported to the listener and handed to the after-sweep stage from that thread, in
 * tone order, once every tone is fitted; both happen before the sweep returns. With the plan's
 * circuit settle rule, whose wait needs the top tone's impedance, the triangle's settings still go
 * out at once (its settle runs while the tones are fitted) but its capture waits for the fit.
 */
final class MultisineAhead {
    private final CompletableFuture<List<PointResult>> points;

    MultisineAhead(MultisineCapture.Taken taken, SweepListener listener, AfterSweep afterSweep) {
        points = CompletableFuture.supplyAsync(() -> {
            List<PointResult> p = MultisineCapture.analyse(taken);
            for (int i = 0; i < p.size(); i++) {
                listener.pointMeasured(i, p.size(), p.get(i));
            }
            afterSweep.sweepComplete(List.copyOf(p));
            return p;
        }, task -> {
            Thread t = new Thread(task, "lrbench-multisine-fit");
            t.setDaemon(true);
            t.start();
        });
    }

    /** The points, then the plan's triangle check (if any) measured while they were being fitted. */
    SweepRunner.Measurement thenTriangle(TriangleCapture triangle, StopToken stop, RangeMemory memory, Plan plan) {
        if (!triangle.wanted()) {
            return new SweepRunner.Measurement(List.copyOf(points()), null);
        }
        triangle.set();
        double[] peaks = new double[2];
        List<PointResult> p;
        TriangleExtraction.Result t;
        try {
            stop.checkpoint();
            if (plan.sweep().settleFromCircuit()) {
                p = points();
                t = triangle.measure(p.get(p.size() - 1).impedance(), peaks);
            } else {
                // the fixed settle needs no point: the triangle is captured while the tones are fitted
                t = triangle.measure(null, peaks);
                p = points();
            }
        } catch (MeasurementStopped e) {
            // stopped: the fit still ends (and reports its points) before the sweep does
            failure();
            throw e;
        } catch (RuntimeException e) {
            // the record came first: a fault its fit found (no current: an open fixture) is the reason,
            // not what the triangle met after it
            RuntimeException first = failure();
            if (first != null && first != e) {
                first.addSuppressed(e);
                throw first;
            }
            throw e;
        }
        if (memory != null) {
            // a multisine keeps its own ranges (MultisineCapture); the triangle's are kept here
            memory.remember(plan, p.get(0).impedance(), peaks);
        }
        return new SweepRunner.Measurement(List.copyOf(p), t);
    }

    /** The fitted points, waiting for them; a fit that failed throws its own reason here. */
    private List<PointResult> points() {
        return MultisineCapture.joined(points);
    }

    /** What the fit threw, once it has ended; null when it succeeded. */
    private RuntimeException failure() {
        try {
            points();
            return null;
        } catch (RuntimeException e) {
            return e;
        }
    }
}
