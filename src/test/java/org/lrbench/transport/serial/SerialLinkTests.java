package org.lrbench.transport.serial;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.lrbench.instrument.Identity;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.SimGenerator;
import org.lrbench.sim.server.PtyServer;
import org.lrbench.transport.Address;

/**
 * The serial transport for real, over a pseudo-terminal pair made by socat (Debian package
 * {@code socat}; .ci/run installs it). One end serves the simulated generator, the other is
 * opened with jSerialComm. A fresh socat per test class: a closed jSerialComm port leaves its pty
 * non-blocking.
 */
class SerialLinkTests {
    static Process socat;
    static Path dir;
    static Path instrumentEnd;
    static Path controllerEnd;

    @BeforeAll
    static void startSocat() throws Exception {
        boolean present = new ProcessBuilder("sh", "-c", "command -v socat").start().waitFor() == 0;
        assumeTrue(present, "socat is not installed (apt-get install socat): serial link tests skipped");
        dir = Files.createTempDirectory("lrbench-pty");
        instrumentEnd = dir.resolve("instrument");
        controllerEnd = dir.resolve("controller");
        socat = new ProcessBuilder("socat", "pty,raw,echo=0,link=" + instrumentEnd, "pty,raw,echo=0,link=" + controllerEnd)
                .redirectErrorStream(true).redirectOutput(dir.resolve("socat.log").toFile()).start();
        long deadline = System.currentTimeMillis() + 5000;
        while (!(Files.exists(instrumentEnd) && Files.exists(controllerEnd)) && System.currentTimeMillis() < deadline) {
            Thread.sleep(20);
        }
        assumeTrue(Files.exists(controllerEnd), "socat did not create its pty pair: serial link tests skipped");
    }

    @AfterAll
    static void stopSocat() throws IOException {
        if (socat != null) {
            socat.destroy();
        }
    }

    @SuppressWarnings("try") // a resource held only for its close(): installed handlers, a running server
    @Test
    void scpiOverASerialLineReachesTheSimulatedGenerator() throws Exception {
        SimGenerator generator = new SimGenerator(50);
        Path real = controllerEnd.toRealPath();
        try (PtyServer server = new PtyServer(generator, instrumentEnd.toRealPath());
             ScpiSession s = new ScpiSession("generator",
                     new SerialTransport("serial://" + real, SerialSettings.of(
                             Address.parse("serial://" + real + "?baud=115200&parity=none"))), Duration.ofSeconds(2))) {
            Identity id = s.identify();
            assertThat(id.manufacturer()).isEqualTo("LRBENCH");
            s.configure(":SOURce1:FREQuency:FIXed 4.7E3;:OUTPut1:STATe ON", ":SYSTem:ERRor?");
            assertThat(generator.frequency()).isEqualTo(4700);
            assertThat(generator.isOutputOn()).isTrue();
            assertThat(s.query(":OUTP?")).isEqualTo("1");
            s.configure(":OUTPut1:STATe OFF", ":SYSTem:ERRor?");
            assertThat(generator.isOutputOn()).isFalse();
        }
    }
}
