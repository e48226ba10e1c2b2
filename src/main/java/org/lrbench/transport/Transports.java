package org.lrbench.transport;

import java.util.Map;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.transport.inproc.InProcessPeer;
import org.lrbench.transport.inproc.InProcessTransport;

/** Opens the transport an address names. */
public final class Transports {

    private Transports() {
    }

    /**
     * @param simulated the in-process instruments by name ("generator", "digitizer"), or an empty
     *                  map when no simulated bench is running
     */
    public static Transport open(Address address, Map<String, InProcessPeer> simulated) {
        switch (address.scheme()) {
            case "sim" -> {
                InProcessPeer peer = simulated.get(address.target());
                if (peer == null) {
                    if (simulated.isEmpty()) {
                        throw new InstrumentException("address " + address + " is an instrument of the simulated bench;"
                                + " give the part to simulate with --sim PART.yaml, or a bench file with real addresses");
                    }
                    throw new AddressException("address " + address + ": the simulated bench has no instrument '"
                            + address.target() + "'; it has " + String.join(", ", simulated.keySet()));
                }
                return new InProcessTransport(address.text(), peer);
            }
            default -> throw new InstrumentException("address " + address + ": the " + address.scheme()
                    + " transport is not available in this version of lrbench; only the simulated bench (sim://) is");
        }
    }
}
