package org.lrbench.sampling;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.lrbench.units.Dimension;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;
import org.yaml.snakeyaml.nodes.Node;

/**
 * Reads the lab's transcription of Table II-B or II-C from {@code tightened.yaml} or
 * {@code reduced.yaml} in a sampling folder:
 *
 * <pre>
 * table_format: 1
 * severity: tightened
 * source: ISO 2859-1:1999 Table II-B, copy 3, transcribed by ... and checked by ...
 * sample_sizes: {A: 2, B: 3, C: 5, ...}
 * columns:
 *   - aql: 1.0
 *     cells: [down, down, down, down, 0/1, up, ...]   # one per letter, in sample_sizes order
 * </pre>
 *
 * Every problem is positioned. The structure is checked as far as the standard's tables share it:
 * letters in the standard's order, sample sizes never falling, every arrow reaching a plan, Re above
 * Ac, and acceptance numbers never falling down a column.
 */
public final class SeverityTableLoader {
    /** The code letters the standard's tables can have, in order (S: tightened inspection only). */
    static final String ALL_LETTERS = "ABCDEFGHJKLMNPQRS";
    private static final Pattern PLAN = Pattern.compile("(\\d+)\\s*/\\s*(\\d+)");

    private SeverityTableLoader() {
    }

    /** The file name of a severity's table in a sampling folder. */
    public static String fileName(Severity s) {
        return s.word() + ".yaml";
    }

    /** The table for a severity from a folder, or empty when the folder has no file for it. */
    public static Optional<SeverityTable> find(Path folder, Severity s) throws ProblemsException {
        Path f = folder.resolve(fileName(s));
        if (!Files.isRegularFile(f)) {
            return Optional.empty();
        }
        SeverityTable t = read(f);
        if (t.severity() != s) {
            Problems p = new Problems(f.toString());
            p.add((Node) null, "severity", "the file is named for " + s.word()
                    + " inspection but holds the " + t.severity().word() + " table");
            p.throwIfAny();
        }
        return Optional.of(t);
    }

    public static SeverityTable read(Path file) throws ProblemsException {
        Problems problems = new Problems(file.toString());
        return read(YamlFile.read(file, problems, KEYS), problems);
    }

    private static final String[] KEYS = {"table_format", "severity", "source", "sample_sizes", "columns"};

