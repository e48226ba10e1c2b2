package org.lrbench.measure;

import java.util.List;

/**
 * The stage between a sweep's last point and the triangle check: the caller starts work that needs
 * only the sweep's points (its model fit) while the instruments go on. Called once, with every
 * point of the sweep, in sweep order; not called when the sweep ends early.
 */
@FunctionalInterface
public interface AfterSweep {
    AfterSweep NOTHING = points -> { };

    void sweepComplete(List<PointResult> points);
}
