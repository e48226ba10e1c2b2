package org.lrbench.bench;

import org.lrbench.transport.Address;

/**
 * One instrument of a bench: the driver file that speaks to it and the address it is reached at;
 * for a switch unit, the channel number of the fixture's first position (the next positions on the
 * channels after it), as the unit numbers its channels; for a generator, its output impedance as
 * declared in the bench file (null: not declared).
 */
public record InstrumentLink(String driver, Address address, int firstChannel, Double outputOhm) {
    /** The channel of a switch's first position when the bench file names none. */
    public static final int DEFAULT_FIRST_CHANNEL = 1;

    public InstrumentLink(String driver, Address address) {
        this(driver, address, DEFAULT_FIRST_CHANNEL, null);
    }

    public InstrumentLink(String driver, Address address, int firstChannel) {
        this(driver, address, firstChannel, null);
    }
}
