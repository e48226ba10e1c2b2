package org.lrbench.cli;

/** Thrown for bad options or files that are not YAML problems; exits with code 2. */
final class BadInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    BadInputException(String message) {
        super(message);
    }
}
