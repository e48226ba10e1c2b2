package org.lrbench.instrument;

/** A digital multimeter measuring DC resistance, 2-wire or 4-wire (Kelvin). */
public interface Multimeter {

    Identity identity();

    void prepare();

    /** The resistance in ohm; 4-wire leaves the test leads out of the reading. */
    double resistance(boolean fourWire);

    /**
     * The driver's preparation and one resistance reading in one message (one round trip where
     * {@link #prepare()} and {@link #resistance(boolean)} take two), any error they caused named.
     */
    double preparedResistance(boolean fourWire);
}
