package org.lrbench.transport;

import java.io.IOException;
import java.util.Map;

/**
 * One kind of link, found by {@link java.util.ServiceLoader} (listed in
 * {@code META-INF/services/org.lrbench.transport.TransportProvider}), so this package knows no
 * implementation: a new link is a provider in its own package and a line in that file.
 */
public interface TransportProvider {

    /** The address scheme this link answers to ({@code tcp}, {@code serial}, ...). */
    String scheme();

    /** An example address, for messages. */
    String example();

    /**
     * Checks an address of this scheme without opening anything: its target and every option.
     *
     * @throws AddressException naming the bad part and what is allowed
     */
    void check(Address address);

    /**
     * Opens the link; the address has passed {@link #check}.
     *
     * @param simulated the in-process instruments by name, or an empty map
     */
    Transport open(Address address, Map<String, ?> simulated) throws IOException;
}
