package org.lrbench.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.Callable;
import java.util.function.Consumer;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.lot.ConsoleFeeder;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.lot.LotEnd;
import org.lrbench.lot.LotRefused;
import org.lrbench.lot.LotRunner;
import org.lrbench.lot.LotStart;
import org.lrbench.lot.LotStop;
import org.lrbench.lot.PartFeeder;
import org.lrbench.lot.TrayRun;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanIdentity;
import org.lrbench.records.SinglePart;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotSummary;
import org.lrbench.lot.LotHoldKeeper;
import org.lrbench.lot.ScannedTray;
import org.lrbench.results.Names;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.PartRun;
import org.lrbench.sim.SimLot;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench run PLAN --lot L --serial S}: measures one part. */
@Command(name = "run", mixinStandardHelpOptions = true, description = {"Measure one part with a plan and judge it, or (--lot-size) a lot's sample.",
        "Exit codes: 0 pass, 1 fail, 2 bad input, 3 instrument or communication error;",
        "with --lot-size: 0 lot accepted, 1 rejected, 5 still open (stopped early: run again to resume)."})
final class RunCommand implements Callable<Integer> {

    @Mixin
    StoreLocation location;

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    AddressOptions addresses;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Mixin
    FolderOptions.Runs runsOption;

    @Mixin
    FolderOptions.Tables tablesOption;

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Option(names = "--lot", required = true, paramLabel = "LOT", description = "lot number")
    String lot;

    @Option(names = "--serial", paramLabel = "SN", description = "the part's serial number (one part)")
    String serial;

    @Option(names = "--lot-size", paramLabel = "N",
            description = "run the lot's sample: size of the delivered lot; the plan's sampling gives the sample")
    Integer lotSize;

    @Option(names = "--sim-lot", paramLabel = "TRAY.yaml",
            description = "with --lot-size: measure a tray of simulated parts unattended instead of asking the operator")
    Path simLot;

    @Option(names = "--at-prompts", description = "with --sim-lot: the operator is prompted for each part as on a real"
            + " bench (serials scanned or typed, s, q, r) and the part measured is the tray's part of that serial")
    boolean atPrompts;

    @Option(names = "--tray", paramLabel = "SERIALS.txt",
            description = "with --lot-size on a bench with a switch unit: the serials in the fixture's positions,"
                    + " one per line in position order; the tray is then measured unattended")
    Path traySerials;

    /** What is kept of the captured traces. */
    enum TraceRetention { keep, none }

    @Option(names = "--traces", paramLabel = "keep|none", defaultValue = "keep",
            description = "keep every captured trace as DIR/LOT/SERIAL.lrtraces, or none (default: ${DEFAULT-VALUE})")
    TraceRetention tracesRetention;

    @Option(names = "--operator", paramLabel = "NAME",
            description = "who measures, recorded with every attempt (default: the login name)")
    String operator;

    @Option(names = "--reason", paramLabel = "TEXT",
            description = "one part measured again (--serial): why; the earlier record is kept")
    String reason;

    @Option(names = "--reinspect", paramLabel = "REASON",
            description = "with --lot-size: open a new inspection of a lot already decided, for this reason;"
                    + " the earlier inspection stays in the store and the report")
    String reinspect;

    @Option(names = "--sim", paramLabel = "PART.yaml",
            description = "measure on the in-process simulated bench, with this simulated part under test")
    Path sim;

    @Option(names = "--override-check", paramLabel = "REASON",
            description = "with --lot-size on a bench with a check standard: start although the check refuses,"
                    + " for this reason (recorded with the operator's name)")
    String overrideCheck;

    @Option(names = "--supplier", paramLabel = "NAME",
            description = "with --lot-size: the lot's supplier, whose scheme (ISO 2859-1 switching rules) gives the"
                    + " severity (default: the plan's supplier key)")
    String supplier;

    @Option(names = "--json", paramLabel = "OUT.json", description = "also write the result to this file")
    Path json;

    @picocli.CommandLine.Mixin
    LogOptions logging;

