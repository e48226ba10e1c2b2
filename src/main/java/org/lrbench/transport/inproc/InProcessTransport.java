package org.lrbench.transport.inproc;

import java.io.IOException;
import java.time.Duration;
import java.util.Objects;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/**
 * Connects a driver straight to a simulated instrument in the same JVM. The controller still sends
 * SCPI text and reads replies as bytes, exactly as over a socket. The peer executes each message
 * as it arrives, so a read that finds nothing would wait forever on a real link: it times out at once.
 */
public final class InProcessTransport implements Transport {
    private final String address;
    private final InProcessPeer peer;
    private boolean closed;

    public InProcessTransport(String address, InProcessPeer peer) {
        this.address = Objects.requireNonNull(address, "address");
        this.peer = Objects.requireNonNull(peer, "peer");
    }

    @Override
    public String address() {
        return address;
    }

    @Override
    public synchronized void write(byte[] bytes) throws IOException {
        ensureOpen();
        peer.receive(bytes);
    }

    @Override
    public synchronized int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
        ensureOpen();
        int n = peer.transmit(dst, offset, length);
        if (n == 0) {
            throw new TransportTimeoutException("no reply from " + address + " within " + timeout.toMillis() + " ms");
        }
        return n;
    }

    @Override
    public synchronized void discardInput() {
        peer.discardOutput();
    }

    @Override
    public synchronized void close() {
        closed = true;
    }

    private void ensureOpen() throws IOException {
        if (closed) {
            throw new IOException("link to " + address + " is closed");
        }
    }
}
