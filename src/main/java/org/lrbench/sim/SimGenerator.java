package org.lrbench.sim;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.scpi.ScpiDevice;

/**
 * A simulated one-channel function generator behind SCPI. Like most real ones, its amplitude
 * (peak-to-peak) and offset settings are referred to the load it is told it drives,
 * {@code OUTPut:LOAD}, 50 ohm after *RST: the open-circuit EMF is the setting times
 * (Rload + Rout) / Rload, twice the setting into a 50 ohm load, equal to it for INFinity.
 */
public final class SimGenerator extends ScpiDevice {

    /**
     * Which generator the simulation plays. {@code generic}: SCPI-1999 SOURce/OUTPut subsystems,
     * peak-to-peak amplitude and offset referred to the load set by {@code OUTPut:LOAD} (50 ohm
     * after *RST). {@code peak-emf}: a WAVe subsystem whose amplitude is the peak open-circuit EMF
     * and whose offset is the open-circuit DC level, with one output command taking ON or OFF.
     */
    public enum Personality {
        GENERIC("generic"), PEAK_EMF("peak-emf");

        private final String key;

        Personality(String key) {
            this.key = key;
        }

        public static Map<String, Personality> byKey() {
            Map<String, Personality> m = new LinkedHashMap<>();
            for (Personality p : values()) {
                m.put(p.key, p);
            }
            return m;
        }
    }
    public static final double MAX_FREQUENCY = 20e6;
    public static final double MAX_EMF_PEAK = 10.0;

    private final double outputOhm;
    private final Personality personality;
    private Waveform waveform;
    private double frequency;
    private double amplitudeVpp;
    private double offset;
    private double loadOhm;
    private boolean outputOn;

    private double frequencyChangeSecond;

    /** How long the output takes to settle after a frequency change (0: at once). */
    public void setFrequencyChangeSecond(double seconds) {
        this.frequencyChangeSecond = seconds;
    }

    /** A new frequency; the command completes once the output has settled there. */
    private void changeFrequency(double f) {
        if (f != frequency) {
            SimTiming.pass(frequencyChangeSecond);
        }
        frequency = f;
    }

    public SimGenerator(double outputOhm) {
        this(outputOhm, Personality.GENERIC);
    }

    public SimGenerator(double outputOhm, Personality personality) {
        super(personality == Personality.PEAK_EMF ? "LRBENCH,SIM-SOURCE-PK,SIM0021,0.1" : "LRBENCH,SIM-SOURCE-1,SIM0001,0.1");
        this.outputOhm = outputOhm;
        this.personality = personality;
        reset();
        if (personality == Personality.PEAK_EMF) {
            registerPeakEmf();
        } else {
            registerGeneric();
        }
    }

    /** The {@code peak-emf} dialect: levels are the open-circuit EMF whatever the load. */
    private void registerPeakEmf() {
        register("WAVe:TYPE", false, c -> {
            c.expect(1, 1);
            String w = c.word(0, "SINE", "TRIangle", "SQUare");
            waveform = switch (w) {
                case "SINE" -> Waveform.SINE;
                case "TRI" -> Waveform.TRIANGLE;
                default -> Waveform.SQUARE;
            };
            return null;
        });
        register("WAVe:FREQuency", false, c -> {
            c.expect(1, 1);
            changeFrequency(c.number(0, 1e-3, MAX_FREQUENCY, 1e3));
            return null;
        });
        register("WAVe:PEAK", false, c -> {
            c.expect(1, 1);
            amplitudeVpp = 2 * c.number(0, 1e-3, MAX_EMF_PEAK - Math.abs(offset), 0.05);
            return null;
        });
        register("WAVe:DC", false, c -> {
            c.expect(1, 1);
            double max = MAX_EMF_PEAK - amplitudeVpp / 2;
            offset = c.number(0, -max, max, 0);
            return null;
        });
        register("OUTPut", false, c -> {
            c.expect(1, 1);
            outputOn = c.word(0, "ON", "OFF").equals("ON");
            return null;
        });
        register("OUTPut", true, c -> outputOn ? "ON" : "OFF");
    }

