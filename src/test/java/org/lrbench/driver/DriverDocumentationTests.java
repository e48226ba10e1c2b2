package org.lrbench.driver;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.yaml.Problem;
import org.lrbench.yaml.ProblemsException;

/**
 * DEVELOPERS.md and the driver loader agree key by key: the table of a digitizer driver's optional
 * sections (vertical, scaling, timebase, acquisition) names exactly the keys the loader accepts in each
 * section, and every word a row lists as a value of a choice is one the loader accepts, and no other. A
 * test engineer writing a driver from the documentation alone meets no key the loader refuses and no
 * key it takes in silence. The loader's own lists are read from its answers to an unknown key or value.
 */
class DriverDocumentationTests {
    private static final List<String> SECTIONS = List.of("vertical", "scaling", "timebase", "acquisition");

    @TempDir
    Path dir;

    /** Section to key to the words of its values column (backticked), as the documentation's table gives them. */
    static Map<String, Map<String, List<String>>> documented() throws Exception {
        String doc = Files.readString(TestBench.home().resolve("DEVELOPERS.md"));
        int start = doc.indexOf("| section | key | values | meaning |");
        assertThat(start).as("DEVELOPERS.md has the optional sections' table").isPositive();
        Map<String, Map<String, List<String>>> out = new LinkedHashMap<>();
        String section = null;
        for (String line : doc.substring(start).split("\n")) {
            String row = line.trim();
            if (!row.startsWith("|")) {
                break;
            }
            String[] cells = row.split("\\|", -1);
            if (cells.length < 5 || cells[1].contains("section") || cells[1].contains("---")) {
                continue;
            }
            if (!cells[1].isBlank()) {
                section = words(cells[1]).get(0);
            }
            for (String key : words(cells[2])) {
                out.computeIfAbsent(section, s -> new LinkedHashMap<>()).put(key, words(cells[3]));
            }
        }
        return out;
    }

    private static List<String> words(String cell) {
        List<String> out = new ArrayList<>();
        Matcher m = Pattern.compile("`([a-z_0-9]+)`").matcher(cell);
        while (m.find()) {
            out.add(m.group(1));
        }
        return out;
    }

    /** The problems the loader finds in the generic digitizer's driver with {@code extra} appended. */
    private List<Problem> problemsWith(String extra) throws Exception {
        String base = Files.readString(TestBench.home().resolve("drivers/generic-digitizer.yaml"));
        // the section the extra text declares replaces the driver's own (a key declared twice is another problem)
        String section = extra.substring(0, extra.indexOf(':'));
        base = base.replaceAll("(?m)^" + java.util.regex.Pattern.quote(section) + ":\\n(  .*\\n)*", "");
        Files.writeString(dir.resolve("probe.yaml"), base + "\n" + extra + "\n");
        try {
            new DriverLoader(dir).load("probe", DriverKind.DIGITIZER);
            return List.of();
        } catch (ProblemsException e) {
            return e.problems();
        }
    }

    /** The list after "allowed here: " or "allowed: " in the first problem that has one. */
    private static TreeSet<String> allowed(List<Problem> problems) {
        for (Problem p : problems) {
            Matcher m = Pattern.compile("allowed(?: here)?: (.+)$").matcher(p.message());
            if (m.find()) {
                return new TreeSet<>(Arrays.stream(m.group(1).split(",\\s*")).map(String::trim).toList());
            }
        }
        throw new AssertionError("no list of allowed values in " + problems);
    }

    @Test
    void eachSectionsKeysAreTheOnesTheLoaderAccepts() throws Exception {
        Map<String, Map<String, List<String>>> doc = documented();
        assertThat(doc.keySet()).containsExactlyElementsOf(SECTIONS);
        for (String section : SECTIONS) {
            TreeSet<String> loader = allowed(problemsWith(section + ":\n  not_a_key: 1"));
            assertThat(new TreeSet<>(doc.get(section).keySet())).as("keys of %s in DEVELOPERS.md", section)
                    .isEqualTo(loader);
        }
    }

