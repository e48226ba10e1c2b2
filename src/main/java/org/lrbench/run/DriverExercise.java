package org.lrbench.run;

import java.util.Locale;
import org.lrbench.bench.BenchConfig;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.LevelCheck;
import org.lrbench.plan.Plan;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.instrument.Waveform;

/**
 * A driver self-test for whoever writes a driver file: every logical operation of the bench's
 * instruments is exercised once through the driver, with the generator's output off throughout,
 * and each gives ok with what the instrument answered, or failed with the exchange that failed.
 * A step that depends on one that failed is not tried.
 */
public final class DriverExercise {

    /** One operation's outcome. */
    public record Step(String instrument, String operation, boolean ok, String detail) {
    }

    @FunctionalInterface
    private interface Operation {
        String run();
    }

    private final List<Step> steps = new ArrayList<>();

    private DriverExercise() {
    }

    /**
     * Plays a known low-level sine into the fixture as it stands ({@link LevelCheck}: a tenth of the
     * plan's level at its first frequency) and judges the traces: the level proven, or each thing
     * seen wrong with the driver key most likely behind it. The output is off again afterwards.
     */
    public static List<Step> signal(BenchInstruments bench, Plan plan, BenchConfig config, BenchClock clock) {
        List<Step> out = new ArrayList<>();
        OutputGuard guard = new OutputGuard(bench.generator());
        try {
            LevelCheck.Result r = LevelCheck.probe(plan, bench.generator(), bench.digitizer(), clock,
                    config.generatorOutputOhm(), config.accuracy());
            String what = String.format(Locale.ROOT, "sine %s at %s peak EMF", Units.format(r.frequencyHz(),
                    Dimension.FREQUENCY), Units.format(r.askedVolt(), Dimension.VOLTAGE));
            if (r.proven()) {
                out.add(new Step("signal", what, true, String.format(Locale.ROOT, "measured %s (within +/- %.1f %%)",
                        Units.format(r.measuredVolt(), Dimension.VOLTAGE), 100 * r.allowedRelative())));
            }
            for (LevelCheck.Finding f : r.findings()) {
                out.add(new Step("signal", what, false, f.toString()));
            }
        } catch (RuntimeException e) {
            out.add(new Step("signal", "low-level sine into the fixture", false, e.getMessage()));
        } finally {
            guard.close();
        }
        if (guard.failure() != null) {
            out.add(new Step("generator", "output off after the signal", false, guard.failure()));
        }
        return out;
    }

    /** Exercises the opened instruments; the generator output is switched off before and after. */
    public static List<Step> run(BenchInstruments bench, double amplitudeVolt) {
        DriverExercise x = new DriverExercise();
        Generator g = bench.generator();
        OutputGuard guard = new OutputGuard(g);
        try {
            if (x.step("generator", "identity and prepare (known state, output off)", () -> {
                g.prepare();
                return g.identity().toString();
            })) {
                x.step("generator", "output off", () -> {
                    g.outputOff();
                    return "off";
                });
                x.step("generator", "waveform sine", () -> {
                    g.setWaveform(Waveform.SINE);
                    return "set";
                });
                x.step("generator", "frequency 1 kHz", () -> {
                    g.setFrequency(1000);
                    return "set";
                });
                x.step("generator", "amplitude " + amplitudeVolt + " V peak (output off)", () -> {
                    g.setAmplitude(amplitudeVolt);
                    return "set";
                });
                x.step("generator", "offset 0 V", () -> {
                    g.setOffset(0);
                    return "set";
                });
            }
            x.digitizer(bench.digitizer());
            if (bench.switchUnit() != null) {
                x.step("switch", "identity, prepare and open every channel", () -> {
                    bench.switchUnit().prepare();
                    bench.switchUnit().disconnectAll();
                    return bench.switchUnit().identity().toString();
                });
            }
            if (bench.multimeter() != null) {
                x.step("meter", "identity, prepare and a 2-wire reading", () -> {
                    bench.multimeter().prepare();
                    double ohm = bench.multimeter().resistance(false);
                    return bench.multimeter().identity() + "; " + String.format(Locale.ROOT, "%.6g ohm", ohm);
                });
            }
        } finally {
            guard.close();
        }
        if (guard.failure() != null) {
            x.steps.add(new Step("generator", "output off at the end", false, guard.failure()));
        }
        return List.copyOf(x.steps);
    }

    private void digitizer(Digitizer d) {
        if (!step("digitizer", "identity and prepare (trace format)", () -> {
            d.prepare();
            return d.identity().toString();
        })) {
            return;
        }
        RangeLimits[] limits = new RangeLimits[3];
        for (int ch = 1; ch <= 2; ch++) {
            int c = ch;
            step("digitizer", "range limits, channel " + ch, () -> {
                limits[c] = d.rangeLimits(c);
                return limits[c].minVolt() + " V to " + limits[c].maxVolt() + " V peak-to-peak";
            });
        }
        for (int ch = 1; ch <= 2; ch++) {
            int c = ch;
            if (limits[c] == null) {
                continue;
            }
            double want = Math.min(limits[c].maxVolt(), Math.max(limits[c].minVolt(), 1.0));
            step("digitizer", "range " + want + " V and read back, channel " + ch, () -> {
                double got = d.setRange(c, want);
                if (!(got > 0)) {
                    throw new IllegalStateException("read back " + got + " V, not a range");
                }
                return "granted " + got + " V";
            });
            step("digitizer", "offset 0 V and coupling dc, channel " + ch, () -> {
                d.setOffset(c, 0);
                d.setCoupling(c, Coupling.DC);
                return "set";
            });
        }
        Timing[] timing = new Timing[1];
        boolean timed = step("digitizer", "interval 1 us and 1000 points, read back", () -> {
            timing[0] = d.setTiming(1e-6, 1000);
            return "interval " + timing[0].sampleIntervalSecond() + " s, " + timing[0].points() + " points";
        });
        step("digitizer", "trigger on channel 1, 0 V, rising", () -> {
            d.setTrigger(TriggerSource.CHANNEL1, 0, true);
            return "set";
        });
        boolean acquired = timed && step("digitizer", "acquire (output off: noise only)", () -> {
            d.acquire();
            return "complete";
        });
        for (int ch = 1; ch <= 2 && acquired; ch++) {
            int c = ch;
            step("digitizer", "fetch and decode, channel " + ch, () -> {
                Trace t = d.fetch(c);
                for (double v : t.volts()) {
                    if (!Double.isFinite(v)) {
                        throw new IllegalStateException("decoded a sample that is not a number");
                    }
                }
                if (t.length() != timing[0].points()) {
                    throw new IllegalStateException(t.length() + " samples for a record of " + timing[0].points());
                }
                return t.length() + " samples, " + String.format(Locale.ROOT, "%.4g V peak-to-peak", t.peakToPeak())
                        + (t.clippedSamples() > 0 ? ", " + t.clippedSamples() + " at the converter's limits" : "");
            });
        }
    }

    private boolean step(String instrument, String operation, Operation op) {
        try {
            steps.add(new Step(instrument, operation, true, op.run()));
            return true;
        } catch (RuntimeException e) {
            steps.add(new Step(instrument, operation, false, e.getMessage()));
            return false;
        }
    }
}
