package org.lrbench.bench;

import java.nio.file.Path;
import org.lrbench.sim.SimDigitizer;
import org.lrbench.sim.SimGenerator;
import org.lrbench.sim.SimSettings;
import org.lrbench.sim.SimTiming;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transports;
import org.lrbench.uncertainty.BenchAccuracy;
import org.lrbench.units.Dimension;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;

/** Reads and validates a bench file. */
public final class BenchLoader {
    private static final String[] KEYS = {"bench_format", "name", "max_amplitude", "generator", "digitizer", "simulation",
        "accuracy", "switch", "meter", "check_standard"};

    private BenchLoader() {
    }

    public static BenchConfig load(Path file) throws ProblemsException {
        Problems problems = new Problems(file.toString());
        return read(YamlFile.read(file, problems, KEYS), file.toString());
    }

    public static BenchConfig parse(String text, String name) throws ProblemsException {
        Problems problems = new Problems(name);
        return read(YamlFile.parse(text, problems, KEYS), name);
    }

    private static BenchConfig read(YamlMap root, String source) throws ProblemsException {
        root.integer("bench_format", true, 1, 1);
        String name = root.text("name", true);
        if (name != null && !org.lrbench.results.Names.valid(name)) {
            // the bench's name reaches folder names (calibration, check-standard records): the lot number's rule
            root.problem("name", org.lrbench.results.Names.problem("a bench name", name));
        }
        Double max = root.quantity("max_amplitude", Dimension.VOLTAGE, true);
        if (max != null && !(max > 0)) {
            root.problem("max_amplitude", "must be greater than 0 V");
        }
        InstrumentLink generator = link(root, "generator");
        InstrumentLink digitizer = link(root, "digitizer");
        InstrumentLink switchUnit = root.has("switch") ? link(root, "switch") : null;
        if (switchUnit != null) {
            YamlMap s = root.map("switch", true, "driver", "address", "first_channel");
            Integer first = s == null ? null : s.integer("first_channel", false, 0, 999_999);
            if (first != null) {
                switchUnit = new InstrumentLink(switchUnit.driver(), switchUnit.address(), first, null,
                        switchUnit.driverAt());
            }
        }
        InstrumentLink meter = root.has("meter") ? link(root, "meter") : null;
        SimSettings sim = simulation(root);
        BenchAccuracy accuracy = accuracy(root);
        if (sim != null && Double.isNaN(sim.senseError())) {
            // the simulated sense resistor off its nominal as a real one may be: drawn from the bench's
            // seed, uniformly within the tolerance the bench file declares for it
            double u = new java.util.Random(sim.seed() ^ SENSE_DRAW).nextDouble();
            sim = sim.withSenseError(accuracy.senseTolerance() * (2 * u - 1));
        }
        if (sim != null && Double.isNaN(sim.rangeGainSpread())) {
            // each channel's gain per front-end stage within a quarter of the declared range match, so the
            // gain ratio of any range pair differs from any other's by at most the match
            sim = sim.withRangeGainSpread(accuracy.rangeGainMatch() / 4);
        }
        if (sim != null && Double.isNaN(sim.meterError())) {
            // the meter off as a real one may be: drawn from the seed within its declared accuracy
            double u = new java.util.Random(sim.seed() ^ METER_DRAW).nextDouble();
            sim = sim.withMeterError(accuracy.meterAccuracy() * (2 * u - 1));
        }
        CheckStandard check = root.has("check_standard") ? checkStandard(root, sim != null) : null;
        root.problems().throwIfAny();
        return new BenchConfig(source, name, max, generator, digitizer, switchUnit, meter, sim, accuracy, check);
    }

    private static final String[] SIMULATION_KEYS = {"source_impedance", "noise", "resolution", "seed",
        "channel2_gain_error", "channel2_skew", "lead_resistance", "lead_inductance", "stray_capacitance",
        "meter_lead_resistance", "digitizer", "generator", "timing", "sense_resistor_error", "range_gain_errors",
        "meter_error"};

    /** Salt of the draw of a simulated sense resistor's error from the bench's seed (any fixed number). */
    private static final long SENSE_DRAW = 0x5e45e;
    private static final long METER_DRAW = 0x3e7e5;

