package org.lrbench.service;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.LotRunner;
import org.lrbench.run.PartRun;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sim.SimLot;
import org.lrbench.store.ResultStore;
import org.lrbench.yaml.ProblemsException;

/**
 * The bench service: owns one bench and its results store, runs one lot at a time on a thread of
 * its own, and reports what happens as {@link RunEvents}. A second start while a run is going is
 * refused (409). Stopping takes effect before the next part; the generator output is off between
 * parts, completed parts are kept and the lot can be resumed by starting it again.
 */
public final class BenchService implements AutoCloseable {
    private final ServiceConfig config;
    private final BenchConfig bench;
    private Run current;

    /** One lot run: its events, its feeder, its state. */
    public final class Run {
        final String lot;
        final String plan;
        public final RunEvents events = new RunEvents();
        PromptFeeder feeder;
        volatile String state = "running";
        volatile String reason;
        volatile int partsDone;
        volatile int sampleSize;
        Thread thread;

        Run(String lot, String plan) {
            this.lot = lot;
            this.plan = plan;
        }

        Map<String, Object> status() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("lot", lot);
            m.put("plan", plan);
            m.put("state", state);
            m.put("parts_done", partsDone);
            m.put("sample_size", sampleSize);
            m.put("reason", reason);
            m.put("events", events.all().size());
            return m;
        }
    }

    public BenchService(ServiceConfig config) throws ProblemsException {
        this.config = config;
        this.bench = BenchLoader.load(config.benchFile());
    }

    public String benchName() {
        return bench.name();
    }

    /** The plans folder's plans: file name, part number, description. */
    public List<Map<String, Object>> plans() throws IOException {
        List<Map<String, Object>> out = new ArrayList<>();
        try (var files = Files.list(config.plans())) {
            for (Path f : files.filter(p -> p.toString().endsWith(".yaml")).sorted().toList()) {
                Map<String, Object> m = new LinkedHashMap<>();
                m.put("name", f.getFileName().toString());
                try {
                    Plan p = PlanLoader.load(f, bench.maxAmplitudeVolt());
                    m.put("part_number", p.partNumber());
                    m.put("description", p.description());
                    m.put("lot_sampling", p.sampling() != null);
                } catch (ProblemsException e) {
                    m.put("problems", e.problems().stream().map(Object::toString).toList());
                }
                out.add(m);
            }
        }
        return out;
    }

    /** Starts a lot run; {@code tray} names a simulated lot in the simulator folder (simulated bench). */
    public synchronized Run start(String planName, String lot, int lotSize, String trayName) throws Exception {
        if (current != null && current.state.equals("running")) {
            throw new ServiceException(409, "a run is already going on this bench: lot " + current.lot
                    + "; stop it or wait for it to end");
        }
        Path planFile = inside(config.plans(), planName, "plan");
        Plan plan;
        try {
            plan = PlanLoader.load(planFile, bench.maxAmplitudeVolt());
        } catch (ProblemsException e) {
            throw new ServiceException(400, "plan: " + e.getMessage());
        }
        if (plan.sampling() == null) {
            throw new ServiceException(400, "plan: " + planName + " has no sampling section; a lot run needs one");
        }
        SimLot tray = null;
        if (trayName != null) {
            try {
                tray = SimLot.load(inside(config.simulator(), trayName, "tray"));
            } catch (ProblemsException e) {
                throw new ServiceException(400, "tray: " + e.getMessage());
            }
        }
        String sha = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(planFile)));
        PartRun.Request template = new PartRun.Request(plan, sha, bench, lot, "-", tray != null, config.programVersion(),
                new CalibrationStore(config.calibration(), bench.name()).load());
        ResultStore store = openStore();
        Set<String> done = store.completed(lot);
        Run r = new Run(lot, planName);
        PromptFeeder feeder = new PromptFeeder(r.events, tray, done);
        r.feeder = feeder;
        Sleeper sleeper = tray != null ? Sleeper.NONE : Sleeper.REAL;
        r.sampleSize = LotDisposition.judge(lotSize, plan.sampling(), List.of()).sampleSize();
        r.partsDone = done.size();
        current = r;
        SweepListener points = new SweepListener() {
            @Override
            public void pointMeasured(int index, int count, PointResult p) {
                r.events.add("point", Map.of("index", index + 1, "of", count,
                        "frequency_hz", p.impedance().frequencyHz(), "impedance_ohm", p.impedance().impedanceOhm().abs()));
            }
        };
        r.events.add("run_started", Map.of("lot", lot, "plan", planName, "lot_size", lotSize,
                "sample_size", r.sampleSize, "already_measured", done.size()));
        r.thread = new Thread(() -> {
            try (store) {
                LotRunner.Setup setup = new LotRunner.Setup(template, lotSize, new DriverLoader(config.drivers()),
                        store, config.runs(), sleeper, points);
                LotRunner.Outcome o = LotRunner.run(setup, feeder, part -> {
                    r.partsDone++;
                    Map<String, Object> e = partEvent(part);
                    // the lot's running counts against Ac/Re, with the part just measured
                    List<org.lrbench.store.PartRow> rows = new ArrayList<>(store.parts(lot));
                    rows.removeIf(row -> row.serial().equals(part.serial()));
                    rows.add(new org.lrbench.store.PartRow(lot, part.serial(), rows.size() + 1, part.verdict(), null, null,
                            part.finishedAt(), org.lrbench.service.ResultFilesJson.write(part)));
                    e.put("standing", LotRunner.disposition(setup, rows).reason());
                    r.events.add("part_done", e);
                });
                r.state = o.disposition().state() == LotDisposition.State.OPEN ? "stopped" : "finished";
                r.events.add("lot_done", Map.of("disposition", o.disposition().state().name().toLowerCase(),
                        "reason", o.disposition().reason(), "state", r.state));
                if (!r.state.equals("finished")) {
                    r.reason = "stopped before the sample was complete; start the lot again to resume";
                }
            } catch (Exception | Error e) {
                r.state = "error";
                r.reason = e.getMessage();
                r.events.add("error", Map.of("reason", String.valueOf(e.getMessage())));
            }
        }, "lrbench-run-" + lot);
        r.thread.setDaemon(true);
        r.thread.start();
        return r;
    }

    private static Map<String, Object> partEvent(PartResult p) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("serial", p.serial());
        m.put("verdict", p.verdict());
        m.put("inductance_h", p.inductanceH());
        m.put("series_resistance_ohm", p.seriesResistanceOhm());
        m.put("failed_limits", p.failedLimits());
        m.put("error", p.error());
        return m;
    }

    public synchronized Run current() {
        return current;
    }

    public Run currentOr404() {
        Run r = current();
        if (r == null) {
            throw new ServiceException(404, "no run has been started on this service");
        }
        return r;
    }

    /** Stops the current run before its next part. */
    public void stop() {
        Run r = currentOr404();
        r.feeder.stop();
        r.events.add("stopping", Map.of("text", "stopping after the part in progress; the generator output is off"
                + " between parts and completed parts are kept"));
    }

    /** Waits for the current run's thread (tests and shutdown). */
    public void join(long millis) throws InterruptedException {
        Run r = current();
        if (r != null && r.thread != null) {
            r.thread.join(millis);
        }
    }

    public Path dataFile() {
        return config.data().resolve("lrbench.db");
    }

    /** Whether there is a store to read: a shared one, or the local file once a lot has run. */
    public boolean hasStore() {
        return config.storeUrl() != null || Files.isRegularFile(dataFile());
    }

    /** The results store: the shared one when configured (every bench's lots), else the local file. */
    public ResultStore openStore() {
        return config.storeUrl() != null ? ResultStore.openUrl(config.storeUrl()) : ResultStore.open(dataFile());
    }

    public Path runs() {
        return config.runs();
    }

    /** A file name inside a folder: no path separators, no way out of it, must exist. */
    static Path inside(Path dir, String name, String field) {
        if (name == null || !name.matches("[A-Za-z0-9][A-Za-z0-9._-]{0,99}\\.yaml")) {
            throw new ServiceException(400, field + ": '" + name + "' must be a file name like qfd-ind-1m0.yaml"
                    + " (letters, digits, '.', '_', '-'; no folders)");
        }
        Path p = dir.resolve(name).normalize();
        if (!p.startsWith(dir.normalize()) || !Files.isRegularFile(p)) {
            throw new ServiceException(404, field + ": no " + name + " in " + dir.getFileName());
        }
        return p;
    }

    @Override
    public void close() {
        Run r = current();
        if (r != null && r.state.equals("running")) {
            r.feeder.stop();
        }
    }
}
