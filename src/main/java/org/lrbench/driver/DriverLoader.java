package org.lrbench.driver;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Arrays;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import java.util.regex.PatternSyntaxException;
import org.lrbench.scpi.TraceEncoding;
import org.lrbench.units.Dimension;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;
import org.yaml.snakeyaml.nodes.Node;

/**
 * Loads {@code drivers/NAME.yaml}. Every operation of the driver's kind must have a template, every
 * placeholder must be one the operation provides, and word tables must map every logical word to a
 * SCPI mnemonic; problems are reported with file, line and column.
 */
public final class DriverLoader {
    private static final Pattern MNEMONIC = Pattern.compile("[A-Za-z][A-Za-z0-9]*");
    private static final Set<String> IDN_FIELDS = Set.of("manufacturer", "model", "serial", "firmware");

    private final Path directory;

    public DriverLoader(Path directory) {
        this.directory = directory;
    }

    /** The folder the driver files are read from. */
    public Path directory() {
        return directory;
    }

    /** Loads a driver by name from the drivers folder. */
    public DriverFile load(String name, DriverKind expected) throws ProblemsException {
        return load(name, expected, null);
    }

    /**
     * Loads a driver by name from the drivers folder; a name with no driver file is reported at
     * {@code namedAt} (where a bench file names it) when given.
     */
    public DriverFile load(String name, DriverKind expected, org.lrbench.yaml.Problem namedAt) throws ProblemsException {
        Path file = directory.resolve(name + ".yaml");
        Problems problems = new Problems(file.toString());
        if ((!name.matches("[A-Za-z0-9._-]+") || !Files.isRegularFile(file)) && namedAt != null) {
            throw new ProblemsException(List.of(new org.lrbench.yaml.Problem(namedAt.file(), namedAt.line(),
                    namedAt.column(), namedAt.key(), "'" + name + "': no driver file " + name + ".yaml in " + directory
                    + "; drivers there: " + String.join(", ", names()))));
        }
        if (!name.matches("[A-Za-z0-9._-]+") || !Files.isRegularFile(file)) {
            problems.add((Node) null, "driver",
                    "no driver file '" + name + ".yaml' in " + directory);
            problems.throwIfAny();
        }
        return read(file, name, expected, problems);
    }

    /** The driver files' names in the folder, sorted. */
    public List<String> names() {
        try (var files = Files.list(directory)) {
            return files.map(f -> f.getFileName().toString()).filter(n -> n.endsWith(".yaml"))
                    .map(n -> n.substring(0, n.length() - 5)).sorted().toList();
        } catch (java.io.IOException e) {
            return List.of();
        }
    }

