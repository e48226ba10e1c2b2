package org.lrbench.service;

/** A request the service refuses, with the HTTP status that says why and a message naming the field. */
public final class ServiceException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    private final int status;

    public ServiceException(int status, String message) {
        super(message);
        this.status = status;
    }

    public int status() {
        return status;
    }
}
