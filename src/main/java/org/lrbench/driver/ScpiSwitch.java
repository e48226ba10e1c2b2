package org.lrbench.driver;

import java.util.Map;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.Switch;
import org.lrbench.scpi.ScpiSession;

/** A switch unit that speaks SCPI ROUTe commands through a switch driver file. */
public final class ScpiSwitch extends DrivenInstrument implements Switch {

    public ScpiSwitch(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public void connect(int channel) {
        if (channel < 1 || channel > 999_999) {
            throw new IllegalArgumentException("switch channel " + channel + " is not 1 to 999999");
        }
        Map<String, String> list = Map.of("channels", "(@" + channel + ")");
        configure("open_all", Map.of());
        configure("close", list);
        double closed = queryNumber("closed_query", list);
        if (closed != 1) {
            throw new InstrumentException(session.instrument() + ": channel " + channel + " did not close (reply "
                    + closed + ")");
        }
    }

    @Override
    public void disconnectAll() {
        configure("open_all", Map.of());
    }
}
