package org.lrbench.instrument;

/**
 * A switch unit (relay multiplexer) that connects one position of a multi-position fixture to the
 * bench at a time, by SCPI channel number.
 */
public interface Switch {

    Identity identity();

    /** Known state: every channel open. */
    void prepare();

    /** Opens every channel, then closes this one, and checks that it reports closed. */
    void connect(int channel);

    void disconnectAll();
}
