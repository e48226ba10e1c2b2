package org.lrbench.cli;

import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.benchmark.AccuracyBenchmark;
import org.lrbench.benchmark.CoverageBenchmark;
import org.lrbench.benchmark.FitBenchmark;
import org.lrbench.benchmark.KillSoak;
import org.lrbench.benchmark.LinkBenchmark;
import org.lrbench.benchmark.ServiceBenchmark;
import org.lrbench.plan.Plan;
import org.lrbench.sim.PartFile;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench benchmark links}: measured ratios, printed side by side. */
@Command(name = "benchmark", mixinStandardHelpOptions = true, description = "Print measured speed figures and their ratios to a baseline.",
        subcommands = {BenchmarkCommand.Links.class, BenchmarkCommand.Fits.class, BenchmarkCommand.Accuracy.class,
            BenchmarkCommand.Service.class, BenchmarkCommand.Kills.class, BenchmarkCommand.Coverage.class,
            BenchmarkCommand.Throughput.class, BenchmarkCommand.Records.class})
final class BenchmarkCommand implements Runnable {

    /** The demo plan, which the link and throughput benchmarks measure. */
    static Plan demoPlan(BenchConfig bench) throws Exception {
        return Inputs.plan(Home.root().resolve("plans/qfd-ind-1m0.yaml"), bench);
    }

    /** The demo part number's nominal simulated part. */
    static org.lrbench.sim.PartModel nominalPart() throws Exception {
        return PartFile.load(Home.root().resolve("simulator/parts/qfd-ind-1m0-nominal.yaml"));
    }


    @Override
    public void run() {
        System.out.println("use: lrbench benchmark links | fits | accuracy | service | kills | coverage | throughput | records");
    }

    @Command(name = "fits", mixinStandardHelpOptions = true, description = "Sine-fit throughput on 1 M and 10 M samples against a plain summing pass.")
    static final class Fits implements Callable<Integer> {
        @Option(names = "--repeats", defaultValue = "7", description = "runs per size (default: ${DEFAULT-VALUE})")
        int repeats;

        @Override
        public Integer call() {
            if (repeats < 1 || repeats > 100) {
                throw new BadInputException("--repeats 1..100");
            }
            FitBenchmark.run(System.out, repeats);
            return ExitCodes.PASS;
        }
    }

    @Command(name = "accuracy", mixinStandardHelpOptions = true, description = "Bias and spread of R and L over many seeds against the Cramer-Rao bound.")
    static final class Accuracy implements Callable<Integer> {
        @Option(names = "--repeats", defaultValue = "300", description = "seeds (default: ${DEFAULT-VALUE})")
        int repeats;

        @Override
        public Integer call() throws Exception {
            if (repeats < 10 || repeats > 100_000) {
                throw new BadInputException("--repeats 10..100000");
            }
            AccuracyBenchmark.run(System.out, Inputs.bench(Home.defaultBench()), Home.drivers(),
                    repeats);
            return ExitCodes.PASS;
        }
    }

    @Command(name = "service", mixinStandardHelpOptions = true, description = "Event-stream clients and status latency of the bench service on loopback.")
    static final class Service implements Callable<Integer> {
        @Option(names = "--clients", defaultValue = "50", description = "event-stream clients (default: ${DEFAULT-VALUE})")
        int clients;

        @Override
        public Integer call() throws Exception {
            if (clients < 1 || clients > 500) {
                throw new BadInputException("--clients 1..500");
            }
            ServiceBenchmark.run(System.out, Home.root(), Home.drivers(), Home.defaultBench(), clients);
            return ExitCodes.PASS;
        }
    }

    @Command(name = "links", mixinStandardHelpOptions = true, description = {"Trace transfer over loopback TCP against a plain socket;",
            "round trips per sweep point and the time share outside the instruments."})
    static final class Links implements Callable<Integer> {
        @Option(names = "--points", defaultValue = "10000000", description = "trace samples (default: ${DEFAULT-VALUE})")
        int points;

        @Option(names = "--repeats", defaultValue = "11", description = "fetches per path (default: ${DEFAULT-VALUE})")
        int repeats;

        @Override
        public Integer call() throws Exception {
            if (points < 16 || points > 16 * 1024 * 1024 || repeats < 1 || repeats > 100) {
                throw new BadInputException("--points 16..16777216 and --repeats 1..100");
            }
            BenchConfig bench = Inputs.bench(Home.defaultBench());
            Plan plan = demoPlan(bench);
            LinkBenchmark.run(System.out, bench, plan, Home.drivers(),
                    nominalPart(), points, repeats);
            return ExitCodes.PASS;
        }
    }

    @Command(name = "throughput", mixinStandardHelpOptions = true, description = {"Time per part of the demo plan on the"
            + " simulated bench with instruments that take time,", "per timing profile, against the plan's physical minimum;"
            + " round trips per point.", "Example: lrbench benchmark throughput --profiles lan,usb"})
    static final class Throughput implements Callable<Integer> {
        @Option(names = "--profiles", split = ",", defaultValue = "lan,usb", paramLabel = "NAME",
                description = "timing profiles: none, lan, usb, serial (default: ${DEFAULT-VALUE})")
        List<String> profiles;

