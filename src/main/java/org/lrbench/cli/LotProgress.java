package org.lrbench.cli;

import java.io.PrintStream;
import java.util.Locale;
import java.util.function.LongSupplier;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;

/**
 * The lot's progress as one line rewritten in place on the terminal's error stream:
 * "part 3 of 8 - point 5 of 7 - about 6 s left", the time left from the points measured so far.
 * Nothing at all when no terminal is attached, so logs and pipes keep one plain line per part.
 */
final class LotProgress implements SweepListener, AutoCloseable {
    private final PrintStream out;
    private final int parts;
    private final int pointsPerPart;
    private final LongSupplier nanoClock;
    private final long started;
    private int part;
    private int pointsDone;
    private int shownLength;

    LotProgress(PrintStream out, int parts, int pointsPerPart, LongSupplier nanoClock) {
        this.out = out;
        this.parts = parts;
        this.pointsPerPart = Math.max(1, pointsPerPart);
        this.nanoClock = nanoClock;
        this.started = nanoClock.getAsLong();
    }

    static LotProgress start(int parts, int pointsPerPart) {
        return new LotProgress(System.console() == null ? null : System.err, parts, pointsPerPart, System::nanoTime);
    }

    @Override
    public synchronized void sweepStarted() {
        part++;
        show(0);
    }

    @Override
    public synchronized void pointMeasured(int index, int count, PointResult point) {
        pointsDone++;
        show(index + 1);
    }

    /** The line as it reads after {@code point} points of the current part. */
    synchronized String line(int point) {
        StringBuilder s = new StringBuilder("part ").append(Math.min(Math.max(part, 1), Math.max(parts, 1)))
                .append(" of ").append(parts).append(" - point ").append(point).append(" of ").append(pointsPerPart);
        if (pointsDone > 0) {
            long total = (long) parts * pointsPerPart;
            double perPoint = (nanoClock.getAsLong() - started) / 1e9 / pointsDone;
            double left = Math.max(0, total - pointsDone) * perPoint;
            s.append(" - about ").append(duration(left)).append(" left");
        }
        return s.toString();
    }

    /** Seconds as a person reads them: "6 s", "2 min 5 s", "1 h 3 min". */
    static String duration(double seconds) {
        long s = Math.round(seconds);
        if (s < 60) {
            return s + " s";
        }
        if (s < 3600) {
            return String.format(Locale.ROOT, "%d min %d s", s / 60, s % 60);
        }
        return String.format(Locale.ROOT, "%d h %d min", s / 3600, (s % 3600) / 60);
    }

    private void show(int point) {
        if (out == null) {
            return;
        }
        String text = line(point);
        // pad over the end of a longer line shown before
        out.print("\r" + text + " ".repeat(Math.max(0, shownLength - text.length())));
        out.flush();
        shownLength = text.length();
    }

    @Override
    public synchronized void close() {
        if (out != null && shownLength > 0) {
            out.print("\r" + " ".repeat(shownLength) + "\r");
            out.flush();
        }
    }
}
