package org.lrbench.run;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.InstrumentLink;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.ScpiDigitizer;
import org.lrbench.driver.ScpiGenerator;
import org.lrbench.driver.ScpiMultimeter;
import org.lrbench.driver.ScpiSwitch;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.Multimeter;
import org.lrbench.instrument.Switch;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.LevelCheck;
import org.lrbench.measure.LevelRefused;
import org.lrbench.measure.RangeMemory;
import org.lrbench.plan.Plan;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.transport.Address;
import org.lrbench.transport.Transport;
import org.lrbench.transport.Transports;
import org.lrbench.transport.inproc.InProcessPeer;
import org.lrbench.transport.inproc.PeerSet;
import org.lrbench.yaml.ProblemsException;

/** A bench's generator and digitizer, opened through their drivers and links; closes both links. */
public final class BenchInstruments implements AutoCloseable {
    private final RangeMemory rangeMemory = new RangeMemory();
    /** Set once these instruments proved their level ({@code LevelCheck}); reopened instruments prove it again. */
    private boolean levelProven;
    private final Generator generator;
    private final Digitizer digitizer;
    private final List<ScpiSession> sessions;
    private final Switch switchUnit;
    private Multimeter meter;

    BenchInstruments(Generator generator, Digitizer digitizer, List<ScpiSession> sessions) {
        this(generator, digitizer, null, sessions);
    }

    BenchInstruments(Generator generator, Digitizer digitizer, Switch switchUnit,
                     List<ScpiSession> sessions) {
        this.generator = generator;
        this.digitizer = digitizer;
        this.switchUnit = switchUnit;
        this.sessions = sessions;
    }

    /** The bench's multimeter, or null when it has none (or it was not opened). */
    /**
     * Proves the generator's level on these instruments before anything is driven at a plan's level
     * ({@link LevelCheck}, with the fixture as it stands), once for as long as they stay open; throws
     * {@link LevelRefused} (the output off) when it is not what was asked for.
     */
    public void proveLevel(Plan plan, BenchConfig bench, BenchClock clock) {
        if (levelProven) {
            return;
        }
        LevelCheck.Result level = LevelCheck.probe(plan, generator, digitizer, clock, bench.generatorOutputOhm(),
                bench.accuracy());
        if (!level.proven()) {
            throw new LevelRefused(level);
        }
        levelProven = true;
    }

    public Multimeter multimeter() {
        return meter;
    }

    /** The bench's switch unit, or null when it has none. */
    public Switch switchUnit() {
        return switchUnit;
    }

    /**
     * Opens the bench's instruments. With a simulated bench, both links go to its in-process
     * instruments whatever the bench file's addresses say.
     */
    public static BenchInstruments open(BenchConfig bench, DriverLoader drivers, PeerSet simulated)
            throws ProblemsException {
        return open(bench, drivers, simulated, false);
    }

    /**
     * Opens the generator, the digitizer and, when {@code withSwitch} and the bench has one, the
     * switch unit of a multi-position fixture (a one-part measurement leaves the switch alone).
     */
    public static BenchInstruments open(BenchConfig bench, DriverLoader drivers, PeerSet simulated, boolean withSwitch)
            throws ProblemsException {
        DriverFile sourceDriver = drivers.load(bench.generator().driver(), DriverKind.SOURCE, bench.generator().driverAt());
        DriverFile digitizerDriver = drivers.load(bench.digitizer().driver(), DriverKind.DIGITIZER, bench.digitizer().driverAt());
        Map<String, InProcessPeer> peers = simulated == null ? Map.of() : simulated.peers();
        // safety first: the generator is reached and its output switched off before anything else,
        // so an output left on by an earlier crash does not stay on when another instrument fails
        ScpiSession g;
        ScpiGenerator generator;
        try {
            g = session("generator", bench.generator(), sourceDriver, peers, simulated != null);
        } catch (InstrumentException e) {
            throw new InstrumentException(e.getMessage() + ". The generator could not be"
                    + " reached, so lrbench cannot switch its output off: if it may be on, switch it off at the"
                    + " instrument", e);
        }
        try {
            generator = new ScpiGenerator(g, sourceDriver);
            generator.outputOff();
        } catch (RuntimeException e) {
            closeQuietly(g);
            throw new InstrumentException(e.getMessage() + ". The generator's output could not"
                    + " be switched off: if it may be on, switch it off at the instrument", e);
        }
        ScpiSession d;
        try {
            d = session("digitizer", bench.digitizer(), digitizerDriver, peers, simulated != null);
        } catch (RuntimeException e) {
            closeQuietly(g);
            throw e;
        }
        if (bench.switchUnit() == null || !withSwitch) {
            BenchInstruments bi = new BenchInstruments(generator, new ScpiDigitizer(d, digitizerDriver),
                    new ArrayList<>(List.of(g, d)));
            bi.openMeter(bench, drivers, peers, simulated != null);
            return bi;
        }
        DriverFile switchDriver = drivers.load(bench.switchUnit().driver(), DriverKind.SWITCH, bench.switchUnit().driverAt());
        ScpiSession w;
        try {
            w = session("switch", bench.switchUnit(), switchDriver, peers, simulated != null);
        } catch (RuntimeException e) {
            closeQuietly(g);
            closeQuietly(d);
            throw e;
        }
        BenchInstruments bi = new BenchInstruments(generator, new ScpiDigitizer(d, digitizerDriver),
                new ScpiSwitch(w, switchDriver), new ArrayList<>(List.of(g, d, w)));
        bi.openMeter(bench, drivers, peers, simulated != null);
        return bi;
    }

    private static ScpiSession session(String role, InstrumentLink link, DriverFile driver,
                                       Map<String, InProcessPeer> peers, boolean simulated) {
        Address address = simulated ? Address.parse("sim://" + role) : link.address();
        Transport t = Transports.open(address, peers);
        ScpiSession session = new ScpiSession(role + " (" + driver.name() + " at " + address + ")", t, driver.timeout(),
                address.terminator());
        session.setMinimumTransferRate(driver.minimumTransferRate());
        return session;
    }

    /** The SCPI sessions of the links (for counting round trips), generator first. */
    public List<ScpiSession> sessions() {
        return sessions;
    }

    /**
     * Opens the bench's multimeter when it has one that can be reached: on the simulated bench
     * always, on real links when its address is not a simulated one.
     */
    private void openMeter(BenchConfig bench, DriverLoader drivers, Map<String, InProcessPeer> peers, boolean simulated)
            throws ProblemsException {
        if (bench.meter() == null || (!simulated && bench.meter().address().scheme().equals("sim"))) {
            return;
        }
        DriverFile meterDriver = drivers.load(bench.meter().driver(), DriverKind.METER, bench.meter().driverAt());
        ScpiSession m = session("meter", bench.meter(), meterDriver, peers, simulated);
        sessions.add(m);
        meter = new ScpiMultimeter(m, meterDriver);
    }

    /** What the last part measured on these instruments showed, for ranging the next part of a lot at once. */
    public RangeMemory rangeMemory() {
        return rangeMemory;
    }

    public Generator generator() {
        return generator;
    }

    public Digitizer digitizer() {
        return digitizer;
    }

    @Override
    public void close() {
        sessions.forEach(BenchInstruments::closeQuietly);
    }

    private static void closeQuietly(ScpiSession s) {
        try {
            s.close();
        } catch (IOException ignored) {
            // closing a link that already failed; its fault was reported where it happened
        }
    }
}
