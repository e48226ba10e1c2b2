package org.lrbench.plan;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.EnumSet;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.lrbench.analysis.LumpedParameter;
import org.lrbench.fixture.FixtureWiring;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.CharacteristicClass;
import org.lrbench.judge.DecisionRule;
import org.lrbench.judge.Limit;
import org.lrbench.sampling.InspectionLevel;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.sampling.SingleSampling;
import org.lrbench.units.Dimension;
import org.lrbench.units.Quantity;
import org.lrbench.units.Units;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads and validates a plan file. All problems of the file are collected and thrown together,
 * each with its line, column and key. The bench's amplitude ceiling is checked here, before any
 * instrument is touched.
 */
public final class PlanLoader {
    static final int MIN_SAMPLES_PER_CYCLE = 100;
    static final int MAX_SWEEP_POINTS = 1000;
    /**
     * The current's distortion (THD) above which a point warns when the plan sets no
     * {@code distortion_limit}: 3 %, where an iron-powder or ferrite core starts to saturate visibly in
     * a small-signal inductance test (common practice, no source).
     */
    static final double DEFAULT_DISTORTION_LIMIT = 0.03;

    private PlanLoader() {
    }

    /**
     * @param maxAmplitudeVolt the bench's ceiling on the generator's peak open-circuit voltage
     *                         (amplitude plus |offset|); no plan may exceed it
     */
    public static Plan load(Path file, double maxAmplitudeVolt) throws ProblemsException {
        Problems problems = new Problems(file.toString());
        YamlMap root = YamlFile.read(file, problems, "plan_format", "part_number", "description", "fixture",
                "sine_sweep", "triangle_check", "sampling", "dc_resistance", "limits", "supplier");
        return read(root, file.toString(), maxAmplitudeVolt);
    }

    /** Reads plan text (tests and tools); {@code name} is used in problems. */
    public static Plan parse(String text, String name, double maxAmplitudeVolt) throws ProblemsException {
        Problems problems = new Problems(name);
        YamlMap root = YamlFile.parse(text, problems, "plan_format", "part_number", "description", "fixture",
                "sine_sweep", "triangle_check", "sampling", "dc_resistance", "limits", "supplier");
        return read(root, name, maxAmplitudeVolt);
    }

    private static Plan read(YamlMap root, String source, double maxAmplitudeVolt) throws ProblemsException {
        root.integer("plan_format", true, 1, 1);
        String partNumber = root.text("part_number", true);
        if (TextRules.partNumberProblem(partNumber) != null) {
            root.problem("part_number", TextRules.partNumberProblem(partNumber));
        }
        String description = root.text("description", false);
        if (TextRules.lineProblem("a description", description) != null) {
            root.problem("description", TextRules.lineProblem("a description", description));
        }
        String supplier = root.text("supplier", false);
        if (supplier != null && (supplier.length() > 200 || supplier.chars().anyMatch(Character::isISOControl))) {
            // the same rule as a supplier named for a lot (results.Names.supplierProblem)
            root.problem("supplier", "a supplier's name is one line of at most 200 characters");
        }
        Double sense = null;
        FixtureWiring wiring = null;
        YamlMap fixture = root.map("fixture", true, "sense_resistor", "wiring", "probes");
        if (fixture != null) {
            sense = fixture.quantity("sense_resistor", Dimension.RESISTANCE, true);
            if (sense != null && !(sense >= 1e-3 && sense <= 1e7)) {
                fixture.problem("sense_resistor", "'" + Units.format(sense, Dimension.RESISTANCE) + "' is no sense"
                        + " resistor a fixture has; allowed 1 mohm to 10 Mohm");
            }
            wiring = readWiring(fixture, sense);
        }
        SineSweep sweep = readSweep(root, maxAmplitudeVolt);
        TriangleCheck triangle = readTriangle(root, maxAmplitudeVolt);
        List<Limit> limits = readLimits(root, sweep);
        SamplingScheme sampling = readSampling(root, limits);
        DcResistanceStep dc = readDcResistance(root);
        root.problems().throwIfAny();
        return new Plan(source, partNumber, description == null ? "" : description, sense, sweep, triangle,
                List.copyOf(limits), sampling, wiring, dc, supplier == null ? null : supplier.trim());
    }