    /** The generic SCPI-1999 dialect. */
    private void registerGeneric() {
        register("[SOURce#]:FUNCtion[:SHAPe]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            String w = c.word(0, "SINusoid", "TRIangle", "SQUare");
            waveform = switch (w) {
                case "SIN" -> Waveform.SINE;
                case "TRI" -> Waveform.TRIANGLE;
                default -> Waveform.SQUARE;
            };
            return null;
        });
        register("[SOURce#]:FUNCtion[:SHAPe]", true, c -> switch (waveform) {
            case SINE -> "SIN";
            case TRIANGLE -> "TRI";
            case SQUARE -> "SQU";
        });
        Handler setFrequency = c -> {
            c.expect(1, 1).suffixUpTo(1);
            changeFrequency(c.number(0, 1e-3, MAX_FREQUENCY, 1e3));
            return null;
        };
        register("[SOURce#]:FREQuency[:CW]", false, setFrequency);
        register("[SOURce#]:FREQuency:FIXed", false, setFrequency);
        register("[SOURce#]:FREQuency[:CW]", true, c -> nr3(frequency));
        register("[SOURce#]:FREQuency:FIXed", true, c -> nr3(frequency));
        register("[SOURce#]:VOLTage[:LEVel][:IMMediate][:AMPLitude]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            double maxVpp = 2 * (MAX_EMF_PEAK - Math.abs(offset) * emfFactor()) / emfFactor();
            amplitudeVpp = c.number(0, 1e-3, maxVpp, 0.1);
            return null;
        });
        register("[SOURce#]:VOLTage[:LEVel][:IMMediate][:AMPLitude]", true, c -> nr3(amplitudeVpp));
        register("[SOURce#]:VOLTage[:LEVel][:IMMediate]:OFFSet", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            double max = (MAX_EMF_PEAK - amplitudeVpp / 2 * emfFactor()) / emfFactor();
            offset = c.number(0, -max, max, 0);
            return null;
        });
        register("[SOURce#]:VOLTage[:LEVel][:IMMediate]:OFFSet", true, c -> nr3(offset));
        register("OUTPut#[:STATe]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            outputOn = c.bool(0);
            return null;
        });
        register("OUTPut#[:STATe]", true, c -> outputOn ? "1" : "0");
        register("OUTPut#:LOAD", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            String p = c.text(0).toUpperCase(Locale.ROOT);
            loadOhm = p.equals("INF") || p.equals("INFINITY") ? Double.POSITIVE_INFINITY : c.number(0, 1, 10e3, 50);
            return null;
        });
        register("OUTPut#:LOAD", true, c -> Double.isInfinite(loadOhm) ? "9.9E+37" : nr3(loadOhm));
    }

    @Override
    protected void reset() {
        waveform = Waveform.SINE;
        frequency = 1e3;
        amplitudeVpp = 0.1;
        offset = 0;
        loadOhm = 50;
        outputOn = false;
    }

    private double emfFactor() {
        if (personality == Personality.PEAK_EMF) {
            return 1.0; // its levels are the open-circuit EMF
        }
        return Double.isInfinite(loadOhm) ? 1.0 : (loadOhm + outputOhm) / loadOhm;
    }

    public synchronized boolean isOutputOn() {
        return outputOn;
    }

    public synchronized Waveform waveform() {
        return waveform;
    }

    public synchronized double frequency() {
        return frequency;
    }

    /** Open-circuit peak EMF; zero while the output is off. */
    public synchronized double emfPeak() {
        return outputOn ? amplitudeVpp / 2 * emfFactor() : 0.0;
    }

    /** Open-circuit DC EMF; zero while the output is off. */
    public synchronized double emfOffset() {
        return outputOn ? offset * emfFactor() : 0.0;
    }

    public double outputOhm() {
        return outputOhm;
    }

    static String nr3(double v) {
        return String.format(Locale.ROOT, "%.9E", v);
    }
}