        @Override
        public Integer call() throws Exception {
            List<org.lrbench.sim.SimTiming> timings = new java.util.ArrayList<>();
            for (String p : profiles) {
                try {
                    timings.add(org.lrbench.sim.SimTiming.named(p));
                } catch (IllegalArgumentException e) {
                    throw new BadInputException("--profiles: " + e.getMessage());
                }
            }
            BenchConfig bench = Inputs.bench(Home.defaultBench());
            Plan plan = demoPlan(bench);
            // every digitizer dialect the simulator speaks, for the round trips of a whole part
            List<BenchConfig> dialects = new java.util.ArrayList<>();
            for (String name : List.of("bench.yaml", "bench-pm12.yaml", "bench-div8.yaml", "bench-div8-polled.yaml")) {
                dialects.add(Inputs.bench(Home.root().resolve("simulator").resolve(name)));
            }
            int misses = org.lrbench.benchmark.ThroughputBenchmark.run(System.out, bench, plan, Home.drivers(),
                    nominalPart(), timings, org.lrbench.sim.SimLot.load(Home.demoLot()), dialects);
            return misses == 0 ? ExitCodes.PASS : ExitCodes.FAIL;
        }
    }

    @Command(name = "records", mixinStandardHelpOptions = true, description = {"A lab's records at size: the lot report's"
            + " size and time and the verify time per sample size (8 to 315 parts),", "and runs racing for one lot."})
    static final class Records implements Callable<Integer> {
        @Option(names = "--largest", defaultValue = "315", description = "the largest sample measured: 8, 50, 125 or 315"
                + " (default: ${DEFAULT-VALUE})")
        int largest;

        @Override
        public Integer call() throws Exception {
            if (!List.of(8, 50, 125, 315).contains(largest)) {
                throw new BadInputException("--largest " + largest + ": allowed are 8, 50, 125, 315");
            }
            BenchConfig bench = Inputs.bench(Home.defaultBench());
            int misses = org.lrbench.benchmark.RecordsBenchmark.run(System.out, bench,
                    Home.root().resolve("plans/qfd-ind-1m0.yaml"), Home.drivers(), largest);
            return misses == 0 ? ExitCodes.PASS : ExitCodes.FAIL;
        }
    }

    @Command(name = "kills", mixinStandardHelpOptions = true, description = {"The kill soak: a simulated lot run in a child process killed with SIGKILL at",
            "random moments and resumed each time; then every invariant of the records is checked."})
    static final class Kills implements Callable<Integer> {
        @Option(names = "--kills", defaultValue = "30", description = "SIGKILLs in all (default: ${DEFAULT-VALUE})")
        int kills;

        @Option(names = "--seed", defaultValue = "1", description = "seed of the kill moments (default: ${DEFAULT-VALUE})")
        long seed;

        @Override
        public Integer call() throws Exception {
            if (kills < 1 || kills > 10_000) {
                throw new BadInputException("--kills 1..10000");
            }
            int violations = KillSoak.run(System.out, Home.root(),
                    Home.root().resolve("plans/qfd-ind-1m0.yaml"), Home.demoLot(), kills, seed);
            return violations == 0 ? ExitCodes.PASS : ExitCodes.FAIL;
        }
    }

    @Command(name = "coverage", mixinStandardHelpOptions = true, description = {"Coverage of the expanded uncertainty over a matrix of simulated parts,",
            "each calibrated and measured on independent seeds; every miss of a goal is marked."})
    static final class Coverage implements Callable<Integer> {
        @Option(names = "--seeds", defaultValue = "100", description = "seeds per part (default: ${DEFAULT-VALUE})")
        int seeds;

        @Option(names = "--bench-errors", defaultValue = "both", description = {"on: each seed a bench with its sense"
                + " resistor, range stages and meter off within their specifications; off: those exact;",
                "both (default): one after the other"})
        String benchErrors;

        @Option(names = "--parts", split = ",", paramLabel = "TEXT", description = "only the parts whose name contains"
                + " one of these (e.g. '4.7 mH,22 mH'), to look closer at some with more seeds")
        List<String> parts;

        @Option(names = "--excitation", defaultValue = "stepped", description = "stepped (default) or multisine: how"
                + " every plan of the matrix sweeps")
        String excitation;

        @Option(names = "--first-seed", defaultValue = "1000", description = {"seed of the first run (each run takes"
                + " two: calibration and measurement; default: ${DEFAULT-VALUE});",
                "every part draws the same noise from one set, so another set tells a set's luck from the budget"})
        long firstSeed;

        @picocli.CommandLine.Mixin
        BenchOptions benchOptions;

        @Override
        public Integer call() throws Exception {
            if (firstSeed < 0) {
                throw new BadInputException("--first-seed " + firstSeed + ": allowed are 0 and above");
            }
            if (!java.util.Set.of("stepped", "multisine").contains(excitation)) {
                throw new BadInputException("--excitation '" + excitation + "': allowed are stepped, multisine");
            }
            boolean multisine = excitation.equals("multisine");
            if (parts != null && !CoverageBenchmark.names(parts)) {
                throw new BadInputException("--parts " + String.join(",", parts) + ": no part of the matrix matches");
            }
            if (seeds < 5 || seeds > 10_000) {
                throw new BadInputException("--seeds 5..10000");
            }
            if (!java.util.Set.of("on", "off", "both").contains(benchErrors)) {
                throw new BadInputException("--bench-errors '" + benchErrors + "': allowed are on, off, both");
            }
            int misses = 0;
            if (!benchErrors.equals("on")) {
                misses += CoverageBenchmark.run(System.out, benchOptions.load(), benchOptions.driverFolder(), seeds, false,
                        parts, multisine, firstSeed);
            }
            if (!benchErrors.equals("off")) {
                misses += CoverageBenchmark.run(System.out, benchOptions.load(), benchOptions.driverFolder(), seeds, true,
                        parts, multisine, firstSeed);
            }
            return misses == 0 ? ExitCodes.PASS : ExitCodes.FAIL;
        }
    }
}
