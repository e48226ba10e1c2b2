package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.bench.InstrumentLink;
import org.lrbench.calibration.Calibration;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimGenerator;
import org.lrbench.sim.server.SimServer;
import org.lrbench.transport.Address;
import org.lrbench.transport.inproc.InProcessTransport;

/**
 * Every plan in plans/ measured end to end on every simulated digitizer personality, each behind
 * its own driver file, in-process and over TCP: after calibration, L within 0.1 % and R within
 * 1 % of the simulated part's true values (common practice, no source: what an incoming
 * inspection of chokes needs from a bench whose limits are several percent wide).
 */
class PersonalityTests {
    static final Path HOME = TestBench.home();

    static Stream<Arguments> benchesAndPlans() throws Exception {
        List<Path> plans;
        try (Stream<Path> files = Files.list(HOME.resolve("plans"))) {
            plans = files.filter(f -> f.toString().endsWith(".yaml")).sorted().toList();
        }
        return Stream.of("simulator/bench.yaml", "simulator/bench-pm12.yaml", "simulator/bench-div8.yaml",
                "simulator/bench-div8-polled.yaml")
                .flatMap(b -> plans.stream().map(p -> Arguments.of(b, p.getFileName().toString())));
    }

    @ParameterizedTest(name = "{1} on {0}")
    @MethodSource("benchesAndPlans")
    void everyPlanMeasuresTheTruthOnEveryPersonalityInProcessAndOverTcp(String benchFile, String planFile, @TempDir Path dir)
            throws Exception {
        BenchConfig b = BenchLoader.load(HOME.resolve(benchFile));
        Plan plan = PlanLoader.load(HOME.resolve("plans").resolve(planFile), b.maxAmplitudeVolt());
        PartModel truth = PartFile.load(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml"));
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), truth);
        DriverLoader drivers = new DriverLoader(HOME.resolve("drivers"));
        Calibration corrections;
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            corrections = CalibrationRun.calibrate(plan, inst, sim::setPosition, BenchClock.NONE);
        }
        PartRun.Request request = new PartRun.Request(plan, "0", b, "L", "S", true, "test", corrections);
        PartResult local;
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            local = PartRun.measure(request, inst, BenchClock.NONE, SweepListener.NONE);
        }
        PartResult tcp;
        try (SimServer server = new SimServer(sim, 0)) {
            BenchConfig overTcp = b.withAddresses(Address.parse("tcp://127.0.0.1:" + server.generatorPort()),
                    Address.parse("tcp://127.0.0.1:" + server.digitizerPort()));
            try (BenchInstruments inst = BenchInstruments.open(overTcp, drivers, null)) {
                tcp = PartRun.measure(request, inst, BenchClock.NONE, SweepListener.NONE);
            }
        }
        for (PartResult r : List.of(local, tcp)) {
            assertThat(r.error()).as(benchFile).isNull();
            assertThat(r.inductanceH()).as(benchFile + " L").isCloseTo(truth.inductanceHenry(),
                    within(1e-3 * truth.inductanceHenry()));
            assertThat(r.seriesResistanceOhm()).as(benchFile + " R").isCloseTo(truth.seriesResistanceOhm(),
                    within(1e-2 * truth.seriesResistanceOhm()));
        }
    }

    /**
     * Every generator driver sets the same open-circuit EMF: one by telling the generator its load is
     * high impedance, one by declaring its levels referred to 50 ohm behind 50 ohm, so that a setting
     * of V across the load is an EMF of 2 V (voltage divider, circuit theory), and one on the
     * peak-EMF personality, whose levels are the EMF.
     */
    @Test
    void everyGeneratorDriverSetsTheSameOpenCircuitEmf() throws Exception {
        for (String driverName : List.of("generic-source", "sim-source-matched", "sim-source-peak")) {
            SimGenerator g = new SimGenerator(50, driverName.equals("sim-source-peak")
                    ? SimGenerator.Personality.PEAK_EMF : SimGenerator.Personality.GENERIC);
            DriverFile d = new DriverLoader(HOME.resolve("drivers")).load(driverName, DriverKind.SOURCE);
            ScpiGenerator gen = new ScpiGenerator(new ScpiSession("generator",
                    new InProcessTransport("sim://generator", g), Duration.ofSeconds(1)), d);
            gen.prepare();
            gen.setAmplitude(1.5);
            gen.setOffset(0.25);
            gen.outputOn(); // the simulated generator reports its EMF only while the output is on
            assertThat(g.emfPeak()).as(driverName).isCloseTo(1.5, within(1e-9));
            assertThat(g.emfOffset()).as(driverName).isCloseTo(0.25, within(1e-9));
            gen.outputOff();
        }
    }

    /**
     * The per-division digitizer driven the other way its dialect allows: time per division (the
     * instrument picks the interval) and the scaling by one query per field. Same truth, same bounds.
     */
    @Test
    void theSameDigitizerDrivenByTimePerDivisionAndSeparateScaleQueriesMeasuresTheTruth() throws Exception {
        BenchConfig div8 = BenchLoader.load(HOME.resolve("simulator/bench-div8.yaml"));
        BenchConfig b = new BenchConfig(div8.source(), div8.name(), div8.maxAmplitudeVolt(), div8.generator(),
                new InstrumentLink("sim-div8-timebase-digitizer", div8.digitizer().address()),
                div8.switchUnit(), div8.meter(), div8.simulation(), div8.accuracy());
        Plan plan = PlanLoader.load(HOME.resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        PartModel truth = PartFile.load(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml"));
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), truth);
        DriverLoader drivers = new DriverLoader(HOME.resolve("drivers"));
        Calibration corrections;
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            corrections = CalibrationRun.calibrate(plan, inst, sim::setPosition, BenchClock.NONE);
        }
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            PartResult r = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "S", true, "test", corrections), inst,
                    BenchClock.NONE, SweepListener.NONE);
            assertThat(r.error()).isNull();
            assertThat(r.inductanceH()).isCloseTo(truth.inductanceHenry(), within(1e-3 * truth.inductanceHenry()));
            assertThat(r.seriesResistanceOhm()).isCloseTo(truth.seriesResistanceOhm(),
                    within(1e-2 * truth.seriesResistanceOhm()));
        }
    }

    /** A range list the instrument answers stands for declared limits: the same personality, ranges queried. */
    @Test
    void aQueriedRangeListGivesTheRangeLimits(@TempDir Path dir) throws Exception {
        String text = Files.readString(HOME.resolve("drivers/sim-pm12-digitizer.yaml"))
                .replaceAll("(?m)^  ranges: .*\\n", "")
                .replace("  range_query: \":INLet{channel}:SPAN?\"", "  range_query: \":INLet{channel}:SPAN?\"\n"
                        + "  range_list_query: \":INLet{channel}:SPAN:STEPs?\"");
        Files.writeString(dir.resolve("pm12-listed.yaml"), text);
        DriverFile d = new DriverLoader(dir).load("pm12-listed", DriverKind.DIGITIZER);
        assertThat(d.digitizer().vertical().ranges()).isEmpty();
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench-pm12.yaml"));
        SimBench sim = new SimBench(b.simulation(), 100, PartFile.load(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml")));
        ScpiDigitizer dig = new ScpiDigitizer(new ScpiSession("digitizer",
                new InProcessTransport("sim://digitizer", sim.digitizer()),
                Duration.ofSeconds(1)), d);
        dig.prepare();
        // plus-minus 5 mV to 50 V is 10 mV to 100 V peak-to-peak
        assertThat(dig.rangeLimits(1).minVolt()).isCloseTo(0.01, within(1e-12));
        assertThat(dig.rangeLimits(2).maxVolt()).isCloseTo(100, within(1e-9));
    }

    /**
     * A range list that is not the instrument's (here each step half as large again as the per-division
     * instrument's 1-2-5 volts per division, which it rounds to the nearest): the first listed range asked
     * for comes back another, and the part ends in an instrument error that names the key, not in a
     * ranger that plans on ranges it never gets.
     */
    @Test
    void aRangeListThatIsNotTheInstrumentsIsNamedAtTheFirstGrant(@TempDir Path dir) throws Exception {
        String text = Files.readString(HOME.resolve("drivers/sim-div8-digitizer.yaml")).replaceAll("(?m)^  ranges: .*$",
                "  ranges: [1.5 mV, 3 mV, 7.5 mV, 15 mV, 30 mV, 75 mV, 150 mV, 300 mV, 750 mV, 1.5 V, 3 V, 7.5 V]");
        Files.writeString(dir.resolve("div8-wrong-list.yaml"), text);
        Files.copy(HOME.resolve("drivers/sim-source-matched.yaml"), dir.resolve("sim-source-matched.yaml"));
        Files.copy(HOME.resolve("drivers/generic-source.yaml"), dir.resolve("generic-source.yaml"));
        BenchConfig div8 = BenchLoader.load(HOME.resolve("simulator/bench-div8.yaml"));
        BenchConfig b = new BenchConfig(div8.source(), div8.name(), div8.maxAmplitudeVolt(), div8.generator(),
                new InstrumentLink("div8-wrong-list", div8.digitizer().address()), null, null, div8.simulation(),
                div8.accuracy());
        Plan plan = PlanLoader.load(HOME.resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), PartFile.load(HOME.resolve(
                "simulator/parts/qfd-ind-1m0-nominal.yaml")));
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(dir), sim)) {
            PartResult r = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "S", true, "test", Calibration.NONE),
                    inst, BenchClock.NONE, SweepListener.NONE);
            assertThat(r.error()).contains("vertical.ranges").contains("when asked for");
        }
    }

    /**
     * A polled digitizer driven by a driver that leaves out its acquisition section (so lrbench waits
     * with *OPC?, the default), on an instrument that does not answer *OPC? while it captures: the error
     * names what to declare (acquisition: complete: poll), not only "no reply". An instrument that,
     * once sent *OPC?, answers nothing more (blocked on it) is not waited for a second whole timeout
     * by the error query that follows: that query gets one second.
     */
    @Test
    void aPolledDigitizerWithoutItsPollSectionIsToldWhatToDeclare(@TempDir Path dir) throws Exception {
        String text = Files.readString(HOME.resolve("drivers/sim-pm12-digitizer.yaml"))
                .replaceAll("acquisition:\\n(  .*\\n)+", "").replaceAll("(?m)^timeout: .*$", "timeout: 3 s");
        Files.writeString(dir.resolve("pm12-no-poll.yaml"), text);
        DriverFile d = new DriverLoader(dir).load("pm12-no-poll", DriverKind.DIGITIZER);
        assertThat(d.digitizer().acquisition().complete()).isEqualTo(DigitizerTraits.Completion.OPC);
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench-pm12.yaml"));
        SimBench sim = new SimBench(b.simulation(), 100, PartFile.load(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml")));
        org.lrbench.transport.inproc.InProcessPeer inner = sim.digitizer();
        // a message with *OPC? is taken in and never answered, nor is anything after it: the instrument
        // blocks on an *OPC? it cannot complete while capturing
        org.lrbench.transport.inproc.InProcessPeer deaf = new org.lrbench.transport.inproc.InProcessPeer() {
            private boolean blocked;

            @Override
            public void receive(byte[] bytes) {
                blocked |= new String(bytes, java.nio.charset.StandardCharsets.ISO_8859_1).contains("*OPC?");
                if (!blocked) {
                    inner.receive(bytes);
                }
            }

            @Override
            public int transmit(byte[] dst, int offset, int length) {
                return inner.transmit(dst, offset, length);
            }

            @Override
            public void discardOutput() {
                inner.discardOutput();
            }
        };
        ScpiDigitizer dig = new ScpiDigitizer(new ScpiSession("digitizer", new InProcessTransport("sim://digitizer", deaf),
                d.timeout()), d);
        dig.prepare();
        dig.setRanges(2, 2);
        dig.setTiming(1e-5, 1000);
        org.assertj.core.api.Assertions.assertThatThrownBy(dig::acquire)
                .isInstanceOf(org.lrbench.instrument.InstrumentException.class)
                .hasMessageContaining("no reply").hasMessageContaining("complete: poll")
                .hasMessageContaining("timeout 3000 ms").hasMessageContaining("not answered within 1000 ms either");
    }

    /**
     * The generic simulated digitizer divides its clock by whole numbers, so it rounds a requested interval
     * down: a driver declaring timebase.rounding: down is kept, one declaring up is refused at the first
     * interval granted finer than asked, naming the key.
     */
    @Test
    void aDeclaredIntervalRoundingIsHeldToTheInstrument(@TempDir Path dir) throws Exception {
        String base = Files.readString(HOME.resolve("drivers/generic-digitizer.yaml"));
        BenchConfig b = BenchLoader.load(HOME.resolve("simulator/bench.yaml"));
        for (String rounding : new String[] {"down", "up"}) {
            Files.writeString(dir.resolve("generic-" + rounding + ".yaml"), base + "\ntimebase:\n  rounding: " + rounding + "\n");
            DriverFile d = new DriverLoader(dir).load("generic-" + rounding, DriverKind.DIGITIZER);
            SimBench sim = new SimBench(b.simulation(), 100, PartFile.load(HOME.resolve(
                    "simulator/parts/qfd-ind-1m0-nominal.yaml")));
            ScpiDigitizer dig = new ScpiDigitizer(new ScpiSession("digitizer", new InProcessTransport("sim://digitizer",
                    sim.digitizer()), Duration.ofSeconds(1)), d);
            dig.prepare();
            // an interval between two of the clock's: granted the one below
            double asked = 1.3705e-6; // the clock is 1 ns: granted 1.370 us
            if (rounding.equals("down")) {
                assertThat(dig.setTiming(asked, 1000).sampleIntervalSecond()).isLessThan(asked);
            } else {
                org.assertj.core.api.Assertions.assertThatThrownBy(() -> dig.setTiming(asked, 1000))
                        .isInstanceOf(org.lrbench.instrument.InstrumentException.class)
                        .hasMessageContaining("timebase.rounding: up");
            }
        }
    }
}