    /** Loads a driver file from any path (tests, or a bench that names a file). */
    public static DriverFile read(Path file, String name, DriverKind expected, Problems problems)
            throws ProblemsException {
        YamlMap root = YamlFile.read(file, problems,
                "driver_format", "kind", "description", "identity", "timeout", "error_query",
                "trace_format", "commands", "shapes", "couplings", "trigger_sources", "slopes",
                "vertical", "scaling", "timebase", "acquisition", "levels", "limits", "block_terminator", "fetch_together",
                "frequency_settle", "arbitrary_encoding", "minimum_transfer_rate");
        root.integer("driver_format", true, 1, 1);
        DriverKind kind = root.choice("kind", true, Map.of("source", DriverKind.SOURCE, "digitizer", DriverKind.DIGITIZER,
                "switch", DriverKind.SWITCH, "meter", DriverKind.METER));
        if (kind != null && expected != null && kind != expected) {
            root.problem("kind", "this driver is for a " + kind.key() + "; a " + expected.key() + " driver is needed here");
        }
        String description = root.text("description", false);
        Map<String, Pattern> identity = readIdentity(root);
        Double timeoutSeconds = root.quantity("timeout", Dimension.TIME, false);
        if (timeoutSeconds != null && !(timeoutSeconds > 0 && timeoutSeconds <= 600)) {
            root.problem("timeout", "a reply timeout must be more than 0 s and at most 600 s");
        }
        String errorQuery = root.text("error_query", false);
        Map<String, CommandTemplate> commands = new LinkedHashMap<>();
        Map<String, Map<String, String>> words = new LinkedHashMap<>();
        TraceEncoding encoding = null;
        DigitizerTraits traits = null;
        if (kind == DriverKind.DIGITIZER) {
            String key = root.text("trace_format", true);
            if (key != null) {
                encoding = TraceEncoding.byKey(key);
                if (encoding == null) {
                    root.problem("trace_format", "'" + key + "' is not a trace format; allowed: "
                            + String.join(", ", Arrays.stream(TraceEncoding.values()).map(TraceEncoding::key).toList()));
                }
            }
            traits = DigitizerTraitsReader.read(root, encoding);
        } else if (kind != null) {
            for (String digitizerOnly : List.of("trace_format", "vertical", "scaling", "timebase", "acquisition",
                    "block_terminator", "fetch_together")) {
                if (root.has(digitizerOnly)) {
                    root.problem(digitizerOnly, "only digitizer drivers have " + digitizerOnly);
                }
            }
        }
        InstrumentLimits limits = limits(root, kind);
        double levelPerEmf = 1;
        if (kind == DriverKind.SOURCE) {
            levelPerEmf = levels(root);
        } else if (kind != null && root.has("levels")) {
            root.problem("levels", "only source drivers have levels");
        }
        if (kind != null) {
            Set<String> optional = new HashSet<>(traits == null ? Set.of() : DigitizerTraitsReader.optional(traits));
            YamlMap cmds = root.map("commands", true, kind.operations().keySet().toArray(String[]::new));
            if (kind == DriverKind.SOURCE) {
                // arbitrary waveforms are optional, but all three commands or none
                optional.addAll(DriverKind.ARBITRARY_OPERATIONS);
                if (cmds != null) {
                    List<String> given = DriverKind.ARBITRARY_OPERATIONS.stream().filter(cmds::has).toList();
                    if (!given.isEmpty() && given.size() < DriverKind.ARBITRARY_OPERATIONS.size()) {
                        cmds.problem(given.get(0), "arbitrary waveforms need all of "
                                + String.join(", ", DriverKind.ARBITRARY_OPERATIONS) + "; this driver gives only "
                                + String.join(", ", given));
                    }
                }
            }
            if (kind == DriverKind.DIGITIZER) {
                // the instrument's list of ranges, when it can tell it, stands for its limits
                optional.add("range_list_query");
                if (cmds != null && cmds.has("range_list_query")) {
                    optional.add("range_min_query");
                    optional.add("range_max_query");
                }
            }
            if (cmds != null) {
                for (Map.Entry<String, Set<String>> op : kind.operations().entrySet()) {
                    String text = cmds.text(op.getKey(), !optional.contains(op.getKey()));
                    if (text != null) {
                        try {
                            CommandTemplate t = CommandTemplate.parse(text, op.getValue());
                            commands.put(op.getKey(), t);
                            if (op.getValue().contains("channel") && !t.placeholders().contains("channel")) {
                                cmds.problem(op.getKey(), "'" + text + "' has no {channel}: " + op.getKey() + " is"
                                        + " each channel's own, and this command would send the same for both");
                            }
                            if (!text.startsWith(":") && !text.startsWith("*")) {
                                cmds.problem(op.getKey(), "must start with ':' or '*' (an absolute header), because"
                                        + " lrbench joins commands into one message with ';'");
                            }
                        } catch (IllegalArgumentException e) {
                            cmds.problem(op.getKey(), e.getMessage());
                        }
                    }
                }
            }
            for (Map.Entry<String, List<String>> table : kind.wordTables().entrySet()) {
                words.put(table.getKey(), readWords(root, table.getKey(), table.getValue(),
                        optionalWords(kind, table.getKey(), commands)));
            }
            for (String other : List.of("shapes", "couplings", "trigger_sources", "slopes")) {
                if (!kind.wordTables().containsKey(other) && root.has(other)) {
                    root.problem(other, "not used by a " + kind.key() + " driver");
                }
            }
        }
        if (errorQuery != null) {
            try {
                CommandTemplate.parse(errorQuery, Set.of());
                if (!errorQuery.startsWith(":") || !errorQuery.endsWith("?")) {
                    root.problem("error_query", "must be an absolute query such as :SYSTem:ERRor?");
                }
            } catch (IllegalArgumentException e) {
                root.problem("error_query", e.getMessage());
            }
        }
        // a source's declared settling after a frequency change, from its datasheet (0 when not declared)
        Double frequencySettle = root.quantity("frequency_settle", Dimension.TIME, false);
        if (frequencySettle != null && (frequencySettle < 0 || frequencySettle > 10)) {
            root.problem("frequency_settle", "must be 0 s to 10 s");
        } else if (frequencySettle != null && kind != DriverKind.SOURCE) {
            root.problem("frequency_settle", "only source drivers settle after a frequency change");
        }
        // a source's arbitrary waveform: an ASCII list (default) or a definite block of 16-bit words
        String arbitraryEncoding = root.text("arbitrary_encoding", false);
        if (arbitraryEncoding != null && kind != DriverKind.SOURCE) {
            root.problem("arbitrary_encoding", "only source drivers load arbitrary waveforms");
        } else if (arbitraryEncoding != null && !DriverFile.ARBITRARY_ENCODINGS.contains(arbitraryEncoding)) {
            root.problem("arbitrary_encoding", "'" + arbitraryEncoding + "' is not an arbitrary-waveform encoding; allowed: "
                    + String.join(", ", DriverFile.ARBITRARY_ENCODINGS));
        }
        // the slowest a block's bytes may arrive (bytes per second) before the reply counts as lost
        Double rate = root.quantity("minimum_transfer_rate", Dimension.NONE, false);
        if (rate != null && !(rate >= 10 && rate <= 1e10)) {
            root.problem("minimum_transfer_rate", "must be 10 to 1e10 bytes per second, such as 1000");
        }
        problems.throwIfAny();
        Duration timeout = Duration.ofMillis(Math.round((timeoutSeconds == null ? 5.0 : timeoutSeconds) * 1000));
        return new DriverFile(name, file.toString(), kind, description == null ? "" : description, identity, timeout,
                errorQuery == null ? ":SYSTem:ERRor?" : errorQuery, Map.copyOf(commands), Map.copyOf(words), encoding, traits,
                levelPerEmf, limits, frequencySettle == null ? 0 : frequencySettle,
                arbitraryEncoding == null ? "ascii" : arbitraryEncoding,
                rate == null ? org.lrbench.scpi.ScpiSession.DEFAULT_MINIMUM_RATE : rate);
    }

