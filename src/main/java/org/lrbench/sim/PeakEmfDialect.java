package org.lrbench.sim;

import org.lrbench.instrument.Waveform;

/**
 * The {@code peak-emf} dialect of the simulated generator, a command tree of our own: the waveform,
 * frequency, peak and DC level under {@code WAVe}, levels being the open-circuit EMF whatever the
 * load, and the output switched by {@code OUTPut ON|OFF}.
 */
final class PeakEmfDialect {

    private PeakEmfDialect() {
    }

    static void install(SimGenerator g) {
        g.on("WAVe:TYPE", false, c -> {
            c.expect(1, 1);
            String w = c.word(0, "SINE", "TRIangle", "SQUare");
            g.waveform = switch (w) {
                case "SINE" -> Waveform.SINE;
                case "TRI" -> Waveform.TRIANGLE;
                default -> Waveform.SQUARE;
            };
            return null;
        });
        g.on("WAVe:FREQuency", false, c -> {
            c.expect(1, 1);
            g.changeFrequency(c.number(0, 1e-3, SimGenerator.MAX_FREQUENCY, 1e3));
            return null;
        });
        g.on("WAVe:PEAK", false, c -> {
            c.expect(1, 1);
            g.amplitudeVpp = 2 * c.number(0, 1e-3, SimGenerator.MAX_EMF_PEAK - Math.abs(g.offset), 0.05);
            return null;
        });
        g.on("WAVe:DC", false, c -> {
            c.expect(1, 1);
            double max = SimGenerator.MAX_EMF_PEAK - g.amplitudeVpp / 2;
            g.offset = c.number(0, -max, max, 0);
            return null;
        });
        g.on("OUTPut", false, c -> {
            c.expect(1, 1);
            g.outputOn = c.word(0, "ON", "OFF").equals("ON");
            return null;
        });
        g.on("OUTPut", true, c -> g.outputOn ? "ON" : "OFF");
    }
}
