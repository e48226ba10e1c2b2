package org.lrbench.cli;

import java.nio.file.Path;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.yaml.ProblemsException;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code --bench} and {@code --drivers}, the same on every command that opens, calibrates or
 * simulates a bench: which bench file, and which folder of driver files its instruments use.
 */
final class BenchOptions {

    @Option(names = "--bench", paramLabel = "BENCH", description = "bench file (default: simulator/bench.yaml)")
    Path bench;

    @Mixin
    FolderOptions.Drivers drivers;

    Path benchFile() {
        return bench != null ? bench : Home.defaultBench();
    }

    BenchConfig load() throws ProblemsException {
        return Inputs.bench(benchFile());
    }

    Path driverFolder() {
        return drivers.folder();
    }

    DriverLoader loader() {
        return new DriverLoader(driverFolder());
    }
}
