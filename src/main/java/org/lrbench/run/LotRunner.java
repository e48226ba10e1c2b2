package org.lrbench.run;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.Consumer;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.CharacteristicClass;
import org.lrbench.judge.Limit;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sim.SimBench;
import org.lrbench.store.PartRow;
import org.lrbench.store.ResultStore;
import org.lrbench.yaml.ProblemsException;

/**
 * Runs a lot's sample: parts one after another from a {@link PartFeeder}, each result committed to
 * the store and written as JSON as soon as it is complete, until the sample is complete or the
 * feeder stops. Running the same lot again continues after the parts already stored (errors are
 * measured again). The disposition is recorded once the sample decides it.
 */
public final class LotRunner {
    private static final ObjectMapper READ = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .configure(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES, false);

    /** Everything a lot run needs besides the feeder. */
    public record Setup(PartRun.Request template, int lotSize, DriverLoader drivers, ResultStore store, Path runs,
                        Sleeper sleeper, SweepListener listener, BenchInstruments shared, boolean keepTraces) {

        public Setup(PartRun.Request template, int lotSize, DriverLoader drivers, ResultStore store, Path runs,
                     Sleeper sleeper, SweepListener listener, BenchInstruments shared) {
            this(template, lotSize, drivers, store, runs, sleeper, listener, shared, true);
        }

        /** The same set-up, keeping the trace archive of every part or none. */
        public Setup withTraces(boolean keep) {
            return new Setup(template, lotSize, drivers, store, runs, sleeper, listener, shared, keep);
        }

        public Setup(PartRun.Request template, int lotSize, DriverLoader drivers, ResultStore store, Path runs,
                     Sleeper sleeper) {
            this(template, lotSize, drivers, store, runs, sleeper, SweepListener.NONE, null);
        }

        public Setup(PartRun.Request template, int lotSize, DriverLoader drivers, ResultStore store, Path runs,
                     Sleeper sleeper, SweepListener listener) {
            this(template, lotSize, drivers, store, runs, sleeper, listener, null);
        }
    }

    /** The lot's state after this run. */
    public record Outcome(List<PartResult> measuredNow, List<PartRow> stored, LotDisposition.Result disposition) {
    }

    private LotRunner() {
    }

    public static Outcome run(Setup s, PartFeeder feeder, Consumer<PartResult> onPart) throws IOException, ProblemsException {
        PartRun.Request t = s.template();
        var scheme = t.plan().sampling();
        if (scheme == null) {
            throw new IllegalArgumentException(t.plan().source() + ": the plan has no sampling section; a lot run needs"
                    + " one (level and AQL per class)");
        }
        int n = LotDisposition.judge(s.lotSize(), scheme, List.of()).sampleSize();
        String now = Instant.now().truncatedTo(ChronoUnit.MILLIS).toString();
        s.store().beginLot(t.lot(), t.plan().partNumber(), t.plan().source(), t.planSha256(), t.bench().name(),
                s.lotSize(), n, now);
        List<PartResult> measured = new ArrayList<>();
        int seed = 0;
        while (true) {
            List<PartRow> stored = s.store().parts(t.lot());
            long good = stored.stream().filter(r -> r.verdict().equals("pass") || r.verdict().equals("fail")).count();
            if (good >= n) {
                break;
            }
            int position = stored.size() + 1;
            PartFeeder.Next next = feeder.next((int) good + 1, n);
            if (next.action() == PartFeeder.Action.STOP) {
                break;
            }
            if (next.action() == PartFeeder.Action.SKIP) {
                s.store().savePart(position, skipped(t, next.serial()));
                continue;
            }
            PartResult r;
            org.lrbench.traces.TraceRecorder recorder;
            do {
                recorder = new org.lrbench.traces.TraceRecorder(s.listener());
                r = measure(s, next, seed++, recorder);
                onPart.accept(r);
            } while (feeder.redo(r.serial(), r.verdict()));
            if (s.keepTraces()) {
                Path archive = s.runs().resolve(t.lot()).resolve(r.serial() + ".lrtraces");
                byte[] traces = org.lrbench.traces.TraceArchive.encode(t.lot(), r.serial(), t.plan().partNumber(),
                        t.plan().senseResistanceOhm(), ResultFiles.JSON.valueToTree(r.instruments()), recorder.points());
                ResultFiles.writeAtomically(archive, traces);
                s.store().savePart(position, r, archive.toString(), (long) traces.length);
            } else {
                s.store().savePart(position, r);
            }
            ResultFiles.writeJson(s.runs().resolve(t.lot()).resolve(r.serial() + ".json"), r);
            measured.add(r);
        }
        List<PartRow> stored = s.store().parts(t.lot());
        LotDisposition.Result d = disposition(s, stored);
        if (d.state() != LotDisposition.State.OPEN) {
            s.store().finishLot(t.lot(), d.state().name().toLowerCase(Locale.ROOT), d.reason(),
                    Instant.now().truncatedTo(ChronoUnit.MILLIS).toString());
        }
        return new Outcome(measured, stored, d);
    }