    private static DcResistanceStep readDcResistance(YamlMap root) {
        YamlMap m = root.map("dc_resistance", false, "wiring", "temperature", "reference_temperature");
        if (m == null) {
            return null;
        }
        Boolean four = m.has("wiring") ? m.choice("wiring", true, Map.of("four_wire", Boolean.TRUE, "two_wire", Boolean.FALSE))
                : Boolean.TRUE;
        Double t = m.quantity("temperature", Dimension.TEMPERATURE, true);
        Double ref = m.has("reference_temperature") ? m.quantity("reference_temperature", Dimension.TEMPERATURE, true)
                : Double.valueOf(20);
        for (String key : List.of("temperature", "reference_temperature")) {
            Double v = key.equals("temperature") ? t : ref;
            if (v != null && !(v >= -273.15)) {
                m.problem(key, Units.format(v, Dimension.TEMPERATURE) + " is below absolute zero (-273.15 C)");
            } else if (v != null && v > 300) {
                m.problem(key, Units.format(v, Dimension.TEMPERATURE) + " is no temperature a winding is measured at"
                        + " (above 300 C)");
            }
        }
        if (four == null || t == null || ref == null) {
            return null;
        }
        return new DcResistanceStep(four, t, ref);
    }

    /**
     * The fixture's wiring and probes. A single-ended (grounded) input cannot measure across the
     * sense resistor of the differential wiring, which floats between the generator and the part:
     * it would short the part to ground through the scope's common. That is refused here.
     */
    private static FixtureWiring readWiring(YamlMap fixture, Double sense) {
        FixtureWiring.Topology topology = fixture.has("wiring")
                ? fixture.choice("wiring", true, Map.of("differential", FixtureWiring.Topology.DIFFERENTIAL,
                        "low_side", FixtureWiring.Topology.LOW_SIDE))
                : FixtureWiring.Topology.DIFFERENTIAL;
        double[] att = {1, 1};
        boolean[] diff = {topology != FixtureWiring.Topology.LOW_SIDE, topology != FixtureWiring.Topology.LOW_SIDE};
        YamlMap probes = fixture.map("probes", false, "channel1", "channel2");
        if (probes != null) {
            for (int ch = 1; ch <= 2; ch++) {
                YamlMap p = probes.map("channel" + ch, false, "kind", "attenuation");
                if (p == null) {
                    continue;
                }
                if (p.has("kind")) {
                    Boolean d = p.choice("kind", true, Map.of("differential", Boolean.TRUE, "single_ended", Boolean.FALSE));
                    if (d != null) {
                        diff[ch - 1] = d;
                    }
                }
                Double a = p.quantity("attenuation", Dimension.NONE, false);
                if (a != null && !(a > 0)) {
                    p.problem("attenuation", "must be greater than 0 (1 for 1x, 10 for 10x, or a measured factor)");
                } else if (a != null) {
                    att[ch - 1] = a;
                }
            }
        }
        if (topology == FixtureWiring.Topology.DIFFERENTIAL && !diff[0]) {
            fixture.problem("probes", "channel 1 is single-ended (grounded), but in the differential wiring the sense"
                    + " resistor floats between the generator and the part: a grounded input across it would short the part"
                    + " through the scope's common. Use a differential probe on channel 1, or wiring: low_side");
        }
        if (topology == null || sense == null) {
            return null;
        }
        return new FixtureWiring(sense, topology, att[0], att[1], diff[0], diff[1]);
    }

    private static final Map<String, CharacteristicClass> CLASSES = Map.of(
            "critical", CharacteristicClass.CRITICAL, "major", CharacteristicClass.MAJOR, "minor", CharacteristicClass.MINOR);

