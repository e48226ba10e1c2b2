package org.lrbench.transport;

/** Thrown when an instrument address is malformed; the message names the part that is wrong. */
public class AddressException extends IllegalArgumentException {
    public AddressException(String message) {
        super(message);
    }
}
