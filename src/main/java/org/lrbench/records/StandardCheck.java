package org.lrbench.records;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.CheckStandard;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.Limit;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanIdentity;
import org.lrbench.plan.PlanLoader;
import org.lrbench.report.ControlChartPage;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.CheckFile;
import org.lrbench.store.ResultStore;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.study.ControlChart;
import org.lrbench.yaml.ProblemsException;

/**
 * The bench's check standard measured and judged: its plan and (on the simulated bench) its
 * simulated part found from the bench file, the reading measured with the bench's corrections,
 * recorded in the check standard's log (never replaced), judged on the control chart, and the
 * chart page rewritten. {@link #prepare} finds everything before the operator places the standard;
 * {@link #measure} measures it.
 */
public final class StandardCheck {

    /** A check ready to measure: the standard, its plan and the limit read, the simulated part or null. */
    public record Prepared(BenchConfig bench, DriverLoader drivers, CheckStandard standard, Path planFile, Plan plan,
                           Limit limit, SimulatedPart simulated, Path runs, Path calibration, String programVersion) {
    }

    /** What the check came to: the part's result, the reading, the chart's state and where they were written. */
    public record Outcome(PartResult result, PartResult.LimitRecord reading, ControlChart.State state, Path record,
                          Path chart) {
    }

    /** Why a check cannot be made with this bench file. */
    public static final class Refused extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Refused(String message) {
            super(message);
        }
    }

    private StandardCheck() {
    }

    /** Finds the standard, its plan (checked against the drivers) and, on the simulated bench, its part. */
    public static Prepared prepare(BenchConfig b, DriverLoader drivers, Path runs, Path calibration, String version)
            throws ProblemsException, IOException {
        CheckStandard cs = b.checkStandard();
        if (cs == null) {
            throw new Refused(b.source() + ": the bench file names no check_standard");
        }
        Path benchDir = Path.of(b.source()).toAbsolutePath().getParent();
        Path planFile = benchDir.resolve(cs.plan());
        if (!Files.isRegularFile(planFile)) {
            throw new Refused("plan " + planFile + ": no such file");
        }
        Plan p = PlanLoader.load(planFile, b.maxAmplitudeVolt());
        List<String> misfit = PlanFit.problems(p, drivers, b.generator().driver(), b.digitizer().driver());
        if (!misfit.isEmpty()) {
            throw new Refused(String.join("\n", misfit));
        }
        // an excitation left open: the one chosen for this bench, as for a lot of the same plan
        p = org.lrbench.rehearsal.ExcitationChoice.of(p, b, drivers, new CalibrationStore(calibration, b.name()).load())
                .plan();
        Limit limit = p.firstLimit(Characteristic.INDUCTANCE).orElseThrow(() -> new Refused(planFile
                + ": the check standard's plan needs an inductance limit"));
        SimulatedPart sim = null;
        BenchConfig bench = b;
        if (b.simulation() != null) {
            // each check its own noise, as each check on a real bench has
            int checks = new CheckStandardLog(runs, b.name()).entries().size();
            bench = b.nthDraw(checks + 1);
            Path part = benchDir.resolve(cs.simulatedPart());
            if (!Files.isRegularFile(part)) {
                throw new Refused("simulated check standard " + part + ": no such file");
            }
            sim = SimulatedPart.load(part);
        }
        return new Prepared(bench, drivers, cs, planFile, p, limit, sim, runs, calibration, version);
    }

    /**
     * Measures the standard and, when the measurement completed, records the reading, judges it and
     * rewrites the chart. A measurement that ended in error records nothing: its outcome has no state.
     * The reading's file is a link of the store's chain of check files.
     */
    public static Outcome measure(Prepared q, ResultStore store) throws ProblemsException, IOException {
        BenchConfig b = q.bench();
        CheckStandard cs = q.standard();
        CheckStandardLog log = new CheckStandardLog(q.runs(), b.name());
        List<CheckStandardLog.Entry> before = log.entries();
        Instant at = Instant.now().truncatedTo(ChronoUnit.MILLIS);
        PartRun.Request request = new PartRun.Request(q.plan(), PlanIdentity.sha256(q.planFile()), b, "CHECK",
                cs.serial(), q.simulated() != null, q.programVersion(), new CalibrationStore(q.calibration(), b.name()).load());
        PartResult r;
        try (BenchInstruments inst = BenchInstruments.open(b, q.drivers(),
                q.simulated() == null ? null : q.simulated().open(b, q.plan().wiring()))) {
            r = PartRun.measure(request, inst, q.simulated() != null ? BenchClock.NONE : BenchClock.REAL,
                    SweepListener.NONE);
        }
        if (r.error() != null) {
            return new Outcome(r, null, null, null, null);
        }
        PartResult.LimitRecord reading = r.limits().stream().filter(l -> l.name().equals(q.limit().name())).findFirst()
                .orElseThrow(() -> new IllegalStateException("the result has no reading of " + q.limit().name()));
        List<ControlChart.Reading> history = new ArrayList<>(CheckStandardLog.readings(before));
        history.add(new ControlChart.Reading(reading.value(), reading.expandedUncertainty()));
        ControlChart.State state = ControlChart.of(history, cs.certifiedHenry(), cs.certifiedExpandedHenry(),
                cs.historyPoints());
        Path record = log.append(at, cs.serial(), q.planFile().toString(), reading.value(), reading.expandedUncertainty(),
                r.verdict().word(), state);
        CheckStandardLog.keep(store, q.runs(), b.name(), CheckFile.READING, record);
        List<String> times = new ArrayList<>(before.stream().map(e -> e.at().toString()).toList());
        times.add(at.toString());
        double[] values = history.stream().mapToDouble(ControlChart.Reading::value).toArray();
        Path chart = log.folder().resolve("chart.html");
        ResultFiles.writeAtomically(chart, ControlChartPage.html(b.name(), cs.serial(), cs.certifiedHenry(),
                cs.certifiedExpandedHenry(), times, values, state).getBytes(StandardCharsets.UTF_8));
        return new Outcome(r, reading, state, record, chart);
    }
}