    private static SamplingScheme readSampling(YamlMap root, List<Limit> limits) {
        YamlMap m = root.map("sampling", false, "level", "aql");
        if (m == null) {
            return null;
        }
        Map<String, InspectionLevel> levels = new LinkedHashMap<>();
        for (InspectionLevel l : InspectionLevel.values()) {
            levels.put(l.name(), l);
        }
        InspectionLevel level = m.has("level") ? m.choice("level", true, levels) : InspectionLevel.II;
        YamlMap aqls = m.map("aql", true, "critical", "major", "minor");
        Map<CharacteristicClass, Double> aql = new EnumMap<>(CharacteristicClass.class);
        if (aqls != null) {
            for (var e : CLASSES.entrySet()) {
                if (aqls.has(e.getKey())) {
                    Double v = aqls.quantity(e.getKey(), Dimension.NONE, true);
                    if (v != null) {
                        try {
                            SingleSampling.plan(2, InspectionLevel.II, v);
                            aql.put(e.getValue(), v);
                        } catch (IllegalArgumentException bad) {
                            aqls.problem(e.getKey(), bad.getMessage());
                        }
                    }
                }
            }
        }
        for (Limit l : limits) {
            if (aqls != null && !aql.containsKey(l.characteristicClass())
                    && !aqls.has(l.characteristicClass().name().toLowerCase(Locale.ROOT))) {
                m.problem("aql", "limit '" + l.name() + "' is of class " + l.characteristicClass().name().toLowerCase(Locale.ROOT)
                        + ", which has no AQL here");
            }
        }
        return level == null ? null : new SamplingScheme(level, Map.copyOf(aql));
    }

    private static TriangleCheck readTriangle(YamlMap root, double maxAmplitudeVolt) {
        YamlMap t = root.map("triangle_check", false, "amplitude", "frequency", "cycles", "samples_per_cycle",
                "harmonics");
        if (t == null) {
            return null;
        }
        Double amplitude = t.quantity("amplitude", Dimension.VOLTAGE, true);
        if (amplitude != null && !(amplitude > 0)) {
            t.problem("amplitude", "must be greater than 0 V");
        } else if (amplitude != null && amplitude > maxAmplitudeVolt) {
            t.problem("amplitude", Units.format(amplitude, Dimension.VOLTAGE) + " peak exceeds the bench's maximum"
                    + " generator amplitude of " + Units.format(maxAmplitudeVolt, Dimension.VOLTAGE)
                    + " (bench max_amplitude)");
        }
        Double f = t.quantity("frequency", Dimension.FREQUENCY, true);
        if (f != null && !(f > 0)) {
            t.problem("frequency", "frequency must be greater than 0 Hz");
        }
        Integer cycles = t.has("cycles") ? t.integer("cycles", true, 1, 10_000) : Integer.valueOf(10);
        Integer spc = t.has("samples_per_cycle") ? t.integer("samples_per_cycle", true, 100, 100_000) : Integer.valueOf(400);
        Integer harmonics = t.has("harmonics") ? t.integer("harmonics", true, 3, 199) : Integer.valueOf(31);
        if (spc != null && harmonics != null && harmonics >= spc / 2) {
            t.problem("harmonics", harmonics + " harmonics need more than " + 2 * harmonics + " samples per cycle");
        }
        if (amplitude == null || f == null || cycles == null || spc == null || harmonics == null) {
            return null;
        }
        return new TriangleCheck(amplitude, f, cycles, spc, harmonics);
    }

