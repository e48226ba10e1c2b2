package org.lrbench.transport;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.Set;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.transport.inproc.InProcessPeer;
import org.lrbench.transport.inproc.InProcessTransport;
import org.lrbench.transport.serial.SerialSettings;
import org.lrbench.transport.serial.SerialTransport;
import org.lrbench.transport.tcp.TcpTransport;
import org.lrbench.transport.usbtmc.UsbtmcTransport;

/** Opens the transport an address names. */
public final class Transports {
    static final Duration DEFAULT_CONNECT_TIMEOUT = Duration.ofSeconds(3);

    private Transports() {
    }

    /**
     * @param simulated the in-process instruments by name ("generator", "digitizer"), or an empty
     *                  map when no simulated bench runs in this process
     * @throws AddressException for a malformed address or option
     * @throws InstrumentException when the link cannot be opened
     */
    public static Transport open(Address address, Map<String, InProcessPeer> simulated) {
        try {
            return switch (address.scheme()) {
                case "sim" -> openSimulated(address, simulated);
                case "tcp" -> {
                    address.requireOptions(Set.of("term", "connect_timeout_ms"));
                    int connectMillis = address.intOption("connect_timeout_ms",
                            (int) DEFAULT_CONNECT_TIMEOUT.toMillis(), 1, 600_000);
                    address.terminator();
                    yield new TcpTransport(address.text(), address.host(), address.port(), Duration.ofMillis(connectMillis));
                }
                case "serial" -> {
                    SerialSettings settings = SerialSettings.of(address);
                    address.terminator();
                    yield new SerialTransport(address.text(), settings);
                }
                case "usbtmc" -> {
                    address.requireOptions(Set.of("term"));
                    address.terminator();
                    yield new UsbtmcTransport(address.text(), Path.of(address.target()));
                }
                default -> throw new AddressException("no transport for scheme " + address.scheme());
            };
        } catch (IOException e) {
            throw new InstrumentException("cannot open " + address + ": " + e.getMessage(), e);
        }
    }

    private static Transport openSimulated(Address address, Map<String, InProcessPeer> simulated) {
        address.requireOptions(Set.of("term"));
        InProcessPeer peer = simulated.get(address.target());
        if (peer == null) {
            if (simulated.isEmpty()) {
                throw new InstrumentException("address " + address + " is an instrument of the simulated bench;"
                        + " give the part to simulate with --sim PART.yaml, or real addresses"
                        + " (--generator/--digitizer or a bench file)");
            }
            throw new AddressException("address " + address + ": the simulated bench has no instrument '"
                    + address.target() + "'; it has " + String.join(", ", simulated.keySet()));
        }
        return new InProcessTransport(address.text(), peer);
    }
}
