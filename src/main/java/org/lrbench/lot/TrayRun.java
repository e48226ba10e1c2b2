package org.lrbench.lot;

import java.util.List;
import java.util.function.Consumer;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimLot;

/** A loaded tray measured unattended: simulated parts, or a real tray behind the bench's switch unit. */
public final class TrayRun {

    private TrayRun() {
    }

    /**
     * A simulated tray: on a bench with a switch unit, one simulated bench holds the whole tray and
     * the switch changes parts; without one, each part is its own simulated bench.
     */
    public static LotRunner.Outcome simulated(LotRunner.Setup setup, SimLot tray, Consumer<PartResult> onPart)
            throws Exception {
        BenchConfig b = setup.template().bench();
        if (b.switchUnit() == null) {
            return LotRunner.run(setup, new TrayFeeder(SimulatedPart.tray(tray.parts())), onPart);
        }
        SimBench bench = new SimBench(b.simulation(), setup.template().plan().wiring(),
                tray.parts().stream().map(SimLot.Part::model).toList());
        try (BenchInstruments inst = BenchInstruments.open(b, setup.drivers(), bench, true)) {
            inst.switchUnit().prepare();
            return LotRunner.run(setup.withShared(inst), new SwitchFeeder(inst.switchUnit(),
                    b.switchUnit().firstChannel(), tray.parts().stream().map(SimLot.Part::serial).toList()), onPart);
        }
    }

    /** A real tray in the switch unit's positions, serials in position order. */
    public static LotRunner.Outcome switched(LotRunner.Setup setup, List<String> serials, Consumer<PartResult> onPart)
            throws Exception {
        BenchConfig b = setup.template().bench();
        try (BenchInstruments inst = BenchInstruments.open(b, setup.drivers(), null, true)) {
            inst.switchUnit().prepare();
            return LotRunner.run(setup.withShared(inst), new SwitchFeeder(inst.switchUnit(),
                    b.switchUnit().firstChannel(), serials), onPart);
        }
    }
}
