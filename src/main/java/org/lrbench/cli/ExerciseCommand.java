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
import org.lrbench.fixture.FixturePosition;
import org.lrbench.measure.BenchClock;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench exercise}: the driver self-test on a bench's instruments. */
@Command(name = "exercise", mixinStandardHelpOptions = true, description = {"Driver self-test: every operation of the bench's drivers once, output off, then a low-level sine judged.",
        "Connects to the bench's instruments, identifies them, and prints ok or failed (with the exchange) per operation.",
        "Exit 0 when every operation worked, 3 otherwise, 2 for bad input."})
final class ExerciseCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    AddressOptions addresses;

    @Option(names = "--sim", paramLabel = "PART.yaml", description = "exercise the in-process simulated bench with this part")
    Path sim;

    @Option(names = "--plan", paramLabel = "PLAN",
            description = "play a low-level sine at a tenth of this plan's level into the fixture as it stands (a part"
                    + " in it, or none) and judge the traces; without it the same at 1 kHz with the fixture open")
    Path plan;

    @Mixin
    LogOptions logging;

    /** The probe without a plan: 1 kHz, the fixture open (the sense resistor then carries no current). */
    private static Plan openFixturePlan(BenchConfig b) throws Exception {
        double amplitude = Math.min(1.0, b.maxAmplitudeVolt());
        return PlanLoader.parse("plan_format: 1\npart_number: EXERCISE\nfixture: {sense_resistor: 100 ohm}\n"
                + "sine_sweep: {amplitude: " + amplitude + " V, frequencies: [1 kHz], cycles: 10, settle: 10 ms}\n"
                + "limits: [{characteristic: series_resistance, max: 1 kohm}]\n", "exercise probe", b.maxAmplitudeVolt());
    }

    @Override
    public Integer call() throws Exception {
        logging.apply();
        BenchConfig b = benchOptions.load();
        b = addresses.applyTo(b);
        Plan probe = plan != null ? Inputs.plan(plan, b) : openFixturePlan(b);
        SimBench simBench = null;
        if (sim != null) {
            Inputs.requireFile(sim, "simulated part");
            simBench = new SimBench(b.simulation(), probe.wiring() != null ? probe.wiring()
                    : org.lrbench.fixture.FixtureWiring.differential(probe.senseResistanceOhm()), PartFile.load(sim));
            if (plan == null) {
                simBench.setPosition(FixturePosition.OPEN);
            }
        }
        if (plan == null && simBench == null) {
            System.out.println("Leave the fixture open (no part) for the signal test, then press Enter"
                    + " (the generator output is off).");
            if (System.in.read() < 0) {
                throw new BadInputException("no answer on the console: give --plan PLAN to test with the fixture as it"
                        + " stands");
            }
        }
        List<DriverExercise.Step> steps = new java.util.ArrayList<>();
        try (BenchInstruments inst = BenchInstruments.open(b, benchOptions.loader(),
                simBench, true)) {
            steps.addAll(DriverExercise.run(inst, Math.min(1.0, b.maxAmplitudeVolt())));
            steps.addAll(DriverExercise.signal(inst, probe, b, simBench != null ? BenchClock.NONE : BenchClock.REAL));
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
