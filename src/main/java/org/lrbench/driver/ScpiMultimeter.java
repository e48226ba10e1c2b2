package org.lrbench.driver;

import java.util.Map;
import org.lrbench.instrument.Multimeter;
import org.lrbench.scpi.ScpiSession;

/** A multimeter speaking SCPI-1999 MEASure queries through a meter driver file. */
public final class ScpiMultimeter extends DrivenInstrument implements Multimeter {

    public ScpiMultimeter(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public double resistance(boolean fourWire) {
        return queryNumber(fourWire ? "resistance_4w_query" : "resistance_2w_query", Map.of());
    }
}
