package org.lrbench.run;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintStream;
import org.lrbench.fixture.FixturePosition;

/**
 * Gets the fixture into a position before a calibration sweep: on the simulated bench directly, on
 * a real bench by asking the operator (with the generator output off) and waiting for Enter.
 */
@FunctionalInterface
public interface FixtureChange {

    void moveTo(FixturePosition position);

    /** No answer from the operator (end of input): a clean stop, not a fault of lrbench. */
    final class OperatorGone extends RuntimeException {
        private static final long serialVersionUID = 1L;

        public OperatorGone(String message) {
            super(message);
        }
    }

    /** Console prompts for a real bench; returns after the operator presses Enter. */
    static FixtureChange console(BufferedReader in, PrintStream out) {
        return position -> {
            out.println(switch (position) {
                case CHANNEL_MATCH -> "Connect BOTH digitizer inputs across the sense resistor (same node, same"
                        + " polarity), then press Enter.";
                case SHORT -> "Put the shorting bar in the part's place in the fixture, then press Enter.";
                case OPEN -> "Leave the part's place in the fixture empty (open), then press Enter.";
                case SENSE_RESISTOR -> "Connect the multimeter's four leads across the sense resistor (force and sense"
                        + " at its own terminals, the part's place empty), then press Enter.";
                case PART -> "Restore the normal wiring: channel 1 across the sense resistor, channel 2 across the"
                        + " part, then press Enter.";
            });
            out.println("(The generator output is off while you change the wiring.)");
            try {
                if (in.readLine() == null) {
                    throw new OperatorGone("the console ended before the fixture was in place ("
                            + position.name().toLowerCase(java.util.Locale.ROOT).replace('_', ' ')
                            + "): calibration stopped, nothing stored, the generator output is off");
                }
            } catch (IOException e) {
                throw new OperatorGone("reading the operator's answer failed (" + e.getMessage() + "): calibration"
                        + " stopped, nothing stored, the generator output is off");
            }
        };
    }
}
