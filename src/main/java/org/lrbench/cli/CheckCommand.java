package org.lrbench.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.plan.Plan;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench check PLAN}: validates a plan against a bench. */
@Command(name = "check", description = "Validate a plan; print every problem as file:line:column: key: message.")
final class CheckCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan file (YAML)")
    Path plan;

    @Option(names = "--bench", paramLabel = "BENCH", description = "bench file (default: simulator/bench.yaml)")
    Path bench;

    @Override
    public Integer call() throws Exception {
        BenchConfig b = Inputs.bench(bench != null ? bench : Home.defaultBench());
        Plan p = Inputs.plan(plan, b);
        System.out.printf("%s: ok, part number %s, %d frequencies from %.6g Hz to %.6g Hz, %d limits, bench %s%n",
                plan, p.partNumber(), p.sweep().frequenciesHz().size(), p.sweep().lowestHz(), p.sweep().highestHz(),
                p.limits().size(), b.name());
        return ExitCodes.PASS;
    }
}