    private static PartResult measure(Setup s, PartFeeder.Next next, int seed, SweepListener listener)
            throws ProblemsException {
        PartRun.Request t = s.template();
        BenchConfig bench = t.bench();
        SimBench sim = null;
        if (next.simulated() != null) {
            // each simulated part gets its own noise: the bench seed advanced per measurement
            bench = bench.withSimulation(bench.simulation().withSeed(bench.simulation().seed() + seed));
            sim = new SimBench(bench.simulation(), t.plan().wiring(), next.simulated());
        }
        PartRun.Request request = new PartRun.Request(t.plan(), t.planSha256(), bench, t.lot(), next.serial(),
                t.simulated(), t.programVersion(), t.calibration());
        if (sim == null && s.shared() != null) {
            // the bench's instruments stay open for the whole lot (a switch unit changes parts)
            return PartRun.measure(request, s.shared(), s.sleeper(), listener);
        }
        try (BenchInstruments instruments = BenchInstruments.open(bench, s.drivers(), sim)) {
            return PartRun.measure(request, instruments, s.sleeper(), listener);
        }
    }

    /** The disposition from the stored results, in measuring order. */
    public static LotDisposition.Result disposition(Setup s, List<PartRow> stored) {
        Map<String, Limit> byName = new HashMap<>();
        s.template().plan().limits().forEach(l -> byName.put(l.name(), l));
        List<Set<CharacteristicClass>> failed = new ArrayList<>();
        for (PartRow row : stored) {
            if (!row.verdict().equals("pass") && !row.verdict().equals("fail")) {
                continue;
            }
            Set<CharacteristicClass> classes = EnumSet.noneOf(CharacteristicClass.class);
            try {
                PartResult r = READ.readValue(row.resultJson(), PartResult.class);
                for (PartResult.LimitRecord l : r.limits()) {
                    Limit limit = byName.get(l.name());
                    if (!l.pass() && limit != null) {
                        classes.add(limit.characteristicClass());
                    }
                }
            } catch (IOException e) {
                throw new IllegalStateException("stored result of " + row.serial() + " is unreadable: " + e.getMessage(), e);
            }
            failed.add(classes);
        }
        return LotDisposition.judge(s.lotSize(), s.template().plan().sampling(), failed);
    }

    private static PartResult skipped(PartRun.Request t, String serial) {
        String now = Instant.now().truncatedTo(ChronoUnit.MILLIS).toString();
        return new PartResult(PartResult.SCHEMA, t.programVersion(), t.lot(), serial, t.plan().partNumber(),
                t.plan().source(), t.planSha256(), t.bench().name(), t.simulated(), now, now, "skipped",
                "skipped by the operator: not measured", List.of(), List.of(), null, null, null, null, null, null,
                null, null, Map.of(), null, null, null, null, List.of(), List.of(), Map.of(), Map.of());
    }
}
