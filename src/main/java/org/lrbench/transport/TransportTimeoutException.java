package org.lrbench.transport;

import java.io.IOException;

/** Thrown when an instrument sent nothing within the read timeout. */
public class TransportTimeoutException extends IOException {
    public TransportTimeoutException(String message) {
        super(message);
    }
}
