package org.lrbench.measure;

import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.function.Supplier;

/**
 * The analysis of one captured point at a time, on a worker thread, so it runs while the
 * instruments move on to the next point. A failure of the analysis comes back from
 * {@link #result} as it was thrown.
 */
final class PointWork implements AutoCloseable {
    private final ExecutorService worker = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "lrbench-point-analysis");
        t.setDaemon(true);
        return t;
    });
    private Future<PointResult> pending;

    void submit(Supplier<PointResult> analysis) {
        if (pending != null) {
            throw new IllegalStateException("the previous point's result was not taken");
        }
        pending = worker.submit(analysis::get);
    }

    boolean pending() {
        return pending != null;
    }

    /** The submitted point's result, once its analysis is done. */
    PointResult result() {
        Future<PointResult> f = pending;
        pending = null;
        try {
            return f.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            f.cancel(true);
            throw new MeasurementException("interrupted while a point was analysed");
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            if (e.getCause() instanceof Error err) {
                throw err;
            }
            throw new IllegalStateException(e.getCause());
        }
    }

    @Override
    public void close() {
        worker.shutdownNow();
    }
}
