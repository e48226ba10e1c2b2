package org.lrbench.transport;

import java.io.IOException;
import java.time.Duration;

/**
 * A byte link to one instrument. It knows nothing of SCPI: messages, terminators and blocks are
 * the {@link org.lrbench.scpi.ScpiSession}'s business. Implementations: in-process (simulator);
 * TCP, serial and USBTMC arrive behind this same interface.
 */
public interface Transport extends AutoCloseable {

    /** The address this link was opened from, for messages. */
    String address();

    /** Sends all bytes. */
    void write(byte[] bytes) throws IOException;

    /**
     * Reads at least one byte into {@code dst}, waiting at most {@code timeout}.
     *
     * @return the number of bytes read, at least 1
     * @throws TransportTimeoutException when nothing arrived in time
     */
    int read(byte[] dst, int offset, int length, Duration timeout) throws IOException;

    /** Discards anything received and not yet read. */
    void discardInput() throws IOException;

    @Override
    void close() throws IOException;
}
