package org.lrbench.bench;

import org.lrbench.transport.Address;

/** One instrument of a bench: the driver file that speaks to it and the address it is reached at. */
public record InstrumentLink(String driver, Address address) {
}