    /**
     * {@code limits}: for a source {@code frequency: [LOW, HIGH]}, {@code amplitude} (the highest
     * peak open-circuit EMF) and {@code arbitrary_samples} (the longest arbitrary waveform); for a digitizer {@code interval} (the shortest sample interval) and
     * {@code record_length} (the longest record).
     */
    private static InstrumentLimits limits(YamlMap root, DriverKind kind) {
        if (!root.has("limits")) {
            return InstrumentLimits.NONE;
        }
        if (kind == DriverKind.SOURCE) {
            YamlMap m = root.map("limits", false, "frequency", "amplitude", "arbitrary_samples");
            if (m == null) {
                return InstrumentLimits.NONE;
            }
            Double low = null;
            Double high = null;
            if (m.has("frequency")) {
                List<YamlMap.Item> f = m.list("frequency", false);
                if (f.size() != 2) {
                    m.problem("frequency", "give [lowest, highest], such as [1 mHz, 20 MHz]");
                } else {
                    low = m.asQuantity(f.get(0), Dimension.FREQUENCY);
                    high = m.asQuantity(f.get(1), Dimension.FREQUENCY);
                    if (low != null && high != null && !(low >= 0 && high > low)) {
                        m.problem("frequency", "the lowest must be below the highest");
                    }
                }
            }
            Double amplitude = m.quantity("amplitude", Dimension.VOLTAGE, false);
            if (amplitude != null && !(amplitude > 0)) {
                m.problem("amplitude", "must be positive");
            }
            Integer arbitrary = m.integer("arbitrary_samples", false, 16, 1 << 26);
            return new InstrumentLimits(low, high, amplitude, null, null, arbitrary);
        }
        if (kind == DriverKind.DIGITIZER) {
            YamlMap m = root.map("limits", false, "interval", "record_length");
            if (m == null) {
                return InstrumentLimits.NONE;
            }
            Double interval = m.quantity("interval", Dimension.TIME, false);
            if (interval != null && !(interval > 0)) {
                m.problem("interval", "must be positive");
            }
            Integer length = m.integer("record_length", false, 16, Integer.MAX_VALUE);
            return new InstrumentLimits(null, null, null, interval, length, null);
        }
        root.problem("limits", "only source and digitizer drivers declare limits");
        return InstrumentLimits.NONE;
    }

