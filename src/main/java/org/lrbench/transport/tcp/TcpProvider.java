package org.lrbench.transport.tcp;

import java.io.IOException;
import java.time.Duration;
import java.util.Map;
import java.util.Set;
import org.lrbench.transport.Address;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportProvider;

/** {@code tcp://HOST[:PORT][?connect_timeout_ms=N&term=...]}: a raw SCPI socket, port 5025 by default. */
public final class TcpProvider implements TransportProvider {
    static final int DEFAULT_CONNECT_MS = 3000;

    @Override
    public String scheme() {
        return "tcp";
    }

    @Override
    public String example() {
        return "tcp://192.0.2.10:5025";
    }

    @Override
    public void check(Address address) {
        address.requireOptions(Set.of("term", "connect_timeout_ms"));
        address.intOption("connect_timeout_ms", DEFAULT_CONNECT_MS, 1, 600_000);
        address.host();
        address.port();
    }

    @Override
    public Transport open(Address address, Map<String, ?> simulated) throws IOException {
        int connectMillis = address.intOption("connect_timeout_ms", DEFAULT_CONNECT_MS, 1, 600_000);
        return new TcpTransport(address.text(), address.host(), address.port(), Duration.ofMillis(connectMillis));
    }
}