    /** A key's scalar text without recording a problem when it is no text (null then). */
    private static String textOf(YamlMap m, String key) {
        return m.value(key, false).filter(n -> n instanceof org.yaml.snakeyaml.nodes.ScalarNode)
                .map(n -> ((org.yaml.snakeyaml.nodes.ScalarNode) n).getValue()).orElse(null);
    }

    /**
     * {@code check_standard}: {@code serial}, {@code inductance} (certified) and {@code uncertainty}
     * (its expanded uncertainty, absolute or relative), {@code plan} (relative to the bench file),
     * {@code interval} (how often it is measured), {@code calibration_due} (the corrections' longest
     * age), {@code history} (readings before the chart's limits come from them, default 20), and on a
     * simulated bench {@code part} (the reference part's file).
     */
    private static CheckStandard checkStandard(YamlMap root, boolean simulated) {
        YamlMap m = root.map("check_standard", false, "serial", "inductance", "uncertainty", "plan", "interval",
                "calibration_due", "history", "part");
        if (m == null) {
            return null;
        }
        String serial = m.text("serial", true);
        if (serial != null && !org.lrbench.results.Names.valid(serial)) {
            m.problem("serial", org.lrbench.results.Names.problem("serial", serial));
        }
        Double l = m.quantity("inductance", Dimension.INDUCTANCE, true);
        if (l != null && !(l > 0)) {
            m.problem("inductance", "must be greater than 0 H");
        }
        Double u = null;
        var q = m.anyQuantity("uncertainty", true);
        if (q != null && l != null) {
            if (q.relative()) {
                u = q.value() * l;
            } else if (q.dimension() == Dimension.INDUCTANCE) {
                u = q.value();
            } else {
                m.problem("uncertainty", "give the certificate's expanded uncertainty in H or as a percentage, such as 0.2 %");
            }
            if (u != null && !(u > 0 && u < l)) {
                m.problem("uncertainty", "must be above 0 and below the certified value");
                u = null;
            }
        }
        String plan = m.text("plan", true);
        Double interval = duration(m, "interval");
        if (interval != null && !(interval >= 60 && interval <= 31 * 86400)) {
            m.problem("interval", "must be 1 min to 31 d, such as 8 h");
        }
        Double due = duration(m, "calibration_due");
        if (due != null && !(due >= 3600 && due <= 400 * 86400)) {
            m.problem("calibration_due", "must be 1 h to 400 d, such as 30 d");
        }
        Integer history = m.has("history") ? m.integer("history", true, 5, 1000) : Integer.valueOf(20);
        String part = m.text("part", false);
        if (part != null && !simulated) {
            m.problem("part", "only a simulated bench has a simulated reference part");
        } else if (part == null && simulated) {
            m.problem("check_standard", "a simulated bench needs the reference part's file (part)");
        }
        if (serial == null || l == null || u == null || plan == null || interval == null || due == null || history == null) {
            return null;
        }
        return new CheckStandard(serial, l, u, plan, interval, due, history, part);
    }

    /**
     * A required duration in seconds, minutes, hours or days ({@code 8 h}, {@code 30 d}: units the SI
     * accepts for use with it), or null with a problem at the key.
     */
    private static Double duration(YamlMap m, String key) {
        String text = m.text(key, true);
        if (text == null) {
            return null;
        }
        var match = java.util.regex.Pattern.compile("\\s*([0-9]+(?:\\.[0-9]+)?)\\s*(s|min|h|d)\\s*").matcher(text);
        if (!match.matches()) {
            m.problem(key, "'" + text + "' is not a duration; give a number and s, min, h or d, such as 8 h");
            return null;
        }
        double v = Double.parseDouble(match.group(1));
        return v * switch (match.group(2)) {
            case "min" -> 60;
            case "h" -> 3600;
            case "d" -> 86400;
            default -> 1;
        };
    }

