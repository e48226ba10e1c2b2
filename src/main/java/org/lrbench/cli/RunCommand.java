package org.lrbench.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench run PLAN --lot L --serial S}: measures one part. */
@Command(name = "run", description = {"Measure one part with a plan and judge it.",
        "Exit codes: 0 pass, 1 fail, 2 bad input, 3 instrument or communication error."})
final class RunCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Option(names = "--lot", required = true, paramLabel = "LOT", description = "lot number")
    String lot;

    @Option(names = "--serial", required = true, paramLabel = "SN", description = "the part's serial number")
    String serial;

    @Option(names = "--sim", paramLabel = "PART.yaml",
            description = "measure on the in-process simulated bench, with this simulated part under test")
    Path sim;

    @Option(names = "--json", paramLabel = "OUT.json", description = "also write the result to this file")
    Path json;

    @Option(names = "--bench", paramLabel = "BENCH", description = "bench file (default: simulator/bench.yaml)")
    Path bench;

    @Option(names = "--generator", paramLabel = "ADDR", description = "generator address, instead of the bench file's")
    String generatorAddress;

    @Option(names = "--digitizer", paramLabel = "ADDR", description = "digitizer address, instead of the bench file's")
    String digitizerAddress;

    @Option(names = "--calibration", paramLabel = "DIR", defaultValue = "calibration",
            description = "bench corrections from `calibrate`, applied when present (default: ${DEFAULT-VALUE})")
    Path calibration;

    @Option(names = "--runs", paramLabel = "DIR", defaultValue = "runs",
            description = "folder that keeps every result, as DIR/LOT/SERIAL.json (default: ${DEFAULT-VALUE})")
    Path runs;

    @Override
    public Integer call() throws Exception {
        Inputs.name("--lot", lot);
        Inputs.name("--serial", serial);
        BenchConfig b = Inputs.bench(bench != null ? bench : Home.defaultBench());
        if (sim != null && (generatorAddress != null || digitizerAddress != null)) {
            throw new BadInputException("--sim measures on the in-process simulated bench; it cannot be combined"
                    + " with --generator or --digitizer");
        }
        b = b.withAddresses(Inputs.address("--generator", generatorAddress), Inputs.address("--digitizer", digitizerAddress));
        Plan p = Inputs.plan(plan, b);
        SimBench simBench = null;
        if (sim != null) {
            Inputs.requireFile(sim, "simulated part");
            PartModel part = PartFile.load(sim);
            simBench = new SimBench(b.simulation(), p.senseResistanceOhm(), part);
        }
        PartRun.Request request = new PartRun.Request(p, Inputs.sha256(plan), b, lot, serial, sim != null, Home.version(),
                new CalibrationStore(calibration, b.name()).load());
        PartResult result;
        try (BenchInstruments instruments = BenchInstruments.open(b, new DriverLoader(Home.drivers()), simBench)) {
            result = PartRun.measure(request, instruments, sim != null ? Sleeper.NONE : Sleeper.REAL, SweepListener.NONE);
        }
        ResultFiles.writeJson(runs.resolve(lot).resolve(serial + ".json"), result);
        if (json != null) {
            ResultFiles.writeJson(json, result);
        }
        ResultText.part(System.out, result);
        if (result.error() != null) {
            System.err.println("lrbench: measurement error: " + result.error());
        }
        return ExitCodes.of(Verdict.valueOf(result.verdict().toUpperCase(java.util.Locale.ROOT)));
    }
}
