package org.lrbench.run;

import java.util.List;
import java.util.Set;
import org.lrbench.sim.SimLot;

/** A tray of simulated parts measured in order, unattended, skipping serials the store already has. */
public final class TrayFeeder implements PartFeeder {
    private final List<SimLot.Part> tray;
    private final Set<String> done;
    private int next;

    public TrayFeeder(List<SimLot.Part> tray, Set<String> done) {
        this.tray = tray;
        this.done = done;
    }

    @Override
    public Next next(int index, int of) {
        while (next < tray.size() && done.contains(tray.get(next).serial())) {
            next++;
        }
        if (next >= tray.size()) {
            return Next.stop();
        }
        SimLot.Part p = tray.get(next++);
        return new Next(Action.MEASURE, p.serial(), p.model());
    }
}
