package org.lrbench.traces;

import java.util.ArrayList;
import java.util.List;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;

/** Keeps a part's sweep points (with their traces) for the archive, passing each on to another listener. */
public final class TraceRecorder implements SweepListener {
    private final SweepListener next;
    private final List<PointResult> points = new ArrayList<>();

    public TraceRecorder(SweepListener next) {
        this.next = next;
    }

    @Override
    public void pointMeasured(int index, int count, PointResult point) {
        points.add(point);
        next.pointMeasured(index, count, point);
    }

    public List<PointResult> points() {
        return List.copyOf(points);
    }
}