    /**
     * ISO 2859-1:1999's own Table 2-B (tightened) or Table 2-C (reduced, the 1999 version with Re = Ac + 1),
     * AQL 0.010 to 6.5, shipped with lrbench: used where the lab's sampling folder has no file of its own.
     */
    public static SeverityTable builtIn(Severity s) {
        String name = "iso2859-1-1999-" + s.word() + ".yaml";
        try (var in = SeverityTableLoader.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalArgumentException("no built-in table for " + s.word() + " inspection");
            }
            Problems problems = new Problems(name);
            return read(YamlFile.parse(new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8), problems,
                    KEYS), problems);
        } catch (java.io.IOException | ProblemsException e) {
            throw new IllegalStateException("the built-in " + s.word() + " table cannot be read: " + e.getMessage(), e);
        }
    }

    private static SeverityTable read(YamlMap root, Problems problems) throws ProblemsException {
        root.integer("table_format", true, 1, 1);
        Severity severity = root.choice("severity", true, Map.of("tightened", Severity.TIGHTENED,
                "reduced", Severity.REDUCED));
        String source = root.text("source", true);
        YamlMap sizes = root.map("sample_sizes", true, ALL_LETTERS.chars().mapToObj(c -> String.valueOf((char) c))
                .toArray(String[]::new));
        StringBuilder letters = new StringBuilder();
        List<Integer> n = new ArrayList<>();
        if (sizes != null) {
            for (char c : ALL_LETTERS.toCharArray()) {
                String key = String.valueOf(c);
                if (sizes.has(key)) {
                    Integer v = sizes.integer(key, true, 1, 1_000_000);
                    if (v != null) {
                        if (!n.isEmpty() && v < n.get(n.size() - 1)) {
                            sizes.problem(key, "sample size " + v + " is smaller than letter "
                                    + letters.charAt(letters.length() - 1) + "'s " + n.get(n.size() - 1)
                                    + "; sample sizes never fall from one letter to the next");
                        }
                        letters.append(c);
                        n.add(v);
                    }
                }
            }
            String expected = ALL_LETTERS.substring(0, Math.min(ALL_LETTERS.length(), Math.max(letters.length(), 1)));
            if (letters.length() > 0 && !letters.toString().equals(expected)) {
                root.problem("sample_sizes", "letters " + letters + " leave a gap; the table's rows run " + expected);
            }
        }
        Map<Double, List<SeverityTable.Cell>> columns = new LinkedHashMap<>();
        for (YamlMap.Item item : root.list("columns", true)) {
            YamlMap col = root.asMap(item, "aql", "cells");
            if (col == null) {
                continue;
            }
            Double aql = col.quantity("aql", Dimension.NONE, true);
            if (aql != null) {
                try {
                    SingleSampling.aqlIndex(aql);
                } catch (IllegalArgumentException e) {
                    col.problem("aql", e.getMessage());
                    aql = null;
                }
            }
            List<SeverityTable.Cell> cells = readCells(col, letters.length());
            if (aql != null && cells != null) {
                if (columns.containsKey(aql)) {
                    col.problem("aql", "AQL " + aql + " has a column already");
                } else {
                    columns.put(aql, cells);
                }
            }
        }
        problems.throwIfAny();
        int[] sizesArray = n.stream().mapToInt(Integer::intValue).toArray();
        return new SeverityTable(severity, letters.toString(), sizesArray, Map.copyOf(columns), source);
    }

    private static List<SeverityTable.Cell> readCells(YamlMap col, int rows) {
        List<YamlMap.Item> items = col.list("cells", true);
        if (items.isEmpty()) {
            return null;
        }
        if (rows > 0 && items.size() != rows) {
            col.problem("cells", items.size() + " cells; the table has " + rows + " letters (one cell per letter)");
            return null;
        }
        List<SeverityTable.Cell> out = new ArrayList<>();
        int lastAc = -1;
        boolean ok = true;
        for (YamlMap.Item it : items) {
            String text = col.asText(it);
            if (text == null) {
                ok = false;
                continue;
            }
            String t = text.trim().toLowerCase(Locale.ROOT);
            Matcher m = PLAN.matcher(t);
            if (t.equals("none")) {
                // no plan printed in the cell (the standard's dash)
                out.add(SeverityTable.Cell.arrow(SeverityTable.Arrow.EMPTY));
            } else if (t.equals("down")) {
                out.add(SeverityTable.Cell.arrow(SeverityTable.Arrow.DOWN));
            } else if (t.equals("up")) {
                out.add(SeverityTable.Cell.arrow(SeverityTable.Arrow.UP));
            } else if (m.matches()) {
                int ac = Integer.parseInt(m.group(1));
                int re = Integer.parseInt(m.group(2));
                if (re <= ac) {
                    col.problem(it, "'" + text + "': Re must be larger than Ac");
                    ok = false;
                } else if (ac < lastAc) {
                    col.problem(it, "'" + text + "': Ac " + ac + " is below the " + lastAc + " above it; acceptance numbers"
                            + " never fall down a column");
                    ok = false;
                }
                lastAc = Math.max(lastAc, ac);
                out.add(SeverityTable.Cell.plan(ac, re));
            } else {
                col.problem(it, "'" + text + "' is not a cell; allowed: Ac/Re (e.g. 1/2), down, up, none");
                ok = false;
            }
        }
        if (!ok) {
            return null;
        }
        for (int i = 0; i < out.size(); i++) {
            SeverityTable.Arrow a = out.get(i).arrow();
            if (a == SeverityTable.Arrow.NONE || a == SeverityTable.Arrow.EMPTY) {
                continue;
            }
            int step = a == SeverityTable.Arrow.DOWN ? 1 : -1;
            int r = i;
            while (r >= 0 && r < out.size() && out.get(r).arrow() != SeverityTable.Arrow.NONE) {
                r += step;
            }
            if (r < 0 || r >= out.size()) {
                col.problem(items.get(i), "the arrow '" + a.name().toLowerCase(Locale.ROOT) + "' reaches no plan in this column");
                return null;
            }
        }
        return List.copyOf(out);
    }
}
