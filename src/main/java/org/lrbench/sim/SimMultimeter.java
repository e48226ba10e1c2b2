package org.lrbench.sim;

import java.util.Locale;
import java.util.function.Supplier;
import org.lrbench.sim.scpi.ScpiDevice;

/**
 * A simulated DMM across the part: {@code MEASure:FRESistance?} (4-wire) reads the winding's DC
 * resistance (the part file's value, as the part has it on the bench); {@code MEASure:RESistance?}
 * (2-wire) adds both test leads.
 */
public final class SimMultimeter extends ScpiDevice {

    public SimMultimeter(Supplier<PartModel> part, double leadOhm) {
        super("LRBENCH,SIM-DMM-1,SIM0004,0.1");
        register("MEASure:FRESistance", true, c -> nr3(winding(part)));
        register("MEASure:RESistance", true, c -> nr3(winding(part) + 2 * leadOhm));
    }

    private static double winding(Supplier<PartModel> part) {
        PartModel p = part.get();
        return p == null ? 9.9e37 : p.seriesResistanceOhm();
    }

    @Override
    protected void reset() {
    }

    private static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
