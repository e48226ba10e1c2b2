package org.lrbench.transport;

/** Thrown when an instrument address is malformed; the message names the part that is wrong. */
public class AddressException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public AddressException(String message) {
        super(message);
    }
}
