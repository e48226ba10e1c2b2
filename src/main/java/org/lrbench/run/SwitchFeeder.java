package org.lrbench.run;

import java.util.List;
import java.util.Set;
import org.lrbench.instrument.Switch;

/**
 * A multi-position fixture behind a switch unit: position i of the tray (serials in tray order)
 * is connected by closing channel 101 + i, so a whole tray is measured unattended. Serials the
 * store already has are passed over.
 */
public final class SwitchFeeder implements PartFeeder {
    public static final int FIRST_CHANNEL = 101;
    private final Switch unit;
    private final List<String> serials;
    private final Set<String> done;
    private int next;

    public SwitchFeeder(Switch unit, List<String> serials, Set<String> done) {
        this.unit = unit;
        this.serials = serials;
        this.done = done;
    }

    @Override
    public Next next(int index, int of) {
        while (next < serials.size() && done.contains(serials.get(next))) {
            next++;
        }
        if (next >= serials.size()) {
            unit.disconnectAll();
            return Next.stop();
        }
        int position = next++;
        unit.connect(FIRST_CHANNEL + position);
        return new Next(Action.MEASURE, serials.get(position), null);
    }
}