    @Test
    void eachDocumentedChoiceIsTheLoadersList() throws Exception {
        int choices = 0;
        for (Map.Entry<String, Map<String, List<String>>> s : documented().entrySet()) {
            for (Map.Entry<String, List<String>> k : s.getValue().entrySet()) {
                List<Problem> problems = problemsWith(s.getKey() + ":\n  " + k.getKey() + ": not_a_choice");
                boolean isChoice = problems.stream().anyMatch(p -> p.message().contains("is not allowed; allowed:"));
                if (!isChoice) {
                    continue;
                }
                choices++;
                // the documented words (a "preamble"-style old word is named in the meaning, not the values)
                assertThat(new TreeSet<>(k.getValue())).as("values of %s.%s in DEVELOPERS.md", s.getKey(), k.getKey())
                        .isEqualTo(allowed(problems));
            }
        }
        // setting (vertical), source, setting (timebase), complete, rounding
        assertThat(choices).isGreaterThanOrEqualTo(5);
    }

    /**
     * The worked examples: each bullet of "Writing a driver, worked through the simulated personalities"
     * that names a driver file quotes pieces of it as {@code key: value}; every such piece is read as
     * YAML and must be found in that file (a mapping somewhere in it with that key and a value that
     * holds every quoted entry; {@code ...} stands for what is left out).
     */
    @Test
    void theWorkedExamplesQuoteTheDriverFilesTheyName() throws Exception {
        String doc = Files.readString(TestBench.home().resolve("DEVELOPERS.md"));
        int start = doc.indexOf("### Writing a driver, worked through");
        assertThat(start).isPositive();
        int end = doc.indexOf("\n#", start + 10);
        String section = doc.substring(start, end < 0 ? doc.length() : end);
        Matcher bullet = Pattern.compile("(?m)^- `(drivers/[a-z0-9-]+\\.yaml)`(.*(?:\\n  .*)*)").matcher(section);
        int bullets = 0;
        int quoted = 0;
        org.yaml.snakeyaml.Yaml yaml = new org.yaml.snakeyaml.Yaml();
        while (bullet.find()) {
            bullets++;
            Object driver = yaml.load(Files.readString(TestBench.home().resolve(bullet.group(1))));
            String text = bullet.group(2).replaceAll("\\s*\\n\\s*", " ");
            Matcher piece = Pattern.compile("`([a-z_]+: [^`]+)`").matcher(text);
            while (piece.find()) {
                Map<?, ?> example = (Map<?, ?>) yaml.load(piece.group(1));
                for (Map.Entry<?, ?> e : example.entrySet()) {
                    quoted++;
                    assertThat(foundIn(driver, e.getKey(), e.getValue()))
                            .as("DEVELOPERS.md quotes `%s` from %s", piece.group(1), bullet.group(1)).isTrue();
                }
            }
        }
        assertThat(bullets).as("bullets naming a driver file").isGreaterThanOrEqualTo(5);
        assertThat(quoted).as("quoted pieces").isGreaterThanOrEqualTo(10);
    }

    /** Whether some mapping in {@code tree} has {@code key} with a value that holds {@code value}. */
    private static boolean foundIn(Object tree, Object key, Object value) {
        if (tree instanceof Map<?, ?> m) {
            if (m.containsKey(key) && holds(m.get(key), value)) {
                return true;
            }
            return m.values().stream().anyMatch(v -> foundIn(v, key, value));
        }
        if (tree instanceof List<?> l) {
            return l.stream().anyMatch(v -> foundIn(v, key, value));
        }
        return false;
    }

    private static boolean holds(Object actual, Object quoted) {
        if ("...".equals(quoted) || List.of("...").equals(quoted)) {
            return true; // left out in the text
        }
        if (quoted instanceof Map<?, ?> q) {
            return actual instanceof Map<?, ?> a && q.entrySet().stream()
                    .allMatch(e -> a.containsKey(e.getKey()) && holds(a.get(e.getKey()), e.getValue()));
        }
        return String.valueOf(quoted).equals(String.valueOf(actual));
    }
}
