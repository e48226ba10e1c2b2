package org.lrbench.plan;

import java.nio.file.Files;
import java.nio.file.Path;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;

/**
 * Where a key of a plan file stands, for a problem found later in a value derived from it (a generated
 * sweep frequency, say): "file:line:column: key", or the file and key alone when the file cannot be read
 * again.
 */
public final class PlanPositions {

    private PlanPositions() {
    }

    /** The position of a key by its path, such as {@code sine_sweep.log_sweep.stop}; the first of several that exists. */
    public static String of(String source, String... keyPaths) {
        for (String keyPath : keyPaths) {
            String at = find(source, keyPath);
            if (at != null) {
                return at;
            }
        }
        return source + ": " + keyPaths[0];
    }

    private static String find(String source, String keyPath) {
        try {
            Path file = Path.of(source);
            if (!Files.isRegularFile(file)) {
                return null;
            }
            YamlMap m = YamlFile.read(file, new Problems(source), YamlMapKeys.ANY);
            String[] parts = keyPath.split("\\.");
            for (int i = 0; i < parts.length - 1; i++) {
                if (m == null || !m.has(parts[i])) {
                    return null;
                }
                m = m.map(parts[i], false, YamlMapKeys.ANY);
            }
            if (m == null || !m.has(parts[parts.length - 1])) {
                return null;
            }
            var mark = m.value(parts[parts.length - 1], false).orElseThrow().getStartMark();
            return source + ":" + (mark.getLine() + 1) + ":" + (mark.getColumn() + 1) + ": " + keyPath;
        } catch (Exception e) {
            return null;
        }
    }

    /** Every key allowed: positions are looked up in a file already validated. */
    private static final class YamlMapKeys {
        static final String[] ANY = {"plan_format", "part_number", "description", "fixture", "sine_sweep",
            "triangle_check", "sampling", "dc_resistance", "limits", "supplier", "amplitude", "offset", "frequencies",
            "log_sweep", "cycles", "samples_per_cycle", "settle", "settle_rule", "model_terms", "excitation", "start",
            "stop", "points", "frequency", "harmonics", "sense_resistor", "wiring", "probes"};
    }
}
