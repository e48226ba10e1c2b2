package org.lrbench.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverLoader;
import org.lrbench.lot.LotEnd;
import org.lrbench.lot.LotRefused;
import org.lrbench.lot.LotRunner;
import org.lrbench.lot.LotStart;
import org.lrbench.lot.TrayRun;
import org.lrbench.plan.Plan;
import org.lrbench.report.LotReport;
import org.lrbench.results.LotSummary;
import org.lrbench.results.ResultFiles;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimLot;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench demo}: measures the simulated demo lot with its plan. */
@Command(name = "demo", mixinStandardHelpOptions = true, description = "Calibrate the simulated bench and inspect the demo lot: sample, disposition, store, report.")
final class DemoCommand implements Callable<Integer> {

    @Mixin
    StoreLocation location;

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Mixin
    FolderOptions.Runs runsOption;

    @Mixin
    FolderOptions.Tables tablesOption;

    @Option(names = "--lot-file", paramLabel = "LOT.yaml", description = "simulated lot (default: simulator/demo-lot.yaml)")
    Path lotFile;

    /** The demo lot's earlier result files and trace archives (only those: other files stay). */
    private static void removeDemoRecords(Path dir) throws IOException {
        if (!Files.isDirectory(dir)) {
            return;
        }
        try (var files = Files.newDirectoryStream(dir, "*.{json,lrtraces}")) {
            for (Path f : files) {
                Files.delete(f);
            }
        }
    }

    @picocli.CommandLine.Mixin
    LogOptions logging;

    @Override
    public Integer call() throws Exception {
        logging.apply();
        if (location.url != null) {
            // the demo removes its invented lot's earlier records before it starts: never on a shared store
            throw new BadInputException("--store: the demo keeps its invented lot in a store of its own (--data DIR);"
                    + " a shared store is for real lots (run, serve)");
        }
        Path lotPath = lotFile != null ? lotFile : Home.demoLot();
        Inputs.requireFile(lotPath, "simulated lot");
        SimLot lot = SimLot.load(lotPath);
        Inputs.name("lot", lot.lot());
        BenchConfig b = benchOptions.load();
        DriverLoader drivers = benchOptions.loader();
        Plan plan = Inputs.plan(lot.plan(), b);
        double qAt = ResultText.qFrequency(plan);
        System.out.printf("lot %s: %d parts of %s (%s), plan %s, simulated bench %s%n%n", lot.lot(), lot.parts().size(),
                plan.partNumber(), plan.description(), Home.root().relativize(lot.plan().toAbsolutePath()), b.name());
        // the excitation chosen for this bench (where the plan leaves it open), then a bench is calibrated
        // before a lot: channel match and fixture, here on the simulated bench
        plan = Inputs.excitation(plan, b, drivers);
        System.out.println("calibrating the simulated bench at the plan's frequencies:");
        CalibrateCommand.calibrate(plan, b, drivers, new SimBench(b.simulation(), plan.wiring(),
                lot.parts().get(0).model()), calibrationOption.calibration);
        System.out.println();
        Integer lotSize = lot.lotSize();
        if (plan.sampling() == null || lotSize == null) {
            throw new BadInputException(lotPath + ": the demo needs a lot_size and a plan with a sampling section");
        }
        LotSummary summary;
        try (ResultStore store = location.open()) {
            // the demo measures its invented lot afresh each time (a real lot resumes where it stopped
            // and its records are never removed): its earlier demo records go first, store and files
            store.deleteLot(lot.lot());
            removeDemoRecords(runsOption.runs.resolve(lot.lot()));
            LotStart.Ready ready;
            try {
                ready = LotStart.prepare(new LotStart.Request(lot.plan(), b, drivers, lot.lot(), lotSize, "demo", null,
                        null, null, true, true, new LotStart.Folders(calibrationOption.calibration, runsOption.runs,
                        tablesOption.tables), Home.version()), store);
            } catch (LotRefused e) {
                throw new BadInputException("demo: " + e.getMessage());
            }
            LotRunner.Setup setup = ready.setup();
            System.out.println(setup.template().calibration().inForce());
            ResultText.severity(System.out, setup.scheme(), setup.template().simulated());
            ResultText.samplingPlans(System.out, lotSize, setup.sampling());
            System.out.println();
            ResultText.tableHeader(System.out, qAt);
            LotRunner.Outcome outcome = TrayRun.simulated(setup, lot, r -> ResultText.tableRow(System.out, r, qAt));
            summary = LotEnd.summary(outcome, store);
            Path report = runsOption.runs.resolve(lot.lot()).resolve("report.html");
            ResultFiles.writeAtomically(report, LotReport.html(store, lot.lot())
                    .getBytes(StandardCharsets.UTF_8));
        }
        LotEnd.write(runsOption.runs, summary);
        System.out.println();
        ResultText.summary(System.out, summary);
        System.out.println("store: " + (location.url != null ? location.url : location.file()));
        System.out.println("results: " + runsOption.runs.resolve(lot.lot()) + "/ (report.html opens in any browser, offline)");
        return ExitCodes.PASS;
    }
}
