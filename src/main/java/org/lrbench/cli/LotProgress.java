package org.lrbench.cli;

import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;

/**
 * A progress bar with ETA over a lot's sample, counted in sweep points, on the terminal's error
 * stream (progressbar library); nothing at all when no terminal is attached, so logs and pipes
 * keep one plain line per part.
 */
final class LotProgress implements SweepListener, AutoCloseable {
    private final ProgressBar bar;

    private LotProgress(ProgressBar bar) {
        this.bar = bar;
    }

    static LotProgress start(int parts, int pointsPerPart) {
        if (System.console() == null) {
            return new LotProgress(null);
        }
        return new LotProgress(new ProgressBarBuilder().setTaskName("lot").setInitialMax((long) parts * pointsPerPart)
                .setStyle(ProgressBarStyle.ASCII).setUnit(" points", 1).showSpeed().build());
    }

    @Override
    public void pointMeasured(int index, int count, PointResult point) {
        if (bar != null) {
            bar.step();
        }
    }

    @Override
    public void close() {
        if (bar != null) {
            bar.close();
        }
    }
}