    @Override
    public Integer call() throws Exception {
        logging.apply();
        Inputs.name("--lot", lot);
        // the operator's name and a reason are kept with every record: one printable line each
        if (operator != null && Names.operatorProblem(operator) != null) {
            throw new BadInputException("--" + Names.operatorProblem(operator));
        }
        if (Names.reasonProblem("reason", reason) != null) {
            throw new BadInputException("--" + Names.reasonProblem("reason", reason));
        }
        if (lotSize != null) {
            return runLot();
        }
        if (serial == null) {
            throw new BadInputException("give --serial SN for one part, or --lot-size N for the lot's sample");
        }
        Inputs.name("--serial", serial);
        refuseSampledLot();
        BenchConfig b = benchOptions.load();
        if (sim != null && addresses.any()) {
            throw new BadInputException("--sim measures on the in-process simulated bench; it cannot be combined"
                    + " with --generator or --digitizer");
        }
        b = addresses.applyTo(b);
        Plan p = Inputs.plan(plan, b);
        Inputs.requireFit(p, b, benchOptions.loader());
        Calibration corrections = new CalibrationStore(calibrationOption.calibration, b.name()).load();
        p = Inputs.excitation(p, b, benchOptions.loader(), corrections);
        SimulatedPart simulated = null;
        if (sim != null) {
            Inputs.requireFile(sim, "simulated part");
            simulated = SimulatedPart.load(sim);
        }
        PartRun.Request request = new PartRun.Request(p, PlanIdentity.sha256(plan), b, lot, serial, sim != null,
                Home.version(), corrections);
        SinglePart.Outcome o;
        try {
            o = SinglePart.measure(new SinglePart.Request(request, benchOptions.loader(), simulated, operatorName(),
                    reason, keepTraces(), runsOption.runs));
        } catch (SinglePart.Refused e) {
            throw new BadInputException(e.getMessage());
        }
        // the record in the store's chain of single parts, so that verify checks its files as a lot's
        try (ResultStore store = location.open()) {
            SinglePart.keep(store, o);
        }
        PartResult result = o.result();
        if (json != null) {
            ResultFiles.writeJson(json, result);
        }
        ResultText.part(System.out, result);
        System.out.println("record: " + o.record() + (o.attempt() > 1 ? " (attempt " + o.attempt() + "; earlier ones kept)" : ""));
        if (o.archive() != null) {
            System.out.printf("traces kept in %s (%d bytes)%n", o.archive(), o.archiveBytes());
        }
        if (result.error() != null) {
            System.err.println("lrbench: measurement error: " + result.error());
        }
        return ExitCodes.of(result.verdict());
    }

    private boolean keepTraces() {
        return tracesRetention == TraceRetention.keep;
    }

    private String operatorName() {
        return operator != null ? operator : System.getProperty("user.name", "unknown");
    }

    /**
     * A lot inspected by sampling keeps its parts in the store; a single part measured into it
     * would take a record name the lot run needs, so it is refused.
     */
    private void refuseSampledLot() {
        if (!location.exists()) {
            return;
        }
        try (ResultStore store = location.openForReading()) {
            if (store.latestInspection(lot).isPresent()) {
                throw new BadInputException("lot " + lot + " is inspected by sampling in the results store: measure its"
                        + " parts with --lot-size (a part is measured again at its prompt), or give single parts"
                        + " another lot number");
            }
        }
    }

    /** Serials of a tray file: one per line, blank lines and # comments ignored, each checked. */
    static List<String> readSerials(Path file) throws IOException {
        Inputs.requireFile(file, "tray");
        List<String> out = new ArrayList<>();
        Set<String> seen = new HashSet<>();
        List<String> lines = Files.readAllLines(file);
        for (int i = 0; i < lines.size(); i++) {
            String t = lines.get(i).replaceAll("#.*", "").trim();
            if (t.isEmpty()) {
                continue;
            }
            String problem = Names.problem("serial", t);
            if (problem != null || !seen.add(t)) {
                throw new BadInputException(file + ":" + (i + 1) + ":1: " + (problem != null ? problem
                        : "serial '" + t + "' appears twice"));
            }
            out.add(t);
        }
        if (out.isEmpty()) {
            throw new BadInputException(file + ": no serials");
        }
        return out;
    }

