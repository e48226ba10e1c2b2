package org.lrbench.transport.inproc;

import java.util.Map;
import java.util.Set;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportProvider;

/** {@code sim://generator}: an instrument of the simulated bench running in this process. */
public final class InProcessProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "sim";
    }

    @Override
    public String example() {
        return "sim://digitizer";
    }

    @Override
    public void check(Address address) {
        address.requireOptions(Set.of("term"));
        if (!NAMES.contains(address.target())) {
            throw new org.lrbench.transport.AddressException("instrument address '" + address.text() + "': the simulated"
                    + " bench has no instrument '" + address.target() + "'; it has " + String.join(", ", NAMES.stream()
                    .map(n -> "sim://" + n).toList()));
        }
    }

    /** The instruments of the simulated bench, by their address names. */
    public static final java.util.List<String> NAMES = java.util.List.of("generator", "digitizer", "switch", "meter");

    @Override
    public Transport open(Address address, Map<String, ?> simulated) {
        Object peer = simulated.get(address.target());
        if (!(peer instanceof InProcessPeer p)) {
            if (simulated.isEmpty()) {
                throw new InstrumentException("address " + address + " is an instrument of the simulated bench;"
                        + " give the part to simulate with --sim PART.yaml, or real addresses"
                        + " (--generator/--digitizer or a bench file)");
            }
            throw new AddressException("address " + address + ": the simulated bench has no instrument '"
                    + address.target() + "'; it has " + String.join(", ", simulated.keySet()));
        }
        return new InProcessTransport(address.text(), p);
    }
}
