package org.lrbench.driver;

import java.util.Map;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.scpi.ScpiNumbers;
import org.lrbench.scpi.ScpiSession;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/** What every driver-file instrument shares: its session, its driver, and a checked send. */
abstract class DrivenInstrument {
    private static final Logger LOG = LoggerFactory.getLogger(DrivenInstrument.class);
    protected final ScpiSession session;
    protected final DriverFile driver;
    private Identity identity;

    DrivenInstrument(ScpiSession session, DriverFile driver) {
        this.session = session;
        this.driver = driver;
    }

    /** Asks {@code *IDN?} once and checks it against the driver's identity patterns. */
    public synchronized Identity identity() {
        if (identity == null) {
            Identity id = session.identify();
            if (!driver.matches(id)) {
                throw new InstrumentException(session.instrument() + ": '" + id + "' is not an instrument driver "
                        + driver.name() + " is written for (" + driver.source() + ", identity)");
            }
            identity = id;
            LOG.info("{}: {} (driver {})", session.instrument(), id, driver.name());
        }
        return identity;
    }

    /** Checks the identity, then sends the driver's {@code prepare} commands. */
    public void prepare() {
        identity();
        configure("prepare", Map.of());
    }

    /**
     * Sends a configuration command with the error query in the same message (one round trip) and
     * fails, naming the command, on any error it caused.
     */
    protected void configure(String operation, Map<String, String> values) {
        session.configure(driver.command(operation).render(values), driver.errorQuery());
    }

    /** Parses one reply unit of a combined message as a number. */
    protected double number(String command, String reply) {
        try {
            return ScpiNumbers.parse(reply);
        } catch (NumberFormatException e) {
            throw new InstrumentException(session.instrument() + ": reply to '" + command + "' is '" + reply
                    + "', expected a number");
        }
    }

    /** Sends a numeric query and parses its reply. */
    protected double queryNumber(String operation, Map<String, String> values) {
        String command = driver.command(operation).render(values);
        return number(command, session.query(command));
    }
}
