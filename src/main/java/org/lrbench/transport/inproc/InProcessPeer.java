package org.lrbench.transport.inproc;

/** The far end of an in-process link: a simulated instrument that takes bytes and produces replies. */
public interface InProcessPeer {

    /** Delivers bytes sent by the controller; complete messages are executed at once. */
    void receive(byte[] bytes);

    /** Moves up to {@code length} reply bytes into {@code dst}; returns how many (0 when none). */
    int transmit(byte[] dst, int offset, int length);

    /** Throws away reply bytes not yet transmitted. */
    void discardOutput();
}
