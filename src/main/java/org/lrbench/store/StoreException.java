package org.lrbench.store;

/** Thrown when the results store cannot be read or written, or a write would break a lot's consistency. */
public class StoreException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public StoreException(String message, Throwable cause) {
        super(message, cause);
    }
}