    private static SineSweep readSweep(YamlMap root, double maxAmplitudeVolt) {
        YamlMap s = root.map("sine_sweep", true, "amplitude", "offset", "frequencies", "log_sweep", "cycles",
                "samples_per_cycle", "settle", "settle_rule", "model_terms", "distortion_limit", "excitation",
                "multisine_tolerance");
        if (s == null) {
            return null;
        }
        Double amplitude = s.quantity("amplitude", Dimension.VOLTAGE, true);
        Double offset = s.quantity("offset", Dimension.VOLTAGE, false);
        double off = offset == null ? 0.0 : offset;
        if (amplitude != null) {
            if (!(amplitude > 0)) {
                s.problem("amplitude", "must be greater than 0 V");
            } else if (amplitude + Math.abs(off) > maxAmplitudeVolt) {
                s.problem("amplitude", Units.format(amplitude, Dimension.VOLTAGE) + " peak"
                        + (off != 0 ? " plus " + Units.format(Math.abs(off), Dimension.VOLTAGE) + " offset" : "")
                        + " exceeds the bench's maximum generator amplitude of "
                        + Units.format(maxAmplitudeVolt, Dimension.VOLTAGE) + " (bench max_amplitude)");
            }
        }
        List<Double> frequencies = readFrequencies(s);
        Integer cycles = s.integer("cycles", true, 1, 10_000);
        Integer spc = s.integer("samples_per_cycle", false, MIN_SAMPLES_PER_CYCLE, 100_000);
        Double settle = s.quantity("settle", Dimension.TIME, true);
        // fixed: the settle at every point; circuit: from the part's time constant, the settle a ceiling
        Boolean fromCircuit = s.has("settle_rule") ? s.choice("settle_rule", true,
                new java.util.TreeMap<>(Map.of("fixed", false, "circuit", true))) : Boolean.FALSE;
        if (settle != null && (settle < 0 || settle > 600)) {
            s.problem("settle", "must be 0 s to 600 s");
        }
        Set<LumpedParameter> terms = readTerms(s);
        Double distortion = DEFAULT_DISTORTION_LIMIT;
        if (s.has("distortion_limit")) {
            var q = s.anyQuantity("distortion_limit", true);
            if (q != null && (!q.relative() || !(q.value() > 0) || q.value() > 1)) {
                s.problem("distortion_limit", "must be a percentage above 0 % and at most 100 %, such as 3 %");
            }
            distortion = q == null || !q.relative() ? null : q.value();
        }
        // stepped: one frequency after another; multisine: all of them in one arbitrary waveform; auto (the
        // default): lrbench chooses for the bench (ExcitationChoice), stepped until it has
        String excitation = s.has("excitation") ? s.choice("excitation", true,
                new java.util.TreeMap<>(Map.of("stepped", "stepped", "multisine", "multisine", "auto", "auto"))) : "auto";
        Boolean multisine = excitation == null ? null : excitation.equals("multisine");
        Double tolerance = SineSweep.DEFAULT_MULTISINE_TOLERANCE;
        if (s.has("multisine_tolerance")) {
            var q = s.anyQuantity("multisine_tolerance", true);
            if (q != null && (!q.relative() || !(q.value() > 0) || q.value() > 0.1)) {
                s.problem("multisine_tolerance", "must be a percentage above 0 % and at most 10 %, such as 2 %");
            } else if (q != null && "stepped".equals(excitation)) {
                s.problem("multisine_tolerance", "a sweep with excitation: stepped has no tones to place");
            }
            tolerance = q == null || !q.relative() ? null : q.value();
        }
        if (amplitude == null || frequencies == null || cycles == null || settle == null || terms == null
                || distortion == null || fromCircuit == null || multisine == null || tolerance == null) {
            return null;
        }
        return new SineSweep(amplitude, off, frequencies, cycles, spc == null ? MIN_SAMPLES_PER_CYCLE : spc, settle,
                terms, distortion, fromCircuit, multisine, tolerance, excitation.equals("auto"));
    }

    private static final Map<String, LumpedParameter> TERMS = Map.of(
            "parallel_capacitance", LumpedParameter.C_P,
            "skin_effect", LumpedParameter.SKIN,
            "parallel_loss", LumpedParameter.G_P);

    private static Set<LumpedParameter> readTerms(YamlMap s) {
        Set<LumpedParameter> terms = EnumSet.noneOf(LumpedParameter.class);
        if (!s.has("model_terms")) {
            return EnumSet.of(LumpedParameter.C_P, LumpedParameter.SKIN);
        }
        var node = s.value("model_terms", true).orElseThrow();
        if (node instanceof SequenceNode seq && seq.getValue().isEmpty()) {
            return terms; // the series R + L model
        }
        boolean ok = true;
        for (YamlMap.Item item : s.list("model_terms", true)) {
            String word = item.node() instanceof ScalarNode sc ? sc.getValue() : null;
            LumpedParameter p = word == null ? null : TERMS.get(word);
            if (p == null) {
                s.problems().add(item.node(), item.path(), "'" + word + "' is not a model term; allowed: "
                        + String.join(", ", new TreeSet<>(TERMS.keySet())) + " (an empty list: series R + L)");
                ok = false;
            } else {
                terms.add(p);
            }
        }
        return ok ? terms : null;
    }