    private static BenchAccuracy accuracy(YamlMap root) {
        BenchAccuracy d = BenchAccuracy.defaults();
        YamlMap m = root.map("accuracy", false, "sense_resistor_tolerance", "gain_accuracy", "skew", "frequency_accuracy",
                "range_gain_match", "uncorrected_lead_resistance", "uncorrected_lead_inductance",
                "uncorrected_stray_capacitance", "meter_resistance_accuracy", "sense_resistor_ac_dc");
        if (m == null) {
            return d;
        }
        Double sense = relative(m, "sense_resistor_tolerance");
        Double gain = relative(m, "gain_accuracy");
        Double skew = m.quantity("skew", Dimension.TIME, false);
        if (skew != null && skew < 0) {
            m.problem("skew", "must not be negative");
        }
        Double freq = relative(m, "frequency_accuracy");
        Double ranges = relative(m, "range_gain_match");
        BenchAccuracy.FixtureBounds fd = BenchAccuracy.FixtureBounds.defaults();
        Double leadOhm = nonNegative(m, "uncorrected_lead_resistance", Dimension.RESISTANCE);
        Double leadHenry = nonNegative(m, "uncorrected_lead_inductance", Dimension.INDUCTANCE);
        Double strayFarad = nonNegative(m, "uncorrected_stray_capacitance", Dimension.CAPACITANCE);
        Double meter = relative(m, "meter_resistance_accuracy");
        Double acDc = relative(m, "sense_resistor_ac_dc");
        return new BenchAccuracy(sense == null ? d.senseTolerance() : sense, gain == null ? d.gainAccuracy() : gain,
                skew == null ? d.skewSecond() : skew, freq == null ? d.frequencyAccuracy() : freq,
                ranges == null ? d.rangeGainMatch() : ranges, Double.POSITIVE_INFINITY, new BenchAccuracy.FixtureBounds(
                leadOhm == null ? fd.leadOhm() : leadOhm, leadHenry == null ? fd.leadHenry() : leadHenry,
                strayFarad == null ? fd.strayFarad() : strayFarad)).withTraceSpecs(
                meter == null ? BenchAccuracy.METER_ACCURACY : meter, acDc == null ? BenchAccuracy.SENSE_AC_DC : acDc);
    }

    private static Double nonNegative(YamlMap m, String key, Dimension d) {
        Double v = m.quantity(key, d, false);
        if (v != null && !(v >= 0)) {
            m.problem(key, "must not be negative");
        }
        return v;
    }

    /** {@code simulation.timing}: how long the simulated instruments take (none, lan, usb, serial). */
    private static SimTiming timing(YamlMap m) {
        SimTiming t = m.has("timing") ? m.choice("timing", true, new java.util.TreeMap<>(java.util.Map.of("none", SimTiming.NONE,
                "lan", SimTiming.LAN, "usb", SimTiming.USB, "serial", SimTiming.SERIAL))) : null;
        return t == null ? SimTiming.NONE : t;
    }

    private static Double relative(YamlMap m, String key) {
        var q = m.anyQuantity(key, false);
        if (q == null) {
            return null;
        }
        if (!q.relative() || q.value() < 0) {
            m.problem(key, "'" + q + "' must be a non-negative relative value such as 0.1 % or 50 ppm");
            return null;
        }
        return q.value();
    }

    private static InstrumentLink link(YamlMap root, String key) {
        YamlMap m = root.map(key, true, "driver", "address", "first_channel", "output_impedance");
        if (m == null) {
            return null;
        }
        String driver = m.text("driver", true);
        String address = m.text("address", true);
        if (address == null) {
            return null;
        }
        try {
            Address a = Address.parse(address);
            Transports.check(a);
            if (!key.equals("switch") && m.has("first_channel")) {
                m.problem("first_channel", "only a switch unit has a first channel");
            }
            Double out = m.quantity("output_impedance", Dimension.RESISTANCE, false);
            if (out != null && !key.equals("generator")) {
                m.problem("output_impedance", "only the generator has an output impedance here");
            } else if (out != null && !(out >= 0 && out <= 10e3)) {
                m.problem("output_impedance", "must be 0 ohm to 10 kohm, such as 50 ohm");
            }
            var mark = m.value("driver", false).map(n -> n.getStartMark()).orElse(null);
            return new InstrumentLink(driver, a, InstrumentLink.DEFAULT_FIRST_CHANNEL, out).at(mark == null ? null
                    : new org.lrbench.yaml.Problem(m.problems().file(), mark.getLine() + 1, mark.getColumn() + 1,
                    m.keyOf("driver"), ""));
        } catch (AddressException e) {
            m.problem("address", e.getMessage());
            return null;
        }
    }