    /**
     * A source's {@code levels}: {@code referred_to: open_circuit} (the default: amplitude and
     * offset settings are the EMF, as after telling the instrument its load is high impedance) or
     * {@code referred_to: load} with the {@code load} the instrument assumes and its
     * {@code output_impedance}: the settings are then the voltage across that load,
     * EMF x load / (load + output impedance).
     */
    private static double levels(YamlMap root) {
        YamlMap m = root.map("levels", false, "referred_to", "load", "output_impedance");
        if (m == null) {
            return 1;
        }
        Boolean load = m.choice("referred_to", true, Map.of("open_circuit", false, "load", true));
        Double ohm = m.quantity("load", Dimension.RESISTANCE, Boolean.TRUE.equals(load));
        Double out = m.quantity("output_impedance", Dimension.RESISTANCE, Boolean.TRUE.equals(load));
        if (!Boolean.TRUE.equals(load)) {
            if (ohm != null || out != null) {
                m.problem(ohm != null ? "load" : "output_impedance", "only levels referred to a load have this");
            }
            return 1;
        }
        if (ohm == null || out == null) {
            return 1;
        }
        if (!(ohm > 0) || out < 0) {
            m.problem(!(ohm > 0) ? "load" : "output_impedance", "must be positive");
            return 1;
        }
        return ohm / (ohm + out);
    }

    private static Map<String, Pattern> readIdentity(YamlMap root) {
        Map<String, Pattern> identity = new LinkedHashMap<>();
        YamlMap id = root.map("identity", false, IDN_FIELDS.toArray(String[]::new));
        if (id != null) {
            for (String field : IDN_FIELDS) {
                String regex = id.text(field, false);
                if (regex != null) {
                    try {
                        identity.put(field, Pattern.compile(regex));
                    } catch (PatternSyntaxException e) {
                        id.problem(field, "not a regular expression: " + e.getDescription());
                    }
                }
            }
        }
        return identity;
    }

    /**
     * Which words of a table a driver may leave out: a digitizer's trigger words when its trigger command
     * does not use them (no trigger command: none are used), and any trigger source but one of channel 1
     * and immediate (lrbench triggers on channel 1, else runs free); every other table is whole.
     * Returns null when the whole table may be left out.
     */
    private static Set<String> optionalWords(DriverKind kind, String table, Map<String, CommandTemplate> commands) {
        if (kind != DriverKind.DIGITIZER || !table.equals("trigger_sources") && !table.equals("slopes")) {
            return Set.of();
        }
        CommandTemplate trigger = commands.get("trigger");
        String placeholder = table.equals("slopes") ? "slope" : "source";
        if (trigger == null || !trigger.placeholders().contains(placeholder)) {
            return null;
        }
        return table.equals("slopes") ? Set.of() : Set.of("channel2", "external");
    }

    private static Map<String, String> readWords(YamlMap root, String table, List<String> logical, Set<String> optional) {
        Map<String, String> out = new LinkedHashMap<>();
        YamlMap m = root.map(table, optional != null, logical.toArray(String[]::new));
        if (m == null) {
            return out;
        }
        if (optional == null) {
            root.problem(table, "not used: this driver's trigger command has no {" + (table.equals("slopes") ? "slope"
                    : "source") + "}");
            return out;
        }
        if (table.equals("trigger_sources") && !m.has("channel1") && !m.has("immediate")) {
            root.problem(table, "give channel1 or immediate (or both): lrbench triggers on channel 1, else runs free");
        }
        for (String word : logical) {
            String scpi = m.text(word, !optional.contains(word) && !table.equals("trigger_sources"));
            if (scpi != null) {
                if (MNEMONIC.matcher(scpi).matches()) {
                    out.put(word, scpi);
                } else {
                    m.problem(word, "'" + scpi + "' is not a SCPI mnemonic (a letter, then letters and digits)");
                }
            }
        }
        return out;
    }
}
