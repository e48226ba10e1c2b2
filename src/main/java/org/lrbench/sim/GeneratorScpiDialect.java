package org.lrbench.sim;

import org.lrbench.instrument.Waveform;
import java.util.Locale;
import org.lrbench.sim.scpi.ScpiFault;

/**
 * The {@code generic} dialect of the simulated generator: the SCPI-1999 SOURce subsystem (FUNCtion,
 * FREQuency, VOLTage and its OFFSet, TRACe for the arbitrary waveform) and OUTPut with its LOAD,
 * levels as peak-to-peak into the declared load.
 */
final class GeneratorScpiDialect {

    private GeneratorScpiDialect() {
    }

    static void install(SimGenerator g) {
        g.on("[SOURce#]:FUNCtion[:SHAPe]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            String w = c.word(0, "SINusoid", "TRIangle", "SQUare", "USER");
            if (w.equals("USER") && g.arbitraryPoints == 0) {
                throw ScpiFault.settingsConflict("no arbitrary g.waveform loaded");
            }
            g.waveform = switch (w) {
                case "SIN" -> Waveform.SINE;
                case "TRI" -> Waveform.TRIANGLE;
                case "USER" -> Waveform.ARBITRARY;
                default -> Waveform.SQUARE;
            };
            return null;
        });
        g.on("[SOURce#]:FUNCtion[:SHAPe]", true, c -> switch (g.waveform) {
            case SINE -> "SIN";
            case TRIANGLE -> "TRI";
            case SQUARE -> "SQU";
            case ARBITRARY -> "USER";
        });
        // one period of points: an ASCII list from -1 to 1, or one definite block of 16-bit words,
        // most significant byte first, full scale +/-32767
        g.on("[SOURce#]:TRACe[:DATA]", false, c -> {
            c.expect(1, SimGenerator.MAX_ARBITRARY_POINTS).suffixUpTo(1);
            double[] points;
            if (c.count() == 1 && c.isBlock(0)) {
                byte[] data = c.block(0);
                if (data.length % 2 != 0 || data.length / 2 < 16 || data.length / 2 > SimGenerator.MAX_ARBITRARY_POINTS) {
                    throw ScpiFault.invalidBlock(data.length + " bytes: 16 to " + SimGenerator.MAX_ARBITRARY_POINTS + " 16-bit words");
                }
                points = new double[data.length / 2];
                for (int i = 0; i < points.length; i++) {
                    int word = (short) ((data[2 * i] & 0xff) << 8 | data[2 * i + 1] & 0xff);
                    if (word == Short.MIN_VALUE) {
                        throw ScpiFault.outOfRange("word " + i + " is -32768; full scale is +/-32767");
                    }
                    points[i] = word / 32767.0;
                }
            } else {
                c.expect(16, SimGenerator.MAX_ARBITRARY_POINTS);
                points = new double[c.count()];
                for (int i = 0; i < points.length; i++) {
                    points[i] = c.number(i, -1, 1, 0);
                }
            }
            g.loadArbitrary(points);
            return null;
        });
        g.on("[SOURce#]:TRACe:POINts", true, c -> Integer.toString(g.arbitraryPoints));
        g.on("[SOURce#]:TRACe:RATE", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            double rate = c.number(0, 1, SimGenerator.MAX_ARBITRARY_RATE, 1e6);
            if (g.arbitraryPoints > 0 && rate / g.arbitraryPoints > SimGenerator.MAX_FREQUENCY) {
                throw ScpiFault.outOfRange("the waveform would repeat above " + SimGenerator.MAX_FREQUENCY + " Hz");
            }
            g.arbitraryRate = rate;
            return null;
        });
        g.on("[SOURce#]:TRACe:RATE", true, c -> SimGenerator.nr3(g.arbitraryRate));
        org.lrbench.sim.scpi.ScpiDevice.Handler setFrequency = c -> {
            c.expect(1, 1).suffixUpTo(1);
            g.changeFrequency(c.number(0, 1e-3, SimGenerator.MAX_FREQUENCY, 1e3));
            return null;
        };
        g.on("[SOURce#]:FREQuency[:CW]", false, setFrequency);
        g.on("[SOURce#]:FREQuency:FIXed", false, setFrequency);
        g.on("[SOURce#]:FREQuency[:CW]", true, c -> SimGenerator.nr3(g.frequency));
        g.on("[SOURce#]:FREQuency:FIXed", true, c -> SimGenerator.nr3(g.frequency));
        g.on("[SOURce#]:VOLTage[:LEVel][:IMMediate][:AMPLitude]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            double maxVpp = 2 * (SimGenerator.MAX_EMF_PEAK - Math.abs(g.offset) * g.emfFactor()) / g.emfFactor();
            g.amplitudeVpp = c.number(0, 1e-3, maxVpp, 0.1);
            return null;
        });
        g.on("[SOURce#]:VOLTage[:LEVel][:IMMediate][:AMPLitude]", true, c -> SimGenerator.nr3(g.amplitudeVpp));
        g.on("[SOURce#]:VOLTage[:LEVel][:IMMediate]:OFFSet", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            double max = (SimGenerator.MAX_EMF_PEAK - g.amplitudeVpp / 2 * g.emfFactor()) / g.emfFactor();
            g.offset = c.number(0, -max, max, 0);
            return null;
        });
        g.on("[SOURce#]:VOLTage[:LEVel][:IMMediate]:OFFSet", true, c -> SimGenerator.nr3(g.offset));
        g.on("OUTPut#[:STATe]", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            g.outputOn = c.bool(0);
            return null;
        });
        g.on("OUTPut#[:STATe]", true, c -> g.outputOn ? "1" : "0");
        g.on("OUTPut#:LOAD", false, c -> {
            c.expect(1, 1).suffixUpTo(1);
            String p = c.text(0).toUpperCase(Locale.ROOT);
            g.loadOhm = p.equals("INF") || p.equals("INFINITY") ? Double.POSITIVE_INFINITY : c.number(0, 1, 10e3, 50);
            return null;
        });
        g.on("OUTPut#:LOAD", true, c -> Double.isInfinite(g.loadOhm) ? "9.9E+37" : SimGenerator.nr3(g.loadOhm));
    }
}
