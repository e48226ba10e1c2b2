package org.lrbench.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.DriverExercise;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.SimBench;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench exercise}: the driver self-test on a bench's instruments. */
@Command(name = "exercise", mixinStandardHelpOptions = true, description = {"Driver self-test: every operation of the bench's drivers once, output off.",
        "Connects to the bench's instruments, identifies them, and prints ok or failed (with the exchange) per operation.",
        "Exit 0 when every operation worked, 3 otherwise, 2 for bad input."})
final class ExerciseCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    AddressOptions addresses;

    @Option(names = "--sim", paramLabel = "PART.yaml", description = "exercise the in-process simulated bench with this part")
    Path sim;

    @Mixin
    LogOptions logging;

    @Override
    public Integer call() throws Exception {
        logging.apply();
        BenchConfig b = benchOptions.load();
        b = addresses.applyTo(b);
        SimBench simBench = null;
        if (sim != null) {
            Inputs.requireFile(sim, "simulated part");
            simBench = new SimBench(b.simulation(), 100, PartFile.load(sim));
        }
        List<DriverExercise.Step> steps;
        try (BenchInstruments inst = BenchInstruments.open(b, benchOptions.loader(),
                simBench, true)) {
            steps = DriverExercise.run(inst, Math.min(1.0, b.maxAmplitudeVolt()));
        }
        int failed = 0;
        for (DriverExercise.Step s : steps) {
            System.out.printf("%-6s %-9s %-52s %s%n", s.ok() ? "ok" : "FAILED", s.instrument(), s.operation(), s.detail());
            failed += s.ok() ? 0 : 1;
        }
        System.out.printf("%d of %d operations worked%s%n", steps.size() - failed, steps.size(),
                failed == 0 ? "" : "; --io-log FILE records every exchange");
        return failed == 0 ? ExitCodes.PASS : ExitCodes.INSTRUMENT;
    }
}
