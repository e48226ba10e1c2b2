package org.lrbench.benchmark;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.Settle;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimTiming;

/**
 * Parts per hour against the physical limit: one part of a plan measured on the simulated bench
 * with instruments that take time (each timing profile in turn, side by side in one run), its wall
 * time against the least the plan can take on that bench, the round trips per point, and the
 * share of the time that is lrbench's own. The physical minimum of a point is its settle, the
 * generator's frequency change, the digitizer's arming, one record's duration, both traces'
 * transfer, and four messages (set the frequency, acquire, fetch each channel); the triangle check
 * counts the same way. Ranging beyond one acquisition, set-up, error queries and analysis are what
 * lrbench adds ("above minimum").
 */
public final class ThroughputBenchmark {

    private ThroughputBenchmark() {
    }

    /** One profile's figures. */
    public record Figures(SimTiming timing, double partSecond, double minimumSecond, double roundTripsPerPoint,
                          int maxRoundTrips, String verdict) {
        double ratio() {
            return partSecond / minimumSecond;
        }
    }

    public static int run(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part,
                          List<SimTiming> profiles) throws Exception {
        out.printf(Locale.ROOT, "throughput of plan %s, one part on the simulated bench, per timing profile%n",
                plan.partNumber());
        out.printf(Locale.ROOT, "%-8s %-8s %10s %10s %7s %11s %14s %14s%n", "profile", "settle", "part", "minimum", "ratio",
                "parts/hour", "round trips", "above minimum");
        measure(bench, plan, drivers, part, SimTiming.NONE); // warm-up: the first part pays for class loading and compiling
        int misses = 0;
        Plan circuit = plan.withSweep(plan.sweep().withSettleFromCircuit(true));
        for (SimTiming t : profiles) {
            for (Plan p : List.of(plan, circuit)) {
            Figures f = measure(bench, p, drivers, part, t);
            boolean miss = f.ratio() > 1.15 || f.maxRoundTrips() > 6;
            misses += miss ? 1 : 0;
            out.printf(Locale.ROOT, "%-8s %-8s %7.0f ms %7.0f ms %6.2fx %11.0f %7.1f/pt (%d) %12.1f %%%s%n", t.name(),
                    p.sweep().settleFromCircuit() ? "circuit" : "fixed",
                    1e3 * f.partSecond(), 1e3 * f.minimumSecond(), f.ratio(), 3600 / f.partSecond(),
                    f.roundTripsPerPoint(), f.maxRoundTrips(), 100 * (f.partSecond() - f.minimumSecond()) / f.partSecond(),
                    miss ? "   MISS" : "");
            }
        }
        out.println("goals: part time at most 1.15x the physical minimum; at most 6 round trips per point");
        out.println(misses == 0 ? "every goal met" : misses + " row(s) miss a goal (marked MISS)");
        return misses;
    }

    static Figures measure(BenchConfig bench, Plan plan, Path drivers, PartModel part, SimTiming timing) throws Exception {
        BenchConfig b = bench.withSimulation(bench.simulation().withTiming(timing));
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
        DriverLoader loader = new DriverLoader(drivers);
        int bytesPerSample = loader.load(b.digitizer().driver(), DriverKind.DIGITIZER).traceEncoding().bytesOnWire();
        try (BenchInstruments inst = BenchInstruments.open(b, loader, sim)) {
            List<Long> marks = new ArrayList<>();
            List<PointResult> points = new ArrayList<>();
            SweepListener listener = new SweepListener() {
                @Override
                public void pointMeasured(int index, int count, PointResult point) {
                    marks.add(queries(inst));
                    points.add(point);
                }
            };
            PartRun.Request req = new PartRun.Request(plan, "0", b, "THROUGHPUT", "T-1", true, "benchmark");
            long q0 = queries(inst);
            long t0 = System.nanoTime();
            PartResult r = PartRun.measure(req, inst, Sleeper.REAL, listener);
            double seconds = (System.nanoTime() - t0) / 1e9;
            double minimum = 0;
            for (int i = 0; i < points.size(); i++) {
                PointResult p = points.get(i);
                minimum += settle(plan, i == 0 ? null : points.get(i - 1))
                        + capture(timing, p.samples(), p.sampleIntervalSecond(), bytesPerSample);
            }
            if (plan.triangle() != null && !points.isEmpty()) {
                var tri = plan.triangle();
                int n = tri.cycles() * tri.samplesPerCycle() + 1;
                minimum += settle(plan, points.get(points.size() - 1))
                        + capture(timing, n, 1 / (tri.frequencyHz() * tri.samplesPerCycle()), bytesPerSample);
            }
            int max = 0;
            long total = 0;
            for (int i = 1; i < marks.size(); i++) {
                int rt = (int) (marks.get(i) - marks.get(i - 1));
                max = Math.max(max, rt);
                total += rt;
            }
            double perPoint = marks.size() > 1 ? (double) total / (marks.size() - 1) : Double.NaN;
            if (marks.isEmpty()) {
                perPoint = queries(inst) - q0;
            }
            return new Figures(timing, seconds, minimum, perPoint, max, r.verdict());
        }
    }

    /** The settle the plan's rule asks for at a point. */
    private static double settle(Plan plan, PointResult previous) {
        return Settle.seconds(plan.sweep(), plan.senseResistanceOhm(), previous == null ? null : previous.impedance(), 0);
    }

    /** One capture's unavoidable time: frequency change, arming, the record, both traces over the link, four messages. */
    private static double capture(SimTiming t, int samples, double interval, int bytesPerSample) {
        return t.frequencyChangeSecond() + t.armSecond() + samples * interval
                + t.transfer(2L * samples * bytesPerSample) + 4 * t.messageSecond();
    }

    private static long queries(BenchInstruments inst) {
        return inst.sessions().stream().mapToLong(ScpiSession::queries).sum();
    }
}
