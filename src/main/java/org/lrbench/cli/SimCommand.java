package org.lrbench.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.lrbench.bench.BenchConfig;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.server.PtyServer;
import org.lrbench.sim.server.SimServer;
import org.lrbench.units.Dimension;
import org.lrbench.units.UnitException;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench sim --dut PART.yaml}: serves the simulated bench over TCP (and a terminal). */
@Command(name = "sim", mixinStandardHelpOptions = true, description = {"Serve the simulated generator and digitizer over TCP on 127.0.0.1 until Ctrl-C.",
        "Point `run --generator tcp://127.0.0.1:PORT --digitizer tcp://127.0.0.1:PORT+1` at it."})
final class SimCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Option(names = "--dut", required = true, paramLabel = "PART.yaml", description = "the simulated part under test")
    Path dut;

    @Option(names = "--port", paramLabel = "N", defaultValue = "5025",
            description = "generator port; the digitizer takes N+1; 0 picks free ports (default: ${DEFAULT-VALUE})")
    int port;

    @Option(names = "--sense", paramLabel = "R", defaultValue = "100 ohm",
            description = "the fixture's sense resistor; must match the plan's (default: ${DEFAULT-VALUE})")
    String sense;

    @Option(names = "--pty", paramLabel = "DEVICE", description = "also serve one instrument on this terminal device")
    Path pty;

    @Option(names = "--pty-instrument", paramLabel = "NAME", defaultValue = "generator",
            description = "which instrument --pty serves: generator or digitizer (default: ${DEFAULT-VALUE})")
    String ptyInstrument;

    @Override
    public Integer call() throws Exception {
        if (port < 0 || port > 65534) {
            throw new BadInputException("--port " + port + ": use 0 (free ports) or 1 to 65534");
        }
        double senseOhm;
        try {
            senseOhm = Units.parse(sense, Dimension.RESISTANCE);
        } catch (UnitException e) {
            throw new BadInputException("--sense: " + e.getMessage());
        }
        if (!ptyInstrument.equals("generator") && !ptyInstrument.equals("digitizer")) {
            throw new BadInputException("--pty-instrument '" + ptyInstrument + "': use generator or digitizer");
        }
        BenchConfig b = benchOptions.load();
        Inputs.requireFile(dut, "simulated part");
        SimBench sim = new SimBench(b.simulation(), senseOhm, PartFile.load(dut));
        CountDownLatch stop = new CountDownLatch(1);
        try (SimServer server = new SimServer(sim, port);
             PtyServer ptyServer = pty == null ? null
                     : new PtyServer(ptyInstrument.equals("generator") ? sim.generator() : sim.digitizer(), pty)) {
            System.out.println("generator listening on tcp://127.0.0.1:" + server.generatorPort());
            System.out.println("digitizer listening on tcp://127.0.0.1:" + server.digitizerPort());
            if (ptyServer != null) {
                System.out.println(ptyInstrument + " also served on " + pty);
            }
            System.out.println("simulating " + dut + " behind " + sense + " on bench " + b.name() + "; Ctrl-C stops");
            System.out.flush();
            Runtime.getRuntime().addShutdownHook(new Thread(stop::countDown));
            stop.await();
        }
        return ExitCodes.PASS;
    }
}
