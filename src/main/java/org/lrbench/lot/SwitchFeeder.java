package org.lrbench.lot;

import java.util.List;
import org.lrbench.instrument.Switch;

/**
 * A multi-position fixture behind a switch unit: position i of the tray (serials in tray order)
 * is connected by closing channel 101 + i, so a whole tray is measured unattended. Serials already
 * measured in the inspection are passed over.
 */
public final class SwitchFeeder implements PartFeeder {
    public static final int FIRST_CHANNEL = 101;
    private final Switch unit;
    private final List<String> serials;
    private int next;

    public SwitchFeeder(Switch unit, List<String> serials) {
        this.unit = unit;
        this.serials = serials;
    }

    @Override
    public Next next(Prompt prompt) {
        while (next < serials.size() && prompt.measured().contains(serials.get(next))) {
            next++;
        }
        if (next >= serials.size()) {
            unit.disconnectAll();
            return Next.stop();
        }
        int position = next++;
        unit.connect(FIRST_CHANNEL + position);
        return Next.measure(serials.get(position), null);
    }
}