    /** Lot mode: the sample one part after another, each attempt committed as it goes, resumable. */
    @SuppressWarnings("try") // a resource held only for its close(): installed handlers, a running server
    private int runLot() throws Exception {
        if (serial != null || sim != null || reason != null) {
            throw new BadInputException("--lot-size runs the lot's sample: use --sim-lot for simulated parts, not"
                    + " --serial, --sim or --reason (a part is measured again at its prompt)");
        }
        if (reinspect != null && reinspect.isBlank()) {
            throw new BadInputException("--reinspect needs a reason, in words");
        }
        if (overrideCheck != null && overrideCheck.isBlank()) {
            throw new BadInputException("--override-check needs a reason, in words");
        }
        if (Names.supplierProblem(supplier) != null) {
            throw new BadInputException("--" + Names.supplierProblem(supplier));
        }
        if (atPrompts && simLot == null) {
            throw new BadInputException("--at-prompts is for a simulated tray: give --sim-lot TRAY.yaml (on a real bench"
                    + " the prompts are the default)");
        }
        BenchConfig b = addresses.applyTo(benchOptions.load());
        SimLot tray = null;
        List<String> serials = null;
        if (simLot != null) {
            Inputs.requireFile(simLot, "simulated tray");
            tray = SimLot.load(simLot);
        } else if (traySerials != null) {
            if (b.switchUnit() == null) {
                throw new BadInputException("--tray needs a bench with a switch unit (bench file key switch)");
            }
            serials = readSerials(traySerials);
        }
        LotStart.Request request = new LotStart.Request(plan, b, benchOptions.loader(), lot, lotSize, operatorName(),
                supplier, reinspect, overrideCheck, tray != null, keepTraces(), new LotStart.Folders(
                calibrationOption.calibration, runsOption.runs, tablesOption.tables), Home.version());
        LotStop stop = new LotStop();
        LotRunner.Outcome outcome;
        LotSummary summary;
        try (ResultStore store = location.open();
             LotHoldKeeper hold = LotHoldKeeper.take(store, location::open, lot, b.name())) {
            LotStart.Ready ready = start(request, store);
            if (ready.excitation() != null) {
                System.out.println("excitation: " + ready.excitation());
            }
            LotRunner.Setup setup = ready.setup().withStop(stop);
            ResultText.severity(System.out, setup.scheme(), setup.template().simulated());
            ResultText.samplingPlans(System.out, lotSize, setup.sampling());
            if (ready.isClosed()) {
                return closed(ready.closed());
            }
            if (ready.override() != null) {
                System.out.println("warning: starting although " + ready.override() + "; override recorded in "
                        + ready.overrideRecord());
            }
            if (ready.alreadyMeasured() > 0 && reinspect == null) {
                System.out.println("resuming lot " + lot + ": " + ready.alreadyMeasured()
                        + " part(s) already measured are not measured again");
            }
            System.out.println(setup.template().calibration().inForce());
            double qAt = ResultText.qFrequency(ready.plan());
            ResultText.tableHeader(System.out, qAt);
            Consumer<PartResult> row = r -> ResultText.tableRow(System.out, r, qAt);
            try (StopSignals signals = StopSignals.install(stop, lot, System.err);
                 LotProgress progress = LotProgress.start(Math.max(0, setup.sampleSize() - ready.alreadyMeasured()),
                         ready.plan().sweep().frequenciesHz().size())) {
                setup = setup.withListener(progress);
                if (tray != null && atPrompts) {
                    PartFeeder prompts = new ConsoleFeeder(new BufferedReader(new InputStreamReader(System.in,
                            StandardCharsets.UTF_8)), System.out);
                    outcome = LotRunner.run(setup, new ScannedTray(prompts, SimulatedPart.tray(tray.parts()), System.out),
                            row);
                } else if (tray != null) {
                    outcome = TrayRun.simulated(setup, tray, row);
                } else if (serials != null) {
                    outcome = TrayRun.switched(setup, serials, row);
                } else {
                    PartFeeder feeder = new ConsoleFeeder(new BufferedReader(new InputStreamReader(System.in,
                                    StandardCharsets.UTF_8)), System.out);
                    outcome = LotRunner.run(setup, feeder, row);
                }
            }
            ready.ledger().repairs().forEach(m -> System.out.println("repaired: " + m));
            summary = LotEnd.summary(outcome, store);
        }
        LotEnd.write(runsOption.runs, summary);
        System.out.println();
        ResultText.summary(System.out, summary);
        if (outcome.stopped()) {
            System.err.println("lrbench: " + StopSignals.stoppedMessage(lot, stop));
            return ExitCodes.LOT_OPEN;
        }
        return switch (outcome.disposition().state()) {
            case ACCEPT -> ExitCodes.PASS;
            case REJECT -> ExitCodes.FAIL;
            case OPEN -> ExitCodes.LOT_OPEN;
        };
    }

    /** The lot started through {@link LotStart}, its refusals in this command's own option names. */
    private static LotStart.Ready start(LotStart.Request request, ResultStore store) throws Exception {
        try {
            return LotStart.prepare(request, store);
        } catch (LotRefused e) {
            String hint = e.kind() == LotRefused.Kind.CHECK_REFUSED
                    ? " (or start anyway with --override-check REASON, recorded)" : "";
            throw new BadInputException(e.getMessage() + hint);
        }
    }

    /** A decided lot is closed: its disposition is printed, nothing is measured, and its exit code returned. */
    private static int closed(Inspection i) {
        System.out.printf("lot %s is closed: inspection %d was decided on %s: %s (%s).%nNothing was measured. To inspect"
                        + " it again, give --reinspect REASON; the earlier inspection is kept.%n", i.lot(), i.round(),
                i.finishedAt(), i.disposition().word().toUpperCase(Locale.ROOT), i.dispositionReason());
        return i.disposition() == LotDisposition.State.ACCEPT ? ExitCodes.PASS : ExitCodes.FAIL;
    }
}
