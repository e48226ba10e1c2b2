package org.lrbench.sim;

import java.util.ArrayList;
import java.util.List;
import org.lrbench.instrument.Waveform;

/**
 * The simulated bench: a generator with its output impedance, the fixture's sense resistor, the
 * part under test and a two-channel digitizer, channel 1 across the sense resistor and channel 2
 * across the part (differential inputs). The instruments are reached over SCPI like real ones.
 */
public final class SimBench implements AnalogInputs {
    private final SimGenerator generator;
    private final SimDigitizer digitizer;
    private final Circuit circuit;

    public SimBench(SimSettings settings, double senseOhm, PartModel part) {
        this.circuit = new Circuit(settings.sourceImpedanceOhm(), senseOhm, part);
        this.generator = new SimGenerator(settings.sourceImpedanceOhm());
        this.digitizer = new SimDigitizer(this, settings);
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
        return generator.frequency();
    }

    @Override
    public List<Harmonic> channel(int channel, double bandLimit) {
        List<Harmonic> out = new ArrayList<>();
        if (!generator.isOutputOn()) {
            return out;
        }
        double f = generator.frequency();
        Waveform w = generator.waveform();
        for (Harmonic h : WaveformSpectrum.of(w, generator.emfPeak(), generator.emfOffset(), f, bandLimit)) {
            double omega = 2 * Math.PI * h.k() * f;
            out.add(new Harmonic(h.k(), channel == 1 ? circuit.senseVoltage(h.amplitude(), omega)
                    : circuit.partVoltage(h.amplitude(), omega)));
        }
        return out;
    }
}
