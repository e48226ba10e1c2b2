package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.Test;

class SwitchTests {

    static String ask(SimSwitch s, String message) {
        s.receive((message + "\n").getBytes(StandardCharsets.US_ASCII));
        byte[] buf = new byte[256];
        int n = s.transmit(buf, 0, buf.length);
        return new String(buf, 0, n, StandardCharsets.US_ASCII).strip();
    }

    @Test
    void channelListsOpenAndCloseRelays() {
        // SCPI-1999 Vol. 2, ROUTe subsystem: channel lists are written (@1,2) (from memory); the
        // simulated unit numbers its channels 1 to N
        SimSwitch s = new SimSwitch(4);
        ask(s, ":ROUTe:CLOSe (@2)");
        assertThat(ask(s, ":ROUT:CLOS? (@1,2)")).isEqualTo("0,1");
        assertThat(s.connectedPosition()).isEqualTo(1);
        ask(s, ":ROUTe:CLOSe (@3)");
        assertThat(s.connectedPosition()).isEqualTo(-1); // two closed: no single part connected
        ask(s, ":ROUTe:OPEN:ALL");
        ask(s, ":ROUTe:CLOSe (@5)");
        assertThat(ask(s, ":SYSTem:ERRor?")).startsWith("-222");
    }

    @Test
    void theSwitchDecidesWhichTrayPartTheFixtureHolds() {
        SimBench b = new SimBench(SimSettings.defaults(), 100,
                List.of(new PartModel(1e-3, 2.3, 0), new PartModel(2e-3, 4.0, 0)));
        assertThat(b.connectedPart()).isNull();
        ask(b.switchUnit(), ":ROUTe:CLOSe (@2)");
        assertThat(b.connectedPart().inductanceHenry()).isEqualTo(2e-3);
    }
}
