package org.lrbench.transport.tcp;

import org.lrbench.judge.Verdict;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.cli.Main;
import org.lrbench.driver.DriverLoader;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartFile;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.server.SimServer;
import org.lrbench.transport.Address;
import org.lrbench.transport.Transports;

/** SCPI over real loopback sockets to the simulated bench served by {@link SimServer}. */
class TcpLinkTests {
    static final Path HOME = TestBench.home();

    static BenchConfig bench() throws Exception {
        return BenchLoader.load(HOME.resolve("simulator/bench.yaml"));
    }

    static Plan plan(BenchConfig b) throws Exception {
        return PlanLoader.load(HOME.resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
    }

    static SimBench simBench(BenchConfig b, Plan p) throws Exception {
        return new SimBench(b.simulation(), p.senseResistanceOhm(),
                PartFile.load(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml")));
    }

    static PartResult measure(BenchConfig b, Plan p, SimBench inProcess) throws Exception {
        PartRun.Request req = new PartRun.Request(p, "0", b, "L", "S", inProcess != null, "test");
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(HOME.resolve("drivers")), inProcess)) {
            return PartRun.measure(req, inst, BenchClock.NONE, SweepListener.NONE);
        }
    }

    static Address tcp(int port) {
        return Address.parse("tcp://127.0.0.1:" + port);
    }

    @Test
    void identityOverTcpHasFourFields() throws Exception {
        BenchConfig b = bench();
        try (SimServer server = new SimServer(simBench(b, plan(b)), 0);
             ScpiSession s = new ScpiSession("generator", new TcpTransport("tcp", "127.0.0.1", server.generatorPort(),
                     Duration.ofSeconds(2)), Duration.ofSeconds(2))) {
            // IEEE Std 488.2-1992, 10.14: four fields
            Identity id = s.identify();
            assertThat(id.model()).isEqualTo("SIM-SOURCE-1");
            s.write(":SOURce1:FREQuency:FIXed 12.5E3");
            assertThat(Double.parseDouble(s.query(":FREQ?"))).isEqualTo(12500);
        }
    }

    @Test
    void aPartMeasuredOverTcpGivesTheSameNumbersAsInProcess() throws Exception {
        BenchConfig b = bench();
        Plan p = plan(b);
        PartResult local = measure(b, p, simBench(b, p));
        try (SimServer server = new SimServer(simBench(b, p), 0)) {
            PartResult remote = measure(b.withAddresses(tcp(server.generatorPort()), tcp(server.digitizerPort())), p, null);
            assertThat(remote.verdict()).isEqualTo(Verdict.PASS);
            assertThat(remote.inductanceH()).isEqualTo(local.inductanceH());
            assertThat(remote.seriesResistanceOhm()).isEqualTo(local.seriesResistanceOhm());
            assertThat(remote.points()).isEqualTo(local.points());
        }
    }

    @Test
    void connectionDroppedMidTraceIsAnInstrumentErrorWithTheOutputOff() throws Exception {
        BenchConfig b = bench();
        Plan p = plan(b);
        SimBench sim = simBench(b, p);
        try (SimServer server = new SimServer(sim, 0);
             DroppingProxy proxy = new DroppingProxy(server.digitizerPort(), "TRACe:DATA?", 700)) {
            PartResult r = measure(b.withAddresses(tcp(server.generatorPort()), tcp(proxy.port())), p, null);
            assertThat(proxy.hasDropped()).isTrue();
            assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
            assertThat(r.error()).contains("digitizer").contains("TRACe:DATA? CH");
            assertThat(sim.generator().isOutputOn()).isFalse();
        }
    }

    @Test
    void generatorLinkDroppedIsReconnectedToSwitchTheOutputOff() throws Exception {
        BenchConfig b = bench();
        Plan p = plan(b);
        SimBench sim = simBench(b, p);
        // drop the generator's connection in the middle of the sweep, on its reply to a frequency change
        try (SimServer server = new SimServer(sim, 0);
             DroppingProxy proxy = new DroppingProxy(server.generatorPort(), "FREQuency:FIXed 9.28", 0)) {
            PartResult r = measure(b.withAddresses(tcp(proxy.port()), tcp(server.digitizerPort())), p, null);
            assertThat(proxy.hasDropped()).isTrue();
            assertThat(r.verdict()).isEqualTo(Verdict.ERROR);
            assertThat(r.error()).contains("generator");
            // the output was on when the link dropped; the guard reconnected and switched it off
            assertThat(sim.generator().isOutputOn()).isFalse();
        }
    }

    @Test
    void theRunCommandExitsThreeWhenTheDigitizerLinkDrops(@TempDir Path dir) throws Exception {
        BenchConfig b = bench();
        Plan p = plan(b);
        SimBench sim = simBench(b, p);
        try (SimServer server = new SimServer(sim, 0);
             DroppingProxy proxy = new DroppingProxy(server.digitizerPort(), "TRACe:DATA?", 100)) {
            int code = Main.execute("run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(),
                    "--lot", "L", "--serial", "S", "--generator", "tcp://127.0.0.1:" + server.generatorPort(),
                    "--digitizer", "tcp://127.0.0.1:" + proxy.port(), "--runs", dir.toString(),
                    "--data", dir.resolve("data").toString(),
                    "--calibration", dir.resolve("none").toString());
            assertThat(code).isEqualTo(3);
            assertThat(sim.generator().isOutputOn()).isFalse();
            assertThat(Files.readString(dir.resolve("L/S.json"))).contains("\"verdict\" : \"error\"");
        }
    }

    @Test
    void aDigitizerThatRefusesTheLinkStillLeavesTheGeneratorOutputOff(@TempDir Path dir)
            throws Exception {
        BenchConfig b = bench();
        SimBench sim = simBench(b, plan(b));
        try (SimServer server = new SimServer(sim, 0);
             ScpiSession s = new ScpiSession("generator", new TcpTransport("tcp", "127.0.0.1", server.generatorPort(),
                     Duration.ofSeconds(2)), Duration.ofSeconds(2))) {
            // an output left on by an earlier crash
            s.write(":OUTPut1:STATe ON");
            assertThat(s.query(":OUTPut1:STATe?")).isEqualTo("1");
            int code = Main.execute("run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(),
                    "--lot", "L", "--serial", "S", "--generator", "tcp://127.0.0.1:" + server.generatorPort(),
                    "--digitizer", "tcp://127.0.0.1:1?connect_timeout_ms=500", "--runs", dir.toString(),
                    "--data", dir.resolve("data").toString(),
                    "--calibration", dir.resolve("none").toString());
            assertThat(code).isEqualTo(3);
            assertThat(sim.generator().isOutputOn()).isFalse();
        }
    }

    @Test
    void aGeneratorThatCannotBeReachedIsReportedWithWhatToDo() throws Exception {
        BenchConfig b = bench().withAddresses(Address.parse("tcp://127.0.0.1:1?connect_timeout_ms=500"),
                Address.parse("tcp://127.0.0.1:2?connect_timeout_ms=500"));
        assertThatThrownBy(() -> BenchInstruments.open(b, new DriverLoader(HOME.resolve("drivers")), null))
                .isInstanceOf(InstrumentException.class)
                .hasMessageContaining("cannot open tcp://127.0.0.1:1")
                .hasMessageContaining("switch it off at the instrument");
    }

    @Test
    void nobodyListeningIsAClearError() {
        assertThatThrownBy(() -> Transports.open(
                Address.parse("tcp://127.0.0.1:1?connect_timeout_ms=500"), java.util.Map.of()))
                .isInstanceOf(InstrumentException.class)
                .hasMessageContaining("cannot open tcp://127.0.0.1:1");
    }
}
