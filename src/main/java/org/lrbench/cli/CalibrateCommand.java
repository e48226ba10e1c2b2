package org.lrbench.cli;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.FixtureCompensation;
import org.lrbench.calibration.SenseTrace;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.plan.Plan;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.FixtureChange;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.SimBench;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code lrbench calibrate PLAN}: measures the channel match and the fixture's open and short. */
@Command(name = "calibrate", mixinStandardHelpOptions = true, description = {"Measure the bench's channel match and fixture short and open.",
        "At the plan's frequencies; kept under DIR/BENCH/ and applied to later runs."})
final class CalibrateCommand implements Callable<Integer> {

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Parameters(index = "0", paramLabel = "PLAN", description = "the plan whose frequencies and fixture to calibrate")
    Path plan;

    @Option(names = "--sim", paramLabel = "PART.yaml", description = "calibrate the in-process simulated bench")
    Path sim;

    @picocli.CommandLine.Mixin
    LogOptions logging;

    @Override
    public Integer call() throws Exception {
        logging.apply();
        BenchConfig b = benchOptions.load();
        Plan p = Inputs.plan(plan, b);
        Inputs.requireFit(p, b, benchOptions.loader());
        // calibrated for the excitation the runs will use (the same choice: it depends on plan and bench only)
        p = Inputs.excitation(p, b, benchOptions.loader());
        SimBench simBench = null;
        if (sim != null) {
            Inputs.requireFile(sim, "simulated part");
            simBench = new SimBench(b.simulation(), p.wiring(), PartFile.load(sim));
        }
        Path written = calibrate(p, b, benchOptions.loader(), simBench, calibrationOption.calibration);
        System.out.println("corrections kept in " + written);
        return ExitCodes.PASS;
    }

    /** Runs both calibrations and stores them; prints what was found. */
    static Path calibrate(Plan p, BenchConfig b, DriverLoader drivers, SimBench simBench, Path dir) throws Exception {
        FixtureChange change = simBench != null ? simBench::setPosition
                : FixtureChange.console(new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8)),
                System.out);
        BenchClock sleeper = simBench != null ? BenchClock.NONE : BenchClock.REAL;
        CalibrationStore store = new CalibrationStore(dir, b.name());
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, simBench)) {
            // the level is proven with the fixture as it stands (its normal wiring) before any sweep at
            // the plan's level; a driver slip is refused here, before the first prompt
            inst.proveLevel(p, b, sleeper);
            ChannelMatch m = CalibrationRun.channels(p, inst, change, sleeper, b.accuracy());
            System.out.printf(Locale.ROOT, "channel match: channel 2 gain %.5f +/- %.5f, skew %.1f +/- %.1f ps (%d frequencies)%n",
                    m.gainRatio(), m.gainUncertainty(), m.skewSecond() * 1e12, m.skewUncertaintySecond() * 1e12, m.points());
            CalibrationRun.Fixtured fixtured = CalibrationRun.fixtureAndLinks(p, inst, change, sleeper, m);
            FixtureCompensation f = fixtured.fixture();
            m = fixtured.match();
            if (m.links() != null) {
                long ones = m.links().pairs().stream().map(x -> x.senseRangeVolt()).distinct().count();
                long twos = m.links().pairs().stream().map(x -> x.partRangeVolt()).distinct().count();
                System.out.printf(Locale.ROOT, "range links: %d ranges of channel 1 and %d of channel 2 linked from %d"
                        + " readings at %.6g Hz, the gain ratio of every pair of them solved%s%n", ones, twos,
                        m.links().readings().size(), m.links().frequencyHz(), m.links().unread().isEmpty() ? ""
                        : "; " + m.links().unread().size() + " pair(s) could not be read (no signal fills them at the"
                        + " plan's amplitude, or clipped; kept in channel-match.json)");
            }
            // the sense resistor traced by the meter, where the bench has one
            SenseTrace sense = CalibrationRun.senseResistor(p, inst, change, b.accuracy());
            // all kept only once all are plausible: a refused calibration leaves the earlier one in force
            store.save(m);
            store.save(f);
            FixtureCompensation.Point first = f.points().get(0);
            long opens = f.points().stream().filter(x -> !Double.isNaN(x.openReal()) && !x.modelled()).count();
            long modelled = f.points().stream().filter(FixtureCompensation.Point::modelled).count();
            System.out.printf(Locale.ROOT, "fixture: short %.2f mohm at %.6g Hz; open readable at %d of %d frequencies%s%n",
                    first.shortReal() * 1e3, first.frequencyHz(), opens, f.points().size(),
                    modelled > 0 ? "; the stray it shows is applied at the other " + modelled : "");
            if (sense != null) {
                store.save(sense);
                System.out.printf(Locale.ROOT, "sense resistor: %.6g ohm +/- %.2g ohm (4-wire, %d readings; nominal %.6g ohm)%n",
                        sense.valueOhm(), sense.standardUncertaintyOhm(), sense.readings(), sense.nominalOhm());
            } else {
                System.out.println("sense resistor: no meter on this bench; its nominal and tolerance stay in every budget");
            }
        }
        return dir.resolve(b.name());
    }
}
