package org.lrbench.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.Map;
import java.util.Set;
import org.lrbench.bench.BenchConfig;
import org.lrbench.judge.CharacteristicClass;
import org.lrbench.judge.Limit;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.store.SqliteStore;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.LotSummary;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimLot;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench demo}: measures the simulated demo lot with its plan. */
@Command(name = "demo", description = "Measure the simulated demo lot (simulator/demo-lot.yaml) with its plan.")
final class DemoCommand implements Callable<Integer> {

    @Option(names = "--lot-file", paramLabel = "LOT.yaml", description = "simulated lot (default: simulator/demo-lot.yaml)")
    Path lotFile;

    @Option(names = "--bench", paramLabel = "BENCH", description = "bench file (default: simulator/bench.yaml)")
    Path bench;

    @Option(names = "--calibration", paramLabel = "DIR", defaultValue = "calibration",
            description = "bench corrections from `calibrate`, applied when present (default: ${DEFAULT-VALUE})")
    Path calibration;

    @Option(names = "--runs", paramLabel = "DIR", defaultValue = "runs",
            description = "folder for the results (default: ${DEFAULT-VALUE})")
    Path runs;

    @Option(names = "--data", paramLabel = "DIR", defaultValue = "data",
            description = "folder of the results store, DIR/lrbench.db (default: ${DEFAULT-VALUE})")
    Path data;

    @Override
    public Integer call() throws Exception {
        Path lotPath = lotFile != null ? lotFile : Home.demoLot();
        Inputs.requireFile(lotPath, "simulated lot");
        SimLot lot = SimLot.load(lotPath);
        Inputs.name("lot", lot.lot());
        BenchConfig b = Inputs.bench(bench != null ? bench : Home.defaultBench());
        Plan plan = Inputs.plan(lot.plan(), b);
        String sha = Inputs.sha256(lot.plan());
        DriverLoader drivers = new DriverLoader(Home.drivers());
        double qAt = ResultText.qFrequency(plan);
        System.out.printf("lot %s: %d parts of %s (%s), plan %s, simulated bench %s%n%n", lot.lot(), lot.parts().size(),
                plan.partNumber(), plan.description(), Home.root().relativize(lot.plan().toAbsolutePath()), b.name());
        // a bench is calibrated before a lot: channel match and fixture, here on the simulated bench
        System.out.println("calibrating the simulated bench at the plan's frequencies:");
        CalibrateCommand.calibrate(plan, b, new SimBench(b.simulation(), plan.senseResistanceOhm(),
                lot.parts().get(0).model()), calibration);
        Calibration corrections = new CalibrationStore(calibration, b.name()).load();
        System.out.println();
        int count = lot.parts().size();
        SamplingScheme scheme = plan.sampling();
        Integer lotSize = lot.lotSize();
        Integer sampleSize = null;
        if (scheme != null && lotSize != null) {
            sampleSize = LotDisposition.judge(lotSize, scheme, List.of()).sampleSize();
            System.out.printf("lot size %d, inspection level %s: ", lotSize, scheme.level());
            LotDisposition.plans(lotSize, scheme).forEach((c, p) -> System.out.printf("%s AQL %s -> code letter %c,"
                    + " plan %c, n = %d, Ac %d, Re %d; ", c.name().toLowerCase(java.util.Locale.ROOT), p.aql(),
                    p.codeLetter(), p.planLetter(), p.sampleSize(), p.acceptance(), p.rejection()));
            System.out.println();
            if (sampleSize > count) {
                throw new BadInputException(lotPath + ": the sample needs " + sampleSize + " parts; the tray holds " + count);
            }
            count = sampleSize;
        }
        System.out.println();
        ResultText.tableHeader(System.out, qAt);
        List<PartResult> results = new ArrayList<>();
        SqliteStore store = SqliteStore.open(data.resolve("lrbench.db"));
        // the demo measures its lot afresh each time; a real lot resumes where it stopped
        store.deleteLot(lot.lot());
        store.beginLot(lot.lot(), plan.partNumber(), plan.source(), sha, b.name(), lotSize, sampleSize,
                Instant.now().truncatedTo(ChronoUnit.MILLIS).toString());
        for (int i = 0; i < count; i++) {
            SimLot.Part part = lot.parts().get(i);
            Inputs.name("serial", part.serial());
            // each part gets its own noise: the bench seed advanced by the part's position
            BenchConfig partBench = b.withSimulation(b.simulation().withSeed(b.simulation().seed() + i));
            SimBench sim = new SimBench(partBench.simulation(), plan.senseResistanceOhm(), part.model());
            PartRun.Request request = new PartRun.Request(plan, sha, partBench, lot.lot(), part.serial(), true,
                    Home.version(), corrections);
            PartResult r;
            try (BenchInstruments instruments = BenchInstruments.open(partBench, drivers, sim)) {
                r = PartRun.measure(request, instruments, Sleeper.NONE, SweepListener.NONE);
            }
            ResultFiles.writeJson(runs.resolve(lot.lot()).resolve(part.serial() + ".json"), r);
            store.savePart(i + 1, r);
            results.add(r);
            ResultText.tableRow(System.out, r, qAt);
        }
        LotSummary summary = LotSummary.of(lot.lot(), plan.partNumber(), plan.source(),
                Instant.now().truncatedTo(ChronoUnit.MILLIS).toString(), results);
        if (sampleSize != null) {
            Map<String, Limit> byName = new java.util.HashMap<>();
            plan.limits().forEach(l -> byName.put(l.name(), l));
            List<Set<CharacteristicClass>> failed = new ArrayList<>();
            for (PartResult r : results) {
                if (!r.verdict().equals("error")) {
                    Set<CharacteristicClass> classes = java.util.EnumSet.noneOf(CharacteristicClass.class);
                    r.limits().stream().filter(l -> !l.pass()).forEach(l -> classes.add(byName.get(l.name()).characteristicClass()));
                    failed.add(classes);
                }
            }
            LotDisposition.Result d = LotDisposition.judge(lotSize, scheme, failed);
            String state = d.state().name().toLowerCase(java.util.Locale.ROOT);
            summary = summary.withDisposition(lotSize, sampleSize, state, d.reason());
            if (d.state() != LotDisposition.State.OPEN) {
                store.finishLot(lot.lot(), state, d.reason(), summary.finishedAt());
            }
        }
        store.close();
        Path summaryFile = runs.resolve(lot.lot()).resolve("lot-summary.json");
        ResultFiles.writeJson(summaryFile, summary);
        System.out.println();
        ResultText.summary(System.out, summary);
        System.out.println("store: " + data.resolve("lrbench.db"));
        System.out.println("results: " + runs.resolve(lot.lot()) + "/");
        return ExitCodes.PASS;
    }
}
