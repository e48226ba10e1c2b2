package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.ScpiMultimeter;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.transport.inproc.InProcessTransport;
import org.lrbench.yaml.Problems;

class MultimeterTests {

    @Test
    void twoWireReadsTheLeadsThatFourWireLeavesOut() throws Exception {
        // common practice, no source: a 2-wire reading includes both test leads, a 4-wire (Kelvin)
        // reading does not; the simulated meter's leads are 50 mohm each
        SimSettings s = new SimSettings(50, 0.5e-3, 8, 1, 0, 0, 0, 0, 0, 0.05);
        SimBench bench = new SimBench(s, 100, new PartModel(1e-3, 2.3, 0));
        var driver = DriverLoader.read(TestBench.home().resolve("drivers/generic-dmm.yaml"), "generic-dmm",
                DriverKind.METER, new Problems("generic-dmm.yaml"));
        ScpiMultimeter m = new ScpiMultimeter(new ScpiSession("meter", new InProcessTransport("sim://meter", bench.meter()),
                Duration.ofSeconds(1)), driver);
        m.prepare();
        double four = m.resistance(true);
        double two = m.resistance(false);
        assertThat(four).isCloseTo(2.3, within(1e-9));
        assertThat(two - four).isCloseTo(2 * 0.05, within(1e-9));
    }

    /**
     * The driver's preparation and the reading in one message: one round trip, the same reading as
     * prepare-then-measure, and an error the preparation causes named (SCPI-1999 -113, undefined
     * header, for a command the meter does not know).
     */
    @Test
    void thePreparationAndTheReadingGoInOneMessage() throws Exception {
        SimBench bench = new SimBench(SimSettings.defaults(), 100, new PartModel(1e-3, 2.3, 0));
        var driver = DriverLoader.read(TestBench.home().resolve("drivers/generic-dmm.yaml"), "generic-dmm",
                DriverKind.METER, new Problems("generic-dmm.yaml"));
        ScpiSession session = new ScpiSession("meter", new InProcessTransport("sim://meter", bench.meter()),
                Duration.ofSeconds(1));
        ScpiMultimeter m = new ScpiMultimeter(session, driver);
        m.identity();
        long before = session.queries();
        double together = m.preparedResistance(true);
        assertThat(session.queries() - before).isEqualTo(1);
        m.prepare();
        assertThat(together).isEqualTo(m.resistance(true));

        String yaml = java.nio.file.Files.readString(TestBench.home().resolve("drivers/generic-dmm.yaml"))
                .replace("prepare: \"*RST;*CLS\"", "prepare: \"*RST;*CLS;:SENSe:NOTHing 1\"");
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("dmm");
        java.nio.file.Path file = dir.resolve("broken-dmm.yaml");
        java.nio.file.Files.writeString(file, yaml);
        var broken = DriverLoader.read(file, "broken-dmm", DriverKind.METER, new Problems("broken-dmm.yaml"));
        ScpiMultimeter b = new ScpiMultimeter(new ScpiSession("meter", new InProcessTransport("sim://meter",
                bench.meter()), Duration.ofSeconds(1)), broken);
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> b.preparedResistance(true))
                .isInstanceOf(org.lrbench.instrument.InstrumentException.class)
                .hasMessageContaining("NOTHing").hasMessageContaining("-113");
    }
}
