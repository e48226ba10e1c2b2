package org.lrbench.benchmark;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimLot;
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

    /** Parts measured one after another on instruments kept open, as a tray behind a switch is. */
    static final int TRAY = 5;

    /**
     * One profile's figures: the time of a part after the first on instruments kept open (the mean
     * over the tray's parts after the first) and of the first part (instruments just opened, no
     * part before to range from).
     */
    public record Figures(SimTiming timing, double partSecond, double minimumSecond, double roundTripsPerPoint,
                          int maxRoundTrips, String verdict, double sweepSecond, double inductanceU,
                          double resistanceU, double firstPartSecond, long partRoundTrips, int points,
                          Map<String, Double> expanded) {
        double ratio() {
            return partSecond / minimumSecond;
        }
    }

    public static int run(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part,
                          List<SimTiming> profiles, SimLot lot, List<BenchConfig> dialectBenches) throws Exception {
        out.printf(Locale.ROOT, "throughput of plan %s on the simulated bench, per timing profile: %d parts one after"
                + " another on instruments kept open (a tray behind a switch); the ratio and parts/hour are of the parts"
                + " after the first%n", plan.partNumber(), TRAY);
        warmUp(bench, plan, drivers, part);
        int misses = profiles(out, bench, plan, drivers, part, profiles);
        out.printf(Locale.ROOT, "%nthe same with a second process keeping one core busy (another program on the lab's"
                + " computer)%n");
        try (CoreLoad load = CoreLoad.start()) {
            misses += profiles(out, bench, plan, drivers, part, profiles);
            if (!load.running()) {
                out.println("the loading process ended early: the figures above are not under load   MISS");
                misses++;
            }
        }
        misses += dialects(out, dialectBenches, plan, drivers, part);
        misses += excitations(out, bench, plan, drivers, part, profiles);
        misses += lotVerdicts(out, bench, plan, drivers, lot);
        out.println(misses == 0 ? "every goal met" : misses + " row(s) miss a goal (marked MISS)");
        return misses;
    }

    /** Warm-up rounds of {@value #TRAY} parts each excitation: see {@link #warmUp}. */
    static final int WARM_UP_ROUNDS = 3;

    /**
     * Each excitation measured {@value #WARM_UP_ROUNDS} times {@value #TRAY} parts before anything is
     * timed, so that the figures are a lab's steady state (a service measures hundreds of parts), not
     * the compiler's: a multisine runs its analysis once a part where a stepped sweep runs its own once
     * a point, so its code is compiled later; after one warm-up part its whole part took 1.44x its
     * minimum in a run where, three rounds later, it took 1.20x.
     */
    static void warmUp(BenchConfig bench, Plan plan, Path drivers, PartModel part) throws Exception {
        for (int round = 0; round < WARM_UP_ROUNDS; round++) {
            measure(bench, plan.withSweep(plan.sweep().withMultisine(false)), drivers, part, SimTiming.NONE, TRAY);
            measure(bench, plan.withSweep(plan.sweep().withMultisine(true)), drivers, part, SimTiming.NONE, TRAY);
        }
    }

    /** Per profile and settle rule: the first part's time, the next parts', the minimum, their ratio, round trips. */
    private static int profiles(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part,
                                List<SimTiming> profiles) throws Exception {
        out.printf(Locale.ROOT, "%-8s %-8s %11s %10s %10s %7s %11s %14s %14s%n", "profile", "settle", "first part",
                "next parts", "minimum", "ratio", "parts/hour", "round trips", "above minimum");
        int misses = 0;
        Plan circuit = plan.withSweep(plan.sweep().withSettleFromCircuit(true));
        for (SimTiming t : profiles) {
            for (Plan p : List.of(plan, circuit)) {
                Figures f = measure(bench, p, drivers, part, t, TRAY);
                boolean miss = f.ratio() > 1.15 || f.maxRoundTrips() > 6;
                misses += miss ? 1 : 0;
                out.printf(Locale.ROOT, "%-8s %-8s %8.0f ms %7.0f ms %7.0f ms %6.2fx %11.0f %7.1f/pt (%d) %12.1f %%%s%n",
                        t.name(), p.sweep().settleFromCircuit() ? "circuit" : "fixed", 1e3 * f.firstPartSecond(),
                        1e3 * f.partSecond(), 1e3 * f.minimumSecond(), f.ratio(), 3600 / f.partSecond(),
                        f.roundTripsPerPoint(), f.maxRoundTrips(),
                        100 * (f.partSecond() - f.minimumSecond()) / f.partSecond(), miss ? "   MISS" : "");
            }
        }
        out.println("goals: part time at most 1.15x the physical minimum; at most 6 round trips per point");
        return misses;
    }

    /**
     * Round trips of a whole part (sweep, triangle, DC resistance: everything from the part's first
     * command to its result, on instruments kept open) over its sweep points, on each simulated bench:
     * every digitizer dialect the simulator speaks. Goals: at most 5 on our own dialect (the generic
     * driver, one message per exchange the instrument allows), at most 8 on a digitizer that needs
     * polling or a scale reply per channel.
     */
    static int dialects(PrintStream out, List<BenchConfig> benches, Plan plan, Path drivers, PartModel part)
            throws Exception {
        if (benches.isEmpty()) {
            return 0;
        }
        out.printf(Locale.ROOT, "%nround trips of a whole part per sweep point, per digitizer dialect (the second of two"
                + " parts on instruments kept open)%n");
        out.printf(Locale.ROOT, "%-28s %-30s %12s %8s %10s %6s%n", "bench", "digitizer driver", "round trips", "points",
                "per point", "goal");
        int misses = 0;
        for (BenchConfig b : benches) {
            Figures f = measure(b, plan.withSweep(plan.sweep().withMultisine(false)), drivers, part, SimTiming.NONE, 2);
            boolean ours = b.digitizer().driver().startsWith("generic");
            double perPoint = (double) f.partRoundTrips() / f.points();
            int goal = ours ? 5 : 8;
            boolean miss = !(perPoint <= goal);
            misses += miss ? 1 : 0;
            out.printf(Locale.ROOT, "%-28s %-30s %12d %8d %10.2f %6d%s%n", b.name(), b.digitizer().driver(),
                    f.partRoundTrips(), f.points(), perPoint, goal, miss ? "   MISS" : "");
        }
        return misses;
    }

    /**
     * The same part swept stepped and as one multisine, per profile, each the last of {@value #TRAY}
     * parts on instruments kept open, on a bench calibrated first for each excitation (a speed figure
     * counts only at an equal uncertainty, and without corrections the channel-gain specification
     * hides the difference): the sweep's time (from its first instrument command to its last point),
     * the whole part's, U (95 %) of every limit's quantity, and the verdicts. Goals: every U at most
     * 1.5x the stepped sweep's and the same verdict; the speed is reported at that condition only.
     */
    static int excitations(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part,
                           List<SimTiming> profiles) throws Exception {
        out.printf(Locale.ROOT, "%nstepped sweep against one multisine on a calibrated bench (settle rule of the plan; the"
                + " last of %d parts on instruments kept open), per profile%n", TRAY);
        Plan stepped = plan.withSweep(plan.sweep().withMultisine(false));
        Plan multi = plan.withSweep(plan.sweep().withMultisine(true));
        Calibration steppedCal = calibrated(bench, stepped, drivers, part);
        Calibration multiCal = calibrated(bench, multi, drivers, part);
        int misses = 0;
        for (SimTiming t : profiles) {
            Figures a = measure(bench, stepped, drivers, part, t, TRAY, steppedCal);
            Figures b = measure(bench, multi, drivers, part, t, TRAY, multiCal);
            for (Figures f : List.of(a, b)) {
                StringBuilder u = new StringBuilder();
                f.expanded().forEach((k, v) -> u.append(String.format(Locale.ROOT, "; U(%s) %.4g", k, v)));
                out.printf(Locale.ROOT, "%-8s %-10s sweep %7.0f ms, part %7.0f ms, %s%s%n", t.name(),
                        f == a ? "stepped" : "multisine", 1e3 * f.sweepSecond(), 1e3 * f.partSecond(), f.verdict(), u);
            }
            StringBuilder ratios = new StringBuilder();
            boolean within = true;
            for (String k : a.expanded().keySet()) {
                double ratio = b.expanded().getOrDefault(k, Double.NaN) / a.expanded().get(k);
                within &= ratio <= 1.5;
                ratios.append(String.format(Locale.ROOT, "%s U(%s) %.2fx", ratios.length() == 0 ? "" : ",", k, ratio));
            }
            boolean miss = !within || !a.verdict().equals(b.verdict());
            misses += miss ? 1 : 0;
            boolean slow = b.ratio() > 1.3;
            misses += slow ? 1 : 0;
            out.printf(Locale.ROOT, "%-8s multisine whole part %.0f ms against its own minimum %.0f ms (one record of the"
                    + " lowest tone's cycles, the settle, the waveform's and the traces' transfers, the triangle): %.2fx"
                    + " (goal 1.3x)%s%n", t.name(), 1e3 * b.partSecond(), 1e3 * b.minimumSecond(), b.ratio(),
                    slow ? "   MISS" : "");
            out.printf(Locale.ROOT, "%-8s multisine: sweep %.2fx and whole part %.2fx faster;%s the stepped sweep's;"
                    + " verdicts %s%s%n", t.name(), a.sweepSecond() / b.sweepSecond(), a.partSecond() / b.partSecond(),
                    ratios, a.verdict().equals(b.verdict()) ? "equal" : "differ", miss ? "   MISS" : "");
        }
        out.println("goals: every U of the multisine at most 1.5x the stepped sweep's, the same verdict (its speed counts"
                + " only then)");
        return misses + partUncertainties(out, bench, drivers);
    }

    /** Seeds per part and excitation in {@link #partUncertainties}: U is stable from seed to seed, the scatter is not. */
    static final int U_SEEDS = 3;

    /**
     * U (95 %) of L, R and the third quantity (Q, or the self-resonance) with the multisine over the
     * stepped sweep's, on the coverage benchmark's parts and plans (a 10 uH high-Q part, a lossy core,
     * a part resonating in the sweep), each calibrated and measured as the coverage benchmark does
     * (bench errors off), the mean over {@value #U_SEEDS} seeds; and the readings' scatter ratio.
     * Goal: every U at most 1.5x.
     */
    static int partUncertainties(PrintStream out, BenchConfig bench, Path drivers) throws Exception {
        out.printf(Locale.ROOT, "%nU (95 %%) of the multisine over the stepped sweep's, calibrated, per part (mean of %d"
                + " seeds; in brackets the scatter of the readings, multisine over stepped)%n", U_SEEDS);
        var sim = bench.simulation().withSenseError(0).withRangeGainSpread(0).withMeterError(0);
        BenchConfig b = new BenchConfig(bench.source(), bench.name(), bench.maxAmplitudeVolt(), bench.generator(),
                bench.digitizer(), null, null, sim, new org.lrbench.uncertainty.BenchAccuracy(0, 0, 0, 0));
        DriverLoader loader = new DriverLoader(drivers);
        int misses = 0;
        for (CoverageBenchmark.Case c : CoverageBenchmark.cases()) {
            Plan plan = org.lrbench.plan.PlanLoader.parse(c.plan(), "coverage.yaml", b.maxAmplitudeVolt());
            Map<String, double[]> stepped = new LinkedHashMap<>();
            Map<String, double[]> multi = new LinkedHashMap<>();
            String refused = null;
            String widened = "";
            for (boolean ms : new boolean[] {false, true}) {
                Plan p = plan.withSweep(plan.sweep().withMultisine(ms));
                if (ms) {
                    Plan fitting = fitted(p);
                    if (fitting != p) {
                        widened = String.format(Locale.ROOT, "  (multisine_tolerance %.0f %%)",
                                100 * fitting.sweep().multisineTolerance());
                    }
                    p = fitting;
                }
                try {
                    collect(ms ? multi : stepped, b, p, c.part(), loader);
                } catch (IllegalArgumentException e) {
                    refused = e.getMessage();
                }
            }
            StringBuilder line = new StringBuilder();
            boolean miss = refused != null;
            for (var e : stepped.entrySet()) {
                double[] m = multi.get(e.getKey());
                if (m == null) {
                    continue;
                }
                double ratio = m[0] / e.getValue()[0];
                miss |= !(ratio <= 1.5);
                line.append(String.format(Locale.ROOT, "  %s %.2fx (%.2fx)", e.getKey(), ratio, m[1] / e.getValue()[1]));
            }
            misses += miss ? 1 : 0;
            out.printf(Locale.ROOT, "%-44s%s%s%s%n", c.name(), refused != null ? "  multisine not possible: " + refused : line,
                    widened, miss ? "   MISS" : "");
        }
        out.println("goal: U of the multisine at most 1.5x the stepped sweep's for every quantity");
        return misses;
    }

    /**
     * The multisine plan with its tolerance widened as the refusal of a design that needs more waveform
     * samples than the simulated generator holds advises (5 %, then the plan format's 10 %); the plan itself
     * where it fits, or where nothing does (its measurement then names the refusal).
     */
    static Plan fitted(Plan p) {
        for (double tolerance : new double[] {0.05, 0.10}) {
            if (fits(p)) {
                return p;
            }
            p = p.withSweep(p.sweep().withMultisineTolerance(tolerance));
        }
        return p;
    }

    /** Whether the plan's multisine fits the simulated generator's waveform memory. */
    private static boolean fits(Plan p) {
        try {
            MultisineDesign.of(p.sweep().frequenciesHz(), p.sweep().multisineTolerance(),
                    org.lrbench.sim.SimGenerator.MAX_ARBITRARY_POINTS);
            return true;
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    /** Per limit: the mean U and the readings' standard deviation over the seeds. */
    private static void collect(Map<String, double[]> into, BenchConfig b, Plan p, PartModel part, DriverLoader loader)
            throws Exception {
        Map<String, List<double[]>> v = new LinkedHashMap<>();
        for (int s = 0; s < U_SEEDS; s++) {
            PartResult r = CoverageBenchmark.once(b, p, part, loader, 1000 + 2L * s);
            if (r.error() != null) {
                throw new IllegalArgumentException(r.error());
            }
            for (var l : p.limits()) {
                var u = r.budgets().get(l.name());
                if (u != null) {
                    v.computeIfAbsent(l.name(), k -> new ArrayList<>()).add(new double[] {u.value(), u.expandedUncertainty()});
                }
            }
        }
        v.forEach((k, list) -> {
            double mean = list.stream().mapToDouble(x -> x[0]).average().orElse(Double.NaN);
            double sd = Math.sqrt(list.stream().mapToDouble(x -> (x[0] - mean) * (x[0] - mean)).sum() / Math.max(1, list.size() - 1));
            into.put(k, new double[] {list.stream().mapToDouble(x -> x[1]).average().orElse(Double.NaN), sd});
        });
    }

    /**
     * The demo lot's parts measured stepped and as one multisine, each after its own calibration of
     * the simulated bench with that excitation (instruments that answer at once): the verdicts side
     * by side. Goal: the same verdict for every part.
     */
    static int lotVerdicts(PrintStream out, BenchConfig bench, Plan plan, Path drivers, SimLot lot) throws Exception {
        out.printf(Locale.ROOT, "%nverdicts on lot %s, stepped against one multisine%n", lot.lot());
        DriverLoader loader = new DriverLoader(drivers);
        Map<Boolean, List<String>> verdicts = new LinkedHashMap<>();
        for (boolean multisine : new boolean[] {false, true}) {
            Plan p = plan.withSweep(plan.sweep().withMultisine(multisine));
            Calibration corrections = calibrated(bench, p, drivers, lot.parts().get(0).model());
            List<String> v = new ArrayList<>();
            int i = 0;
            for (SimLot.Part part : lot.parts()) {
                // each part of the tray its own noise: seeds 31 apart, as the lot runner spreads them
                BenchConfig b = bench.withSimulation(bench.simulation().withSeed(bench.simulation().seed() + 31L * ++i));
                SimBench sim = new SimBench(b.simulation(), p.wiring(), part.model());
                try (BenchInstruments inst = BenchInstruments.open(b, loader, sim)) {
                    PartResult r = PartRun.measure(new PartRun.Request(p, "0", b, lot.lot(), part.serial(), true,
                            "benchmark", corrections), inst, BenchClock.NONE, SweepListener.NONE);
                    // the verdict and which limits failed (their values differ a little between methods)
                    List<String> failed = r.limits().stream().filter(l -> !l.pass()).map(PartResult.LimitRecord::name).toList();
                    v.add(r.verdict() + (failed.isEmpty() ? "" : " (" + String.join(", ", failed) + ")"));
                }
            }
            verdicts.put(multisine, v);
        }
        int differ = 0;
        out.printf(Locale.ROOT, "%-14s %-44s %-44s%n", "serial", "stepped", "multisine");
        for (int i = 0; i < lot.parts().size(); i++) {
            String a = verdicts.get(false).get(i);
            String b = verdicts.get(true).get(i);
            differ += a.equals(b) ? 0 : 1;
            out.printf(Locale.ROOT, "%-14s %-44s %-44s%s%n", lot.parts().get(i).serial(), a, b, a.equals(b) ? "" : "   MISS");
        }
        out.println(differ == 0 ? "the same verdict for every part" : differ + " part(s) judged differently (marked MISS)");
        return differ;
    }

    static Figures measure(BenchConfig bench, Plan plan, Path drivers, PartModel part, SimTiming timing) throws Exception {
        return measure(bench, plan, drivers, part, timing, 1);
    }

    static Figures measure(BenchConfig bench, Plan plan, Path drivers, PartModel part, SimTiming timing, int parts)
            throws Exception {
        return measure(bench, plan, drivers, part, timing, parts, Calibration.NONE);
    }

    /** The simulated bench calibrated for the plan (instruments that answer at once), as a lab calibrates before it measures. */
    static Calibration calibrated(BenchConfig bench, Plan plan, Path drivers, PartModel part) throws Exception {
        SimBench calBench = new SimBench(bench.simulation(), plan.wiring(), part);
        try (BenchInstruments inst = BenchInstruments.open(bench, new DriverLoader(drivers), calBench)) {
            return CalibrationRun.calibrate(plan, inst, calBench::setPosition, BenchClock.NONE);
        }
    }

    /** {@code parts} parts one after another on instruments kept open; figures of the last, times as described. */
    static Figures measure(BenchConfig bench, Plan plan, Path drivers, PartModel part, SimTiming timing, int parts,
                           Calibration corrections) throws Exception {
        BenchConfig b = bench.withSimulation(bench.simulation().withTiming(timing));
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
        DriverLoader loader = new DriverLoader(drivers);
        try (BenchInstruments inst = BenchInstruments.open(b, loader, sim)) {
            double first = 0;
            double later = 0;
            Figures f = null;
            for (int k = 0; k < parts; k++) {
                f = measureOne(b, plan, loader, inst, timing, corrections);
                if (k == 0) {
                    first = f.partSecond();
                } else {
                    later += f.partSecond();
                }
            }
            double next = parts > 1 ? later / (parts - 1) : first;
            return new Figures(timing, next, f.minimumSecond(), f.roundTripsPerPoint(), f.maxRoundTrips(), f.verdict(),
                    f.sweepSecond(), f.inductanceU(), f.resistanceU(), first, f.partRoundTrips(), f.points(), f.expanded());
        }
    }

    private static Figures measureOne(BenchConfig b, Plan plan, DriverLoader loader, BenchInstruments inst,
                                      SimTiming timing, Calibration corrections) throws Exception {
        int bytesPerSample = loader.load(b.digitizer().driver(), DriverKind.DIGITIZER).traceEncoding().bytesOnWire();
        List<Long> marks = new ArrayList<>();
        List<PointResult> points = new ArrayList<>();
        long[] lastPoint = {0};
        long[] started = {0};
        SweepListener listener = new SweepListener() {
            @Override
            public void sweepStarted() {
                started[0] = System.nanoTime();
            }

            @Override
            public void pointMeasured(int index, int count, PointResult point) {
                marks.add(queries(inst));
                points.add(point);
                lastPoint[0] = System.nanoTime();
            }
        };
        PartRun.Request req = new PartRun.Request(plan, "0", b, "THROUGHPUT", "T-1", true, "benchmark", corrections);
        long q0 = queries(inst);
        long t0 = System.nanoTime();
        PartResult r = PartRun.measure(req, inst, BenchClock.REAL, listener);
        double seconds = (System.nanoTime() - t0) / 1e9;
        long waveformBytes = org.lrbench.rehearsal.PhysicalTime.waveformBytes(plan,
                loader.load(b.generator().driver(), DriverKind.SOURCE));
        double minimum = org.lrbench.rehearsal.PhysicalTime.of(plan, points, timing, bytesPerSample, waveformBytes);
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
        var uL = r.budgets().get("inductance");
        var uR = r.budgets().get("series_resistance_dc");
        Map<String, Double> expanded = new LinkedHashMap<>();
        for (var l : plan.limits()) {
            var u = r.budgets().get(l.name());
            if (u != null) {
                expanded.put(l.name(), u.expandedUncertainty());
            }
        }
        return new Figures(timing, seconds, minimum, perPoint, max, r.verdict().word(), (lastPoint[0] - started[0]) / 1e9,
                uL == null ? Double.NaN : uL.expandedUncertainty(), uR == null ? Double.NaN : uR.expandedUncertainty(),
                seconds, queries(inst) - q0, points.size(), expanded);
    }

    /** Queries sent so far on the instruments' sessions. */
    private static long queries(BenchInstruments inst) {
        return inst.sessions().stream().mapToLong(ScpiSession::queries).sum();
    }
}
