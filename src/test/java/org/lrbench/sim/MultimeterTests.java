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
}
