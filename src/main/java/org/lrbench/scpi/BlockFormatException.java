package org.lrbench.scpi;

/** Thrown when an IEEE 488.2 arbitrary block is malformed: bad header, wrong length, no terminator. */
public class BlockFormatException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public BlockFormatException(String message) {
        super(message);
    }
}