    private static List<Double> readFrequencies(YamlMap s) {
        boolean list = s.has("frequencies");
        boolean log = s.has("log_sweep");
        if (list == log) {
            s.problem(list ? "log_sweep" : "frequencies", list
                    ? "give either frequencies or log_sweep, not both"
                    : "missing: give frequencies (a list) or log_sweep (start, stop, points)");
            return null;
        }
        List<Double> out = new ArrayList<>();
        boolean ok = true;
        if (list) {
            for (YamlMap.Item item : s.list("frequencies", true)) {
                Double f = s.asQuantity(item, Dimension.FREQUENCY);
                if (f == null) {
                    ok = false;
                } else if (!(f > 0)) {
                    s.problems().add(item.node(), item.path(), "frequency must be greater than 0 Hz, got "
                            + Units.format(f, Dimension.FREQUENCY));
                    ok = false;
                } else {
                    out.add(f);
                }
            }
            if (out.size() > MAX_SWEEP_POINTS) {
                s.problem("frequencies", "at most " + MAX_SWEEP_POINTS + " frequencies");
                ok = false;
            }
            return ok && !out.isEmpty() ? out : null;
        }
        YamlMap l = s.map("log_sweep", true, "start", "stop", "points");
        if (l == null) {
            return null;
        }
        Double start = l.quantity("start", Dimension.FREQUENCY, true);
        Double stop = l.quantity("stop", Dimension.FREQUENCY, true);
        Integer points = l.integer("points", true, 2, MAX_SWEEP_POINTS);
        if (start != null && !(start > 0)) {
            l.problem("start", "frequency must be greater than 0 Hz");
            return null;
        }
        if (start != null && stop != null && !(stop > start)) {
            l.problem("stop", "must be above start (" + Units.format(start, Dimension.FREQUENCY) + ")");
            return null;
        }
        if (start == null || stop == null || points == null) {
            return null;
        }
        double ratio = Math.log(stop / start);
        for (int i = 0; i < points; i++) {
            out.add(i == points - 1 ? stop : start * Math.exp(ratio * i / (points - 1)));
        }
        return out;
    }

    private static List<Limit> readLimits(YamlMap root, SineSweep sweep) {
        List<Limit> limits = new ArrayList<>();
        Set<String> names = new HashSet<>();
        for (YamlMap.Item item : root.list("limits", true)) {
            YamlMap m = root.asMap(item, "name", "characteristic", "at", "nominal", "tolerance", "min", "max",
                    "decision", "guard_band", "class");
            if (m == null) {
                continue;
            }
            Limit limit = readLimit(m, sweep);
            if (limit != null) {
                if (!names.add(limit.name())) {
                    m.problem("name", "another limit is already named '" + limit.name() + "'");
                } else {
                    limits.add(limit);
                }
            }
        }
        return limits;
    }

