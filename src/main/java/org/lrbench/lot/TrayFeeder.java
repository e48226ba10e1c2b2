package org.lrbench.lot;

import java.util.List;
import org.lrbench.bench.SimulatedPart;

/** A tray of simulated parts measured in order, unattended, passing over serials already measured. */
public final class TrayFeeder implements PartFeeder {
    private final List<SimulatedPart.Slot> tray;
    private int next;

    public TrayFeeder(List<SimulatedPart.Slot> tray) {
        this.tray = tray;
    }

    @Override
    public Next next(Prompt prompt) {
        while (next < tray.size() && prompt.measured().contains(tray.get(next).serial())) {
            next++;
        }
        if (next >= tray.size()) {
            return Next.stop();
        }
        SimulatedPart.Slot p = tray.get(next++);
        return Next.measure(p.serial(), p.part());
    }
}
