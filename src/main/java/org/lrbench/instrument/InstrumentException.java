package org.lrbench.instrument;

/**
 * Thrown when an instrument cannot do what was asked: no reply, a malformed reply, an error in its
 * queue, a lost link. The message names the instrument, the command, what came back and how long
 * the controller waited, so a person can act on it. A part measured through such a fault is an
 * error, never a pass.
 */
public class InstrumentException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public InstrumentException(String message) {
        super(message);
    }

    public InstrumentException(String message, Throwable cause) {
        super(message, cause);
    }
}
