package org.lrbench.driver;

import java.util.ArrayList;
import java.util.List;
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
    /** Settings held back to go as one message; null when each goes at once. */
    private List<String> held;

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
        String command = driver.command(operation).render(values);
        if (held != null) {
            held.add(command);
            return;
        }
        session.configure(command, driver.errorQuery());
    }

    /**
     * Makes the settings {@code settings} sends go as one message, joined with ';' (every template
     * starts with an absolute header, so joining keeps each command's meaning), with one error query
     * after them: one round trip instead of one per setting. Only settings that read nothing back
     * may be made inside.
     */
    public void batch(Runnable settings) {
        if (held != null) {
            settings.run();
            return;
        }
        held = new ArrayList<>();
        List<String> commands;
        try {
            settings.run();
        } finally {
            commands = held;
            held = null;
        }
        if (!commands.isEmpty()) {
            session.configure(String.join(";", commands), driver.errorQuery());
        }
    }

    /** Whether settings are being held back for one message ({@link #batch}). */
    protected boolean batching() {
        return held != null;
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
