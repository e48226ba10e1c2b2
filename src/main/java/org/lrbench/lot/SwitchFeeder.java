package org.lrbench.lot;

import java.util.List;
import org.lrbench.instrument.Switch;

/**
 * A multi-position fixture behind a switch unit: the tray's positions (serials in tray order) are
 * on consecutive channels from the bench's first channel (bench file key {@code switch.first_channel}),
 * each connected in turn, so a whole tray is measured unattended. Serials already measured in the
 * inspection are passed over.
 */
public final class SwitchFeeder implements PartFeeder {
    private final Switch unit;
    private final int firstChannel;
    private final List<String> serials;
    private int next;

    public SwitchFeeder(Switch unit, int firstChannel, List<String> serials) {
        this.unit = unit;
        this.firstChannel = firstChannel;
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
        unit.connect(firstChannel + position);
        return Next.measure(serials.get(position), null);
    }
}