    private static SimSettings simulation(YamlMap root) {
        SimSettings d = SimSettings.defaults();
        YamlMap m = root.map("simulation", false, SIMULATION_KEYS);
        if (m == null) {
            return d;
        }
        SimDigitizer.Personality personality = m.has("digitizer") ? m.choice("digitizer", true,
                SimDigitizer.Personality.byKey()) : SimDigitizer.Personality.GENERIC;
        SimGenerator.Personality generator = m.has("generator") ? m.choice("generator", true,
                SimGenerator.Personality.byKey()) : SimGenerator.Personality.GENERIC;
        Double source = m.quantity("source_impedance", Dimension.RESISTANCE, false);
        if (source != null && source < 0) {
            m.problem("source_impedance", "must not be negative");
        }
        Double noise = m.quantity("noise", Dimension.VOLTAGE, false);
        if (noise != null && noise < 0) {
            m.problem("noise", "must not be negative");
        }
        Integer bits = null;
        if (m.has("resolution")) {
            String text = m.text("resolution", true);
            bits = "ideal".equals(text) ? Integer.valueOf(0) : m.integer("resolution", true, 4, 16);
        }
        Long seed = m.longValue("seed", false);
        var gain = m.anyQuantity("channel2_gain_error", false);
        if (gain != null && !gain.relative()) {
            m.problem("channel2_gain_error", "must be a relative value such as 0.4 % or -2000 ppm");
        }
        Double skew = m.quantity("channel2_skew", Dimension.TIME, false);
        Double leadR = m.quantity("lead_resistance", Dimension.RESISTANCE, false);
        Double leadL = m.quantity("lead_inductance", Dimension.INDUCTANCE, false);
        Double stray = m.quantity("stray_capacitance", Dimension.CAPACITANCE, false);
        for (String k : new String[] {"lead_resistance", "lead_inductance", "stray_capacitance"}) {
            Double v = k.startsWith("lead_r") ? leadR : k.startsWith("lead_i") ? leadL : stray;
            if (v != null && v < 0) {
                m.problem(k, "must not be negative");
            }
        }
        var senseError = "drawn".equals(textOf(m, "sense_resistor_error")) ? null
                : m.anyQuantity("sense_resistor_error", false);
        if (senseError != null && (!senseError.relative() || Math.abs(senseError.value()) >= 0.5)) {
            m.problem("sense_resistor_error", "must be a relative value under 50 %, such as 0.08 % or -500 ppm");
        }
        double rangeSpread = drawnOrRelative(m, "range_gain_errors", "the half-width each channel's gain per range"
                + " stage is drawn within, such as 0.025 %, or drawn (a quarter of accuracy.range_gain_match)");
        double meterError = drawnOrRelative(m, "meter_error", "the meter's reading error, such as 0.01 %, or drawn"
                + " (within accuracy.meter_resistance_accuracy)");
        Double meterLead = m.quantity("meter_lead_resistance", Dimension.RESISTANCE, false);
        if (meterLead != null && meterLead < 0) {
            m.problem("meter_lead_resistance", "must not be negative");
        }
        return new SimSettings(source == null ? d.sourceImpedanceOhm() : source, noise == null ? d.noiseVoltRms() : noise,
                bits == null ? d.resolutionBits() : bits, seed == null ? d.seed() : seed,
                gain == null || !gain.relative() ? 0 : gain.value(), skew == null ? 0 : skew,
                leadR == null ? 0 : leadR, leadL == null ? 0 : leadL, stray == null ? 0 : stray,
                meterLead == null ? 0.05 : meterLead,
                personality == null ? SimDigitizer.Personality.GENERIC : personality,
                generator == null ? SimGenerator.Personality.GENERIC : generator, timing(m),
                // NaN: "drawn", settled once the bench's declared tolerance is read (see load)
                "drawn".equals(textOf(m, "sense_resistor_error")) ? Double.NaN
                        : senseError == null || !senseError.relative() ? 0 : senseError.value(), rangeSpread, meterError,
                seed == null ? d.seed() : seed);
    }

    /** A simulated error: absent 0, "drawn" NaN (settled from the seed once the accuracies are read), else relative. */
    private static double drawnOrRelative(YamlMap m, String key, String allowed) {
        if (!m.has(key)) {
            return 0;
        }
        if ("drawn".equals(textOf(m, key))) {
            return Double.NaN;
        }
        var q = m.anyQuantity(key, false);
        if (q == null) {
            return 0;
        }
        if (!q.relative() || Math.abs(q.value()) >= 0.1) {
            m.problem(key, "must be " + allowed + "; under 10 %");
            return 0;
        }
        return q.value();
    }
}
