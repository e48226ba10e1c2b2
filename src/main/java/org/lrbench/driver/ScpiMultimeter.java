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

    @Override
    public double preparedResistance(boolean fourWire) {
        identity();
        String query = driver.command(fourWire ? "resistance_4w_query" : "resistance_2w_query").render(Map.of());
        var replies = session.configure(driver.command("prepare").render(Map.of()) + ";" + query, driver.errorQuery());
        if (replies.size() != 1) {
            throw new org.lrbench.instrument.InstrumentException(session.instrument() + ": '" + query + "' after the"
                    + " driver's prepare commands gave " + replies.size() + " replies before the error query's, expected 1"
                    + " (" + driver.source() + ", commands)");
        }
        return number(query, replies.get(0));
    }
}
