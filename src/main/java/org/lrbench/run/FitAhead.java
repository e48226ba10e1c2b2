package org.lrbench.run;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;

/**
 * Starts the sweep's model fit and budgets on a thread of their own as soon as the sweep's last
 * point is in, while the instruments go on to the triangle check and the multimeter: computing
 * only, no instrument. {@link #fit} gives that fit when it was made from the points the sweep
 * returned, else computes it there and then.
 */
final class FitAhead implements SweepListener {
    private final SweepListener listener;
    private final Plan plan;
    private final BenchConfig bench;
    private final Calibration calibration;
    private final List<PointResult> heard = new ArrayList<>();
    private CompletableFuture<PartRun.SweepFit> ahead;

    FitAhead(SweepListener listener, Plan plan, BenchConfig bench, Calibration calibration) {
        this.listener = listener;
        this.plan = plan;
        this.bench = bench;
        this.calibration = calibration;
    }

    @Override
    public void sweepStarted() {
        listener.sweepStarted();
    }

    @Override
    public void pointMeasured(int index, int count, PointResult point) {
        heard.add(point);
        if (index == count - 1 && heard.size() == count) {
            List<PointResult> points = List.copyOf(heard);
            ahead = CompletableFuture.supplyAsync(() -> PartRun.fitSweep(plan, bench, calibration, points), task -> {
                Thread t = new Thread(task, "lrbench-sweep-fit");
                t.setDaemon(true);
                t.start();
            });
        }
        listener.pointMeasured(index, count, point);
    }

    /** The fit of these points: the one started ahead if it was of the same points, else made now. */
    PartRun.SweepFit fit(List<PointResult> points) {
        if (ahead != null && heard.equals(points)) {
            try {
                return ahead.join();
            } catch (CompletionException e) {
                // the fit of these very points failed: its reason, as if it had been made here
                if (e.getCause() instanceof RuntimeException r) {
                    throw r;
                }
                if (e.getCause() instanceof Error r) {
                    throw r;
                }
                throw e;
            }
        }
        return PartRun.fitSweep(plan, bench, calibration, points);
    }
}
