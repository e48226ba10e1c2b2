package org.lrbench.service;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.lot.LotHoldKeeper;
import org.lrbench.lot.LotRefused;
import org.lrbench.lot.LotRunner;
import org.lrbench.lot.LotStart;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.records.CheckStandardLog;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.PartResult;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sampling.SwitchingRules;
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
            m.put("prompt", feeder == null ? null : feeder.openPrompt());
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

    /**
     * The plans folder's plans: file name, part number, description, and for a plan with lot
     * sampling its supplier's scheme: the severity the next new lot is inspected under and why.
     */
    public List<Map<String, Object>> plans() throws IOException {
        List<Map<String, Object>> out = new ArrayList<>();
        try (var files = Files.list(config.plans()); ResultStore store = openStore()) {
            for (Path f : files.filter(p -> p.toString().endsWith(".yaml")).sorted().toList()) {
                Map<String, Object> m = new LinkedHashMap<>();
                m.put("name", f.getFileName().toString());
                try {
                    Plan p = PlanLoader.load(f, bench.maxAmplitudeVolt());
                    m.put("part_number", p.partNumber());
                    m.put("description", p.description());
                    m.put("lot_sampling", p.sampling() != null);
                    if (p.sampling() != null) {
                        String supplier = p.supplier() == null ? "" : p.supplier();
                        // this bench's lots follow the simulated scheme when it is the simulated bench
                        SwitchingRules.State s = SwitchingRules.replay(store.schemeHistory(p.partNumber(), supplier,
                                bench.simulation() != null));
                        m.put("supplier", supplier);
                        m.put("severity", s.severity().word());
                        m.put("severity_reason", s.why());
                        m.put("switching_score", s.score());
                    }
                } catch (ProblemsException e) {
                    m.put("problems", e.problems().stream().map(Object::toString).toList());
                }
                out.add(m);
            }
        }
        return out;
    }

    /** What an operator asks for when starting a lot run. */
    public record StartRequest(String plan, String lot, int lotSize, String tray, String operator, String reinspectReason,
                               String overrideCheckReason, String supplier) {

        public StartRequest(String plan, String lot, int lotSize, String tray, String operator, String reinspectReason,
                            String overrideCheckReason) {
            this(plan, lot, lotSize, tray, operator, reinspectReason, overrideCheckReason, null);
        }
    }

    /** The bench's state for the page: its name, and with a check standard the last check and whether a lot may start. */
    public Map<String, Object> benchState() throws IOException {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("bench", bench.name());
        m.put("simulated", bench.simulation() != null);
        if (bench.checkStandard() != null) {
            CheckStandardLog log = new CheckStandardLog(config.runs(), bench.name());
            List<CheckStandardLog.Entry> e = log.entries();
            Map<String, Object> c = new LinkedHashMap<>();
            c.put("serial", bench.checkStandard().serial());
            c.put("last_at", e.isEmpty() ? null : e.get(e.size() - 1).at().toString());
            c.put("last_in_control", e.isEmpty() ? null : e.get(e.size() - 1).inControl());
            c.put("last_reason", e.isEmpty() ? null : e.get(e.size() - 1).reason());
            m.put("check_standard", c);
        }
        String refusal = CheckStandardLog.gate(bench, config.runs(),
                new CalibrationStore(config.calibration(), bench.name()).load(), Instant.now());
        m.put("lot_may_start", refusal == null);
        m.put("refusal", refusal);
        return m;
    }

    /**
     * Starts a lot run through {@link LotStart}, the one way a lot starts; {@code tray} names a simulated lot in the simulator folder (simulated
     * bench). Refused before anything is measured: a run already going (409), a lot started under
     * other terms (409, naming each), a decided lot without a re-inspection reason (409, with its
     * disposition), a simulated bench without a tray (400).
     */
    public synchronized Run start(StartRequest q) throws Exception {
        if (current != null && current.state.equals("running")) {
            throw new ServiceException(409, "a run is already going on this bench: lot " + current.lot
                    + "; stop it or wait for it to end");
        }
        Path planFile = inside(config.plans(), q.plan(), "plan");
        if (q.tray() == null && "sim".equals(bench.generator().address().scheme())) {
            throw new ServiceException(400, "tray: this bench is the simulated one; choose a simulated tray (the"
                    + " parts the scanner picks from), such as demo-lot.yaml");
        }
        SimLot tray = null;
        if (q.tray() != null) {
            try {
                tray = SimLot.load(inside(config.simulator(), q.tray(), "tray"));
            } catch (ProblemsException e) {
                throw new ServiceException(400, "tray: " + e.getMessage());
            }
        }
        LotStart.Request request = new LotStart.Request(planFile, bench, new DriverLoader(config.drivers()), q.lot(),
                q.lotSize(), q.operator(), q.supplier(), q.reinspectReason(), q.overrideCheckReason(), tray != null, true,
                new LotStart.Folders(config.calibration(), config.runs(), config.samplingTables()), config.programVersion());
        ResultStore store = openStore();
        LotStart.Ready ready;
        LotHoldKeeper hold = null;
        try {
            hold = LotHoldKeeper.take(store, this::openStore, q.lot(), bench.name());
            ready = LotStart.prepare(request, store);
        } catch (LotRefused e) {
            closeQuietly(hold);
            store.close();
            throw switch (e.kind()) {
                case BAD_INPUT -> new ServiceException(400, e.getMessage());
                case CONFLICT, HELD -> new ServiceException(409, e.getMessage());
                case CHECK_REFUSED -> new ServiceException(409, e.getMessage()
                        + " (start anyway with override_check_reason, recorded with the operator's name)");
            };
        } catch (ProblemsException e) {
            closeQuietly(hold);
            store.close();
            throw new ServiceException(400, e.getMessage());
        } catch (IOException | RuntimeException e) {
            closeQuietly(hold);
            store.close();
            throw e;
        }
        LotHoldKeeper held = hold;
        if (ready.isClosed()) {
            held.close();
            store.close();
            Inspection closed = ready.closed();
            throw new ServiceException(409, "lot " + closed.lot() + " is closed: inspection " + closed.round()
                    + " was decided on " + closed.finishedAt() + ": " + closed.disposition().word().toUpperCase(Locale.ROOT)
                    + " (" + closed.dispositionReason() + "). Nothing was measured; to inspect it again give"
                    + " reinspect_reason");
        }
        LotRunner.Setup setup = ready.setup();
        Run r = new Run(q.lot(), q.plan());
        PromptFeeder feeder = new PromptFeeder(r.events, tray);
        r.feeder = feeder;
        r.sampleSize = setup.sampleSize();
        r.partsDone = ready.alreadyMeasured();
        current = r;
        SweepListener points = new SweepListener() {
            @Override
            public void pointMeasured(int index, int count, PointResult p) {
                r.events.add("point", Map.of("index", index + 1, "of", count,
                        "frequency_hz", p.impedance().frequencyHz(), "impedance_ohm", p.impedance().impedanceOhm().abs()));
            }
        };
        Map<String, Object> started = new LinkedHashMap<>(Map.of("lot", q.lot(), "plan", q.plan(), "lot_size",
                q.lotSize(), "sample_size", r.sampleSize, "already_measured", r.partsDone, "operator", q.operator(),
                "severity", setup.scheme().severity().word(), "severity_reason", setup.scheme().why(),
                "supplier", setup.scheme().supplier()));
        started.put("corrections", setup.template().calibration().inForce());
        started.put("excitation", org.lrbench.rehearsal.ExcitationChoice.described(setup.template().plan(),
                ready.excitation()));
        r.events.add("run_started", started);
        LotRunner.Setup go = setup.withListener(points);
        r.thread = new Thread(() -> {
            try (store; held) {
                LotRunner.Outcome o = LotRunner.run(go, feeder, part -> {
                    // called once the part is committed: the event never shows an unstored verdict
                    List<Attempt> counting = store.parts(q.lot());
                    r.partsDone = (int) counting.stream().filter(Attempt::judged).count();
                    Map<String, Object> e = partEvent(part);
                    e.put("standing", LotRunner.disposition(go, q.lotSize(), counting).reason());
                    r.events.add("part_done", e);
                });
                r.state = o.disposition().state() == LotDisposition.State.OPEN ? "stopped" : "finished";
                r.events.add("lot_done", Map.of("lot", q.lot(), "disposition", o.disposition().state().name()
                        .toLowerCase(Locale.ROOT), "reason", o.disposition().reason(), "state", r.state));
                if (!r.state.equals("finished")) {
                    r.reason = "stopped before the sample was complete; start the lot again to resume";
                }
            } catch (Exception | Error e) {
                r.state = "error";
                r.reason = e.getMessage();
                r.events.add("error", Map.of("reason", String.valueOf(e.getMessage())));
            } finally {
                // the run's last event is out: every event stream of it ends
                r.events.end();
            }
        }, "lrbench-run-" + q.lot());
        r.thread.setDaemon(true);
        r.thread.start();
        return r;
    }

    private static Map<String, Object> partEvent(PartResult p) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("serial", p.serial());
        m.put("attempt", p.attempt() == null ? 1 : p.attempt().number());
        m.put("remeasure_reason", p.attempt() == null ? null : p.attempt().reason());
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
        if (!r.state.equals("running")) {
            throw new ServiceException(409, "lot " + r.lot + " is not running (" + r.state + "); nothing to stop");
        }
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
    private static void closeQuietly(LotHoldKeeper hold) {
        if (hold != null) {
            hold.close();
        }
    }

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
