package org.lrbench.sim;

import java.nio.file.Path;
import org.lrbench.units.Dimension;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;

/**
 * Reads a simulated part file: {@code inductance}, {@code series_resistance} (at DC), optional
 * {@code parallel_capacitance}, {@code wire_diameter} (copper, for skin effect) and
 * {@code parallel_resistance} (core loss).
 */
public final class PartFile {
    static final String[] KEYS = {"description", "inductance", "series_resistance", "parallel_capacitance",
        "wire_diameter", "parallel_resistance"};

    private PartFile() {
    }

    public static PartModel load(Path file) throws ProblemsException {
        Problems problems = new Problems(file.toString());
        PartModel part = read(YamlFile.read(file, problems, KEYS));
        problems.throwIfAny();
        return part;
    }

    /**
     * Reads the part keys from a mapping (a part file, or one entry of a simulated lot); problems go
     * to the mapping's collector and the result is null when any value is unusable.
     */
    public static PartModel read(YamlMap m) {
        Double l = m.quantity("inductance", Dimension.INDUCTANCE, true);
        Double r = m.quantity("series_resistance", Dimension.RESISTANCE, true);
        Double c = m.quantity("parallel_capacitance", Dimension.CAPACITANCE, false);
        Double d = m.quantity("wire_diameter", Dimension.LENGTH, false);
        Double rp = m.quantity("parallel_resistance", Dimension.RESISTANCE, false);
        m.text("description", false);
        if (l != null && !(l > 0)) {
            m.problem("inductance", "must be greater than 0 H");
        }
        if (r != null && r < 0) {
            m.problem("series_resistance", "must not be negative");
        }
        if (c != null && c < 0) {
            m.problem("parallel_capacitance", "must not be negative");
        }
        if (d != null && !(d > 0)) {
            m.problem("wire_diameter", "must be greater than 0 m");
        }
        if (rp != null && !(rp > 0)) {
            m.problem("parallel_resistance", "must be greater than 0 ohm");
        }
        if (l == null || r == null || !(l > 0) || r < 0 || (c != null && c < 0) || (d != null && !(d > 0))
                || (rp != null && !(rp > 0))) {
            return null;
        }
        return new PartModel(l, r, c == null ? 0.0 : c, d == null ? 0.0 : d, rp == null ? 0.0 : rp);
    }
}
