package org.lrbench.sim;

import java.util.Locale;
import java.util.function.DoubleSupplier;
import org.lrbench.sim.scpi.ScpiDevice;

/**
 * A simulated DMM across what its leads are on (the part, or the sense resistor when the fixture is
 * set so): {@code MEASure:FRESistance?} (4-wire) reads its DC resistance (the part file's value, or
 * the sense resistor's actual value, as the bench has them); {@code MEASure:RESistance?} (2-wire)
 * adds both test leads.
 */
public final class SimMultimeter extends ScpiDevice {

    /** @param measured the DC resistance between the meter's leads (9.9E37, overload, when open) */
    public SimMultimeter(DoubleSupplier measured, double leadOhm) {
        this(measured, leadOhm, 0);
    }

    /** A meter whose readings are off by {@code error} (relative): its own calibration error. */
    public SimMultimeter(DoubleSupplier measured, double leadOhm, double error) {
        super("LRBENCH,SIM-DMM-1,SIM0004,0.1");
        register("MEASure:FRESistance", true, c -> nr3(measured.getAsDouble() * (1 + error)));
        register("MEASure:RESistance", true, c -> nr3((measured.getAsDouble() + 2 * leadOhm) * (1 + error)));
    }

    @Override
    protected void reset() {
    }

    private static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
