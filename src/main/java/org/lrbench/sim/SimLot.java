package org.lrbench.sim;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.lrbench.results.Names;
import org.lrbench.yaml.Problems;
import org.lrbench.yaml.ProblemsException;
import org.lrbench.yaml.YamlFile;
import org.lrbench.yaml.YamlMap;

/**
 * A simulated lot: its lot number, the plan it is inspected with (relative to the lot file), the
 * size of the delivered lot (optional), and the tray of parts it offers for sampling, with their
 * serials and true values.
 */
public record SimLot(String lot, Path plan, Integer lotSize, List<Part> parts) {

    /** One simulated part of the lot. */
    public record Part(String serial, PartModel model) {
    }

    public static SimLot load(Path file) throws ProblemsException {
        Problems problems = new Problems(file.toString());
        YamlMap root = YamlFile.read(file, problems, "lot_format", "lot", "description", "plan", "lot_size", "parts");
        Integer lotSize = root.has("lot_size") ? root.integer("lot_size", true, 2, 100_000_000) : null;
        root.integer("lot_format", true, 1, 1);
        String description = root.text("description", false);
        if (org.lrbench.plan.TextRules.lineProblem("a description", description) != null) {
            root.problem("description", org.lrbench.plan.TextRules.lineProblem("a description", description));
        }
        String lot = root.text("lot", true);
        if (lot != null && !Names.valid(lot)) {
            root.problem("lot", Names.problem("lot", lot));
        }
        String plan = root.text("plan", true);
        List<Part> parts = new ArrayList<>();
        Set<String> serials = new HashSet<>();
        for (YamlMap.Item item : root.list("parts", true)) {
            YamlMap m = root.asMap(item, "serial", "description", "inductance", "series_resistance",
                    "parallel_capacitance", "wire_diameter", "parallel_resistance");
            if (m == null) {
                continue;
            }
            String serial = m.text("serial", true);
            if (serial != null && !Names.valid(serial)) {
                m.problem("serial", Names.problem("serial", serial));
                serial = null;
            }
            PartModel model = PartFile.read(m);
            if (serial != null && !serials.add(serial)) {
                m.problem("serial", "serial '" + serial + "' appears twice in the lot");
            }
            if (serial != null && model != null) {
                parts.add(new Part(serial, model));
            }
        }
        problems.throwIfAny();
        Path dir = file.toAbsolutePath().getParent();
        if (lotSize != null && lotSize < parts.size()) {
            root.problem("lot_size", "the lot cannot be smaller than the " + parts.size() + " parts listed");
            problems.throwIfAny();
        }
        return new SimLot(lot, dir.resolve(plan).normalize(), lotSize, List.copyOf(parts));
    }
}
