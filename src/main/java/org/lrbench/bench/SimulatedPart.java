package org.lrbench.bench;

import java.util.List;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimLot;
import org.lrbench.transport.inproc.PeerSet;

/**
 * A part on the simulated bench: given the bench (its simulation settings and seed) and the
 * fixture's wiring, the in-process instruments with that part in the fixture. The runner measures
 * through this, so it never builds simulator objects itself.
 */
@FunctionalInterface
public interface SimulatedPart {

    PeerSet open(BenchConfig bench, FixtureWiring wiring);

    static SimulatedPart of(PartModel model) {
        return (bench, wiring) -> new SimBench(bench.simulation(), wiring, model);
    }

    /** The simulated part of a part file (problems at their positions). */
    static SimulatedPart load(java.nio.file.Path partFile) throws org.lrbench.yaml.ProblemsException {
        return of(org.lrbench.sim.PartFile.load(partFile));
    }

    /** A serial and the simulated part in that tray position. */
    record Slot(String serial, SimulatedPart part) {
    }

    /** The parts of a simulated lot file as tray slots, in order. */
    static List<Slot> tray(List<SimLot.Part> parts) {
        return parts.stream().map(p -> new Slot(p.serial(), of(p.model()))).toList();
    }
}
