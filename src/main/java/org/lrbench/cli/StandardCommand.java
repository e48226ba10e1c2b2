package org.lrbench.cli;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.CheckStandard;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.judge.Characteristic;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.records.CheckStandardLog;
import org.lrbench.report.ControlChartPage;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.SimBench;
import org.lrbench.study.ControlChart;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

/**
 * {@code lrbench standard}: measures the bench's check standard with its plan, records the
 * reading, judges it on the control chart and rewrites the chart page.
 */
@Command(name = "standard", mixinStandardHelpOptions = true, description = {
    "Measure the bench's check standard and judge the reading on its control chart.",
    "The standard is the bench file's check_standard. A reading is judged against the certificate"
        + " (normalized error) until the history has its readings, then on an individuals chart;"
        + " each reading is recorded and RUNS/check-standard/BENCH/chart.html rewritten.",
    "A lot run on this bench refuses to start while the last check is out of control or too old.",
    "Exit 0 in control, 1 out of control, 2 bad input, 3 instrument error."})
final class StandardCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Runs runs = new FolderOptions.Runs();

    @Mixin
    FolderOptions.Calibration calibration = new FolderOptions.Calibration();

    @Override
    public Integer call() throws Exception {
        BenchConfig b = benchOptions.load();
        CheckStandard cs = b.checkStandard();
        if (cs == null) {
            throw new BadInputException(b.source() + ": the bench file names no check_standard");
        }
        Path benchDir = Path.of(b.source()).toAbsolutePath().getParent();
        Path planFile = benchDir.resolve(cs.plan());
        Plan p = Inputs.plan(planFile, b);
        Inputs.requireFit(p, b, benchOptions.loader());
        var limit = p.firstLimit(Characteristic.INDUCTANCE).orElseThrow(() -> new BadInputException(planFile + ": the check standard's plan needs an inductance limit"));
        SimBench sim = null;
        CheckStandardLog log = new CheckStandardLog(runs.runs, b.name());
        List<CheckStandardLog.Entry> before = log.entries();
        if (b.simulation() != null) {
            // each check its own noise, as each check on a real bench has
            b = b.withSeedOffset(7919L * (before.size() + 1));
            Path part = benchDir.resolve(cs.simulatedPart());
            Inputs.requireFile(part, "simulated check standard");
            sim = new SimBench(b.simulation(), p.wiring(), PartFile.load(part));
        } else {
            System.out.println("Place the check standard " + cs.serial() + " in the fixture, then press Enter"
                    + " (the generator output is off).");
            if (System.in.read() < 0) {
                throw new BadInputException("no answer on the console: the check standard was not placed");
            }
        }
        Instant at = Instant.now().truncatedTo(ChronoUnit.MILLIS);
        PartRun.Request request = new PartRun.Request(p, Inputs.sha256(planFile), b, "CHECK", cs.serial(), sim != null,
                Home.version(), new CalibrationStore(calibration.calibration, b.name()).load());
        PartResult r;
        try (BenchInstruments inst = BenchInstruments.open(b, benchOptions.loader(), sim)) {
            r = PartRun.measure(request, inst, sim != null ? BenchClock.NONE : BenchClock.REAL, SweepListener.NONE);
        }
        if (r.error() != null) {
            System.err.println("lrbench: the check standard's measurement ended in error (nothing recorded): " + r.error());
            return ExitCodes.INSTRUMENT;
        }
        var reading = r.limits().stream().filter(l -> l.name().equals(limit.name())).findFirst().orElseThrow();
        List<ControlChart.Reading> history = new ArrayList<>(CheckStandardLog.readings(before));
        history.add(new ControlChart.Reading(reading.value(), reading.expandedUncertainty()));
        ControlChart.State state = ControlChart.of(history, cs.certifiedHenry(), cs.certifiedExpandedHenry(), cs.historyPoints());
        Path record = log.append(at, cs.serial(), planFile.toString(), reading.value(), reading.expandedUncertainty(),
                r.verdict().word(), state);
        List<String> times = new ArrayList<>(before.stream().map(e -> e.at().toString()).toList());
        times.add(at.toString());
        double[] values = history.stream().mapToDouble(ControlChart.Reading::value).toArray();
        Path chart = log.folder().resolve("chart.html");
        ResultFiles.writeAtomically(chart, ControlChartPage.html(b.name(), cs.serial(), cs.certifiedHenry(),
                cs.certifiedExpandedHenry(), times, values, state).getBytes(StandardCharsets.UTF_8));
        System.out.printf(Locale.ROOT, "check standard %s on %s: %s %s (U, k = 2); certified %s; reading less certified %s%n",
                cs.serial(), b.name(), limit.name(),
                Units.formatWithUncertainty(reading.value(), reading.expandedUncertainty(), Dimension.INDUCTANCE),
                Units.formatWithUncertainty(cs.certifiedHenry(), cs.certifiedExpandedHenry(), Dimension.INDUCTANCE),
                Units.format(reading.value() - cs.certifiedHenry(), Dimension.INDUCTANCE));
        System.out.println((state.inControl() ? "in control: " : "OUT OF CONTROL (lot runs on this bench are refused): ")
                + state.reason());
        System.out.println("record: " + record + "; chart: " + chart);
        return state.inControl() ? ExitCodes.PASS : ExitCodes.FAIL;
    }
}
