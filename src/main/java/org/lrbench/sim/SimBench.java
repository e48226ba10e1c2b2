package org.lrbench.sim;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.fixture.FixturePosition;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.transport.inproc.InProcessPeer;
import org.lrbench.transport.inproc.PeerSet;

/**
 * The simulated bench: a generator with its output impedance, the fixture's sense resistor, the
 * fixture's leads and stray capacitance, the part under test and a two-channel digitizer, channel 1
 * across the sense resistor and channel 2 across the fixture's part terminals (differential inputs),
 * channel 2 with its own gain error and delay. The instruments are reached over SCPI like real ones.
 */
public final class SimBench implements AnalogInputs, PeerSet {
    private final SimGenerator generator;
    private final SimDigitizer digitizer;
    private final Circuit circuit;
    private final SimSettings settings;
    private volatile FixturePosition position = FixturePosition.PART;

    private final List<PartModel> tray;
    private final SimSwitch switchUnit;
    private final FixtureWiring wiring;

    /** One part in the fixture, always connected. */
    public SimBench(SimSettings settings, double senseOhm, PartModel part) {
        this(settings, FixtureWiring.differential(senseOhm), part, List.of());
    }

    /** One part in a fixture wired and probed as given. */
    public SimBench(SimSettings settings, FixtureWiring wiring, PartModel part) {
        this(settings, wiring, part, List.of());
    }

    /** A tray behind the switch, in a fixture wired and probed as given. */
    public SimBench(SimSettings settings, FixtureWiring wiring, List<PartModel> tray) {
        this(settings, wiring, tray.get(0), tray);
    }

    /**
     * A tray of parts in a multi-position fixture behind a switch unit: the part at the one closed
     * channel (1 for the first position) is connected; with none closed the fixture is open.
     */
    public SimBench(SimSettings settings, double senseOhm, List<PartModel> tray) {
        this(settings, FixtureWiring.differential(senseOhm), tray.get(0), tray);
    }

    private SimBench(SimSettings settings, FixtureWiring wiring, PartModel first, List<PartModel> tray) {
        this.wiring = wiring;
        // the sense resistor as it is, off its nominal by the bench's declared error
        this.circuit = new Circuit(settings.sourceImpedanceOhm(), wiring.senseOhm() * (1 + settings.senseError()), first);
        this.settings = settings;
        this.tray = List.copyOf(tray);
        this.generator = new SimGenerator(settings.sourceImpedanceOhm(), settings.generator());
        this.digitizer = new SimDigitizer(this, settings);
        SimTiming t = settings.timing();
        generator.setTiming(t.messageSecond(), t.bytesPerSecond());
        generator.setFrequencyChangeSecond(t.frequencyChangeSecond());
        digitizer.setTiming(t.messageSecond(), t.bytesPerSecond());
        this.switchUnit = new SimSwitch(Math.max(1, tray.size()));
        this.meter = new SimMultimeter(this::meterReads, settings.meterLeadOhm(), settings.meterError());
    }

    private final SimMultimeter meter;

    public SimMultimeter meter() {
        return meter;
    }

    public SimSwitch switchUnit() {
        return switchUnit;
    }

    /** What the meter's leads are across: the sense resistor when set so, else the part connected (open: overload). */
    private double meterReads() {
        if (position == FixturePosition.SENSE_RESISTOR) {
            return circuit.senseOhm();
        }
        PartModel p = connectedPart();
        return p == null ? 9.9e37 : p.seriesResistanceOhm();
    }

    /** The part the fixture connects now, or null when the switch connects none. */
    PartModel connectedPart() {
        if (tray.isEmpty()) {
            return circuit.part();
        }
        int p = switchUnit.connectedPosition();
        return p >= 0 && p < tray.size() ? tray.get(p) : null;
    }

    /** Puts the part, the channel-match link, nothing, or a short in the fixture. */
    public void setPosition(FixturePosition p) {
        this.position = p;
    }

    public FixturePosition position() {
        return position;
    }

    /**
     * What the sense resistor's far side sees at the fixture terminals: the leads in series with
     * the part (or the open, or the short) shunted by the stray capacitance.
     */
    Complex fixtureImpedance(double omega) {
        Complex leads = new Complex(settings.leadResistanceOhm(), omega * settings.leadInductanceHenry());
        Complex stray = new Complex(0, omega * settings.strayCapacitanceFarad());
        PartModel connected = connectedPart();
        FixturePosition where = connected == null && position == FixturePosition.PART ? FixturePosition.OPEN : position;
        return switch (where) {
            case SHORT -> leads;
            case OPEN -> stray.abs() == 0 ? new Complex(1e15, 0) : leads.add(stray.reciprocal());
            default -> {
                Complex part = connected.impedance(omega);
                yield leads.add(stray.abs() == 0 ? part : part.reciprocal().add(stray).reciprocal());
            }
        };
    }

    @Override
    public Map<String, InProcessPeer> peers() {
        return Map.of("generator", generator, "digitizer", digitizer, "switch", switchUnit(), "meter", meter());
    }

    public SimGenerator generator() {
        return generator;
    }

    public SimDigitizer digitizer() {
        return digitizer;
    }

    public Circuit circuit() {
        return circuit;
    }

    @Override
    public double fundamentalHz() {
        return generator.outputFrequency();
    }

    @Override
    public List<Harmonic> channel(int channel, double bandLimit) {
        List<Harmonic> out = new ArrayList<>();
        if (!generator.isOutputOn()) {
            return out;
        }
        double f = generator.outputFrequency();
        for (Harmonic h : generator.emfLines(bandLimit)) {
            double omega = 2 * Math.PI * h.k() * f;
            PartModel connected = connectedPart();
            boolean open = position == FixturePosition.OPEN || position == FixturePosition.PART && connected == null;
            Complex load = omega == 0 && !open
                    ? new Complex(settings.leadResistanceOhm() + (position == FixturePosition.SHORT ? 0
                            : connected.seriesResistanceOhm()), 0)
                    : omega == 0 ? new Complex(1e15, 0) : fixtureImpedance(omega);
            Complex current = h.amplitude().divide(load.add(circuit.sourceOhm() + circuit.senseOhm()));
            Complex sense = current.multiply(circuit.senseOhm());
            boolean lowSide = FixtureWiring.lowSide(wiring);
            double att = wiring.attenuation(channel);
            if (channel == 1) {
                out.add(new Harmonic(h.k(), sense.divide(att)));
            } else {
                // low side: channel 2 sees the top of the part to ground, the part plus the sense resistor
                Complex v = position == FixturePosition.CHANNEL_MATCH ? sense
                        : lowSide ? current.multiply(load).add(sense) : current.multiply(load);
                v = v.divide(att);
                // channel 2's front end: its gain error and its delay against channel 1
                double phase = -omega * settings.channel2SkewSecond();
                out.add(new Harmonic(h.k(), v.multiply(1 + settings.channel2GainError())
                        .multiply(new Complex(Math.cos(phase), Math.sin(phase)))));
            }
        }
        return out;
    }
}
