package org.lrbench.bench;

import org.lrbench.transport.Address;

/**
 * One instrument of a bench: the driver file that speaks to it and the address it is reached at;
 * for a switch unit, the channel number of the fixture's first position (the next positions on the
 * channels after it), as the unit numbers its channels; for a generator, its output impedance as
 * declared in the bench file (null: not declared).
 */
public record InstrumentLink(String driver, Address address, int firstChannel, Double outputOhm,
                             org.lrbench.yaml.Problem driverAt) {
    /** Where the bench file names the driver (its position; the message unused), or null. */
    public InstrumentLink(String driver, Address address, int firstChannel, Double outputOhm) {
        this(driver, address, firstChannel, outputOhm, null);
    }

    /** The same link, with where its driver is named. */
    public InstrumentLink at(org.lrbench.yaml.Problem where) {
        return new InstrumentLink(driver, address, firstChannel, outputOhm, where);
    }

    /** The channel of a switch's first position when the bench file names none. */
    public static final int DEFAULT_FIRST_CHANNEL = 1;

    public InstrumentLink(String driver, Address address) {
        this(driver, address, DEFAULT_FIRST_CHANNEL, null);
    }

    public InstrumentLink(String driver, Address address, int firstChannel) {
        this(driver, address, firstChannel, null);
    }
}
