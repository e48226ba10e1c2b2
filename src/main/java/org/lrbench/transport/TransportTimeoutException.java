package org.lrbench.transport;

import java.io.IOException;

/** Thrown when an instrument sent nothing within the read timeout. */
public class TransportTimeoutException extends IOException {
    private static final long serialVersionUID = 1L;

    public TransportTimeoutException(String message) {
        super(message);
    }
}
