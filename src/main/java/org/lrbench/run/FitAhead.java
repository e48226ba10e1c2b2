package org.lrbench.run;

import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.measure.AfterSweep;
import org.lrbench.measure.PointResult;
import org.lrbench.plan.Plan;

/**
 * The sweep's model fit and budgets as a stage of their own: started on a thread of their own
 * when the sweep hands over its points ({@link AfterSweep}), while the instruments go on to the
 * triangle check and the multimeter. Computing only, no instrument.
 */
final class FitAhead implements AfterSweep {
    private final Plan plan;
    private final BenchConfig bench;
    private final Calibration calibration;
    private CompletableFuture<PartRun.SweepFit> ahead;

    FitAhead(Plan plan, BenchConfig bench, Calibration calibration) {
        this.plan = plan;
        this.bench = bench;
        this.calibration = calibration;
    }

    @Override
    public void sweepComplete(List<PointResult> points) {
        ahead = CompletableFuture.supplyAsync(() -> PartRun.fitSweep(plan, bench, calibration, points), task -> {
            Thread t = new Thread(task, "lrbench-sweep-fit");
            t.setDaemon(true);
            t.start();
        });
    }

    /** The fit of the sweep's points, waiting for it; a fit that failed throws its own reason here. */
    PartRun.SweepFit fit() {
        if (ahead == null) {
            throw new IllegalStateException("the sweep never handed over its points");
        }
        try {
            return ahead.join();
        } catch (CompletionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            if (e.getCause() instanceof Error r) {
                throw r;
            }
            throw e;
        }
    }
}