    private static Limit readLimit(YamlMap m, SineSweep sweep) {
        Characteristic c = m.choice("characteristic", true, Characteristic.byKey());
        String name = m.text("name", false);
        Double at = m.quantity("at", Dimension.FREQUENCY, false);
        if (c == null) {
            return null;
        }
        if (c.needsFrequency() && at == null && !m.has("at")) {
            m.problem("at", c.key() + " depends on frequency: give the frequency it is specified at");
        }
        if (at != null) {
            if (!(at > 0)) {
                m.problem("at", "frequency must be greater than 0 Hz");
                at = null;
            } else if (sweep != null && (at < sweep.lowestHz() * (1 - 1e-9) || at > sweep.highestHz() * (1 + 1e-9))) {
                m.problem("at", Units.format(at, Dimension.FREQUENCY) + " lies outside the swept range "
                        + Units.format(sweep.lowestHz(), Dimension.FREQUENCY) + " .. "
                        + Units.format(sweep.highestHz(), Dimension.FREQUENCY));
            }
        }
        boolean nominalForm = m.has("nominal") || m.has("tolerance");
        boolean boundForm = m.has("min") || m.has("max");
        if (nominalForm == boundForm) {
            m.problem(nominalForm ? "min" : "nominal", nominalForm
                    ? "give either nominal with tolerance, or min and/or max, not both"
                    : "missing: give nominal with tolerance, or min and/or max");
            return null;
        }
        double lower;
        double upper;
        String spec;
        Dimension d = c.dimension();
        if (nominalForm) {
            Double nominal = m.quantity("nominal", d, true);
            Quantity tol = m.anyQuantity("tolerance", true);
            if (nominal == null || tol == null) {
                return null;
            }
            double halfWidth;
            if (tol.relative()) {
                halfWidth = Math.abs(nominal) * tol.value();
                spec = Units.format(nominal, d) + " +/- " + stripZeros(tol.value() * 100) + " %";
            } else if (tol.dimension() == d) {
                halfWidth = tol.value();
                spec = Units.format(nominal, d) + " +/- " + Units.format(tol.value(), d);
            } else {
                m.problem("tolerance", "'" + tol + "' is " + tol.dimension().describe() + "; expected a percentage or "
                        + d.describe());
                return null;
            }
            if (!(nominal > 0)) {
                m.problem("nominal", Units.format(nominal, d) + ": " + c.key().replace('_', ' ')
                        + " is a positive quantity");
                return null;
            }
            if (!(halfWidth > 0)) {
                m.problem("tolerance", "must be greater than 0");
                return null;
            }
            if (halfWidth >= nominal) {
                m.problem("tolerance", "a tolerance of " + Units.format(halfWidth, d) + " on " + Units.format(nominal, d)
                        + " puts the lower limit at or below zero, where no part can be; give less than 100 %");
                return null;
            }
            lower = nominal - halfWidth;
            upper = nominal + halfWidth;
        } else {
            Double min = m.quantity("min", d, false);
            Double max = m.quantity("max", d, false);
            if ((m.has("min") && min == null) || (m.has("max") && max == null)) {
                return null;
            }
            if (min != null && max != null && !(max > min)) {
                m.problem("max", "must be above min (" + Units.format(min, d) + ")");
                return null;
            }
            if (min != null && !(min > 0)) {
                m.problem("min", "min " + Units.format(min, d) + " can never fail: " + c.key().replace('_', ' ')
                        + " is a positive quantity; give a minimum above 0 or leave it out");
                return null;
            }
            if (max != null && !(max > 0)) {
                m.problem("max", "max " + Units.format(max, d) + " can never pass: " + c.key().replace('_', ' ')
                        + " is a positive quantity");
                return null;
            }
            lower = min == null ? Double.NEGATIVE_INFINITY : min;
            upper = max == null ? Double.POSITIVE_INFINITY : max;
            spec = (min != null ? "min " + Units.format(min, d) : "") + (min != null && max != null ? ", " : "")
                    + (max != null ? "max " + Units.format(max, d) : "");
        }
        String limitName = name != null ? name.trim() : c.key().replace('_', ' ');
        DecisionRule rule = m.has("decision")
                ? m.choice("decision", true, Map.of("simple", DecisionRule.SIMPLE, "guarded", DecisionRule.GUARDED))
                : DecisionRule.SIMPLE;
        Double guard = m.quantity("guard_band", d, false);
        if (guard != null && rule != DecisionRule.GUARDED) {
            m.problem("guard_band", "a guard band needs decision: guarded");
        }
        if (guard != null && !(guard >= 0)) {
            m.problem("guard_band", "must not be negative");
        }
        double span = upper - lower;
        if (guard != null && Double.isFinite(span) && 2 * guard >= span) {
            m.problem("guard_band", "a guard band of " + Units.format(guard, d) + " on each side leaves no acceptance"
                    + " zone in a tolerance zone " + Units.format(span, d) + " wide: every part would fail");
        }
        CharacteristicClass cls = m.has("class") ? m.choice("class", true, CLASSES) : CharacteristicClass.MAJOR;
        if (rule == null || cls == null) {
            return null;
        }
        return new Limit(limitName, c, at, lower, upper, spec, rule, guard, cls);
    }

    private static String stripZeros(double v) {
        String s = String.format(Locale.ROOT, "%.6f", v);
        return s.replaceAll("0+$", "").replaceAll("\\.$", "");
    }
}
