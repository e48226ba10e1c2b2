package org.lrbench.cli;

import org.lrbench.bench.BenchConfig;
import picocli.CommandLine.Option;

/** {@code --generator} and {@code --digitizer}: instrument addresses given instead of the bench file's. */
final class AddressOptions {

    @Option(names = "--generator", paramLabel = "ADDR", description = "generator address, instead of the bench file's")
    String generator;

    @Option(names = "--digitizer", paramLabel = "ADDR", description = "digitizer address, instead of the bench file's")
    String digitizer;

    boolean any() {
        return generator != null || digitizer != null;
    }

    /** The bench with these addresses in place of its own (each checked before anything is opened). */
    BenchConfig applyTo(BenchConfig bench) {
        return bench.withAddresses(Inputs.address("--generator", generator), Inputs.address("--digitizer", digitizer));
    }
}
