package org.lrbench.cli;

import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.bench.CheckStandard;
import org.lrbench.records.StandardCheck;
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
        + " each reading is recorded (its file a link of the store's chain of check files) and"
        + " RUNS/check-standard/BENCH/chart.html rewritten.",
    "A lot run on this bench refuses to start while the last check is out of control or too old.",
    "Exit 0 in control, 1 out of control, 2 bad input, 3 instrument error."})
final class StandardCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Runs runs = new FolderOptions.Runs();

    @Mixin
    FolderOptions.Calibration calibration = new FolderOptions.Calibration();

    @Mixin
    StoreLocation store;

    @Override
    public Integer call() throws Exception {
        StandardCheck.Prepared q;
        try {
            q = StandardCheck.prepare(benchOptions.load(), benchOptions.loader(), runs.runs, calibration.calibration,
                    Home.version());
        } catch (StandardCheck.Refused e) {
            throw new BadInputException(e.getMessage());
        }
        CheckStandard cs = q.standard();
        if (q.simulated() == null) {
            System.out.println("Place the check standard " + cs.serial() + " in the fixture, then press Enter"
                    + " (the generator output is off).");
            if (System.in.read() < 0) {
                throw new BadInputException("no answer on the console: the check standard was not placed");
            }
        }
        StandardCheck.Outcome o;
        try (var results = store.open()) {
            o = StandardCheck.measure(q, results);
        }
        if (o.state() == null) {
            System.err.println("lrbench: the check standard's measurement ended in error (nothing recorded): "
                    + o.result().error());
            return ExitCodes.INSTRUMENT;
        }
        var reading = o.reading();
        System.out.printf(Locale.ROOT, "check standard %s on %s: %s %s (U, 95 %%); certified %s; reading less certified %s%n",
                cs.serial(), q.bench().name(), q.limit().name(),
                Units.formatWithUncertainty(reading.value(), reading.expandedUncertainty(), Dimension.INDUCTANCE),
                Units.formatWithUncertainty(cs.certifiedHenry(), cs.certifiedExpandedHenry(), Dimension.INDUCTANCE),
                Units.format(reading.value() - cs.certifiedHenry(), Dimension.INDUCTANCE));
        System.out.println((o.state().inControl() ? "in control: " : "OUT OF CONTROL (lot runs on this bench are refused): ")
                + o.state().reason());
        System.out.println("record: " + o.record() + "; chart: " + o.chart());
        return o.state().inControl() ? ExitCodes.PASS : ExitCodes.FAIL;
    }
}
