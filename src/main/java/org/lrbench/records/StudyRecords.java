package org.lrbench.records;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.lrbench.results.PartResult;

/**
 * A crossed study's readings taken from the part records of one lot folder, as a lab measures a
 * study on a real bench: every part (serial) measured by every operator the same number of times
 * ({@code run --serial SN --operator NAME}, again with a reason for each further trial). The
 * readings of one limit are arranged by serial, operator and the order of the attempts.
 */
public final class StudyRecords {
    private static final ObjectMapper READ = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .configure(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES, false);

    private StudyRecords() {
    }

    /** The readings y[part][operator][trial], with the parts' serials and the operators' names in that order. */
    public record Layout(List<String> serials, List<String> operators, double[][][] readings) {
    }

    /**
     * @throws IllegalArgumentException when the folder holds no records of the limit, fewer than two
     *         parts or operators, a record in error, or cells with different numbers of trials (named)
     */
    public static Layout read(Path lotFolder, String limit) throws IOException {
        Map<String, Map<String, List<double[]>>> cells = new TreeMap<>();
        List<Path> files;
        try (Stream<Path> s = Files.list(lotFolder)) {
            files = s.filter(p -> p.getFileName().toString().endsWith(".json")
                    && !p.getFileName().toString().equals("lot-summary.json")
                    && !p.getFileName().toString().contains(".analysis-")).sorted().toList();
        }
        for (Path f : files) {
            PartResult r = READ.readValue(f.toFile(), PartResult.class);
            if (r.error() != null) {
                throw new IllegalArgumentException(f + ": a measurement in error cannot enter a study (" + r.error() + ")");
            }
            var reading = r.limits().stream().filter(l -> l.name().equals(limit)).findFirst()
                    .orElseThrow(() -> new IllegalArgumentException(f + ": no reading of limit '" + limit + "'"));
            String operator = r.attempt() == null || r.attempt().operator() == null ? "?" : r.attempt().operator();
            int attempt = r.attempt() == null ? 1 : r.attempt().number();
            cells.computeIfAbsent(r.serial(), k -> new TreeMap<>()).computeIfAbsent(operator, k -> new ArrayList<>())
                    .add(new double[] {attempt, reading.value()});
        }
        if (cells.size() < 2) {
            throw new IllegalArgumentException(lotFolder + ": a crossed study needs at least 2 parts; the records hold "
                    + cells.size());
        }
        List<String> serials = new ArrayList<>(cells.keySet());
        List<String> operators = new ArrayList<>(cells.get(serials.get(0)).keySet());
        if (operators.size() < 2) {
            throw new IllegalArgumentException(lotFolder + ": a crossed study needs at least 2 operators; part "
                    + serials.get(0) + " was measured by " + operators);
        }
        int trials = cells.get(serials.get(0)).get(operators.get(0)).size();
        List<String> counts = new ArrayList<>();
        boolean balanced = true;
        for (String serial : serials) {
            for (Map.Entry<String, List<double[]>> e : cells.get(serial).entrySet()) {
                counts.add(serial + "/" + e.getKey() + " " + e.getValue().size());
                balanced &= e.getValue().size() == trials;
            }
        }
        if (!balanced) {
            throw new IllegalArgumentException("the study is not balanced: trials per part/operator " + String.join(", ", counts)
                    + "; every part needs the same number of trials by every operator");
        }
        double[][][] y = new double[serials.size()][operators.size()][];
        for (int i = 0; i < serials.size(); i++) {
            Map<String, List<double[]>> byOperator = cells.get(serials.get(i));
            if (!byOperator.keySet().equals(new java.util.TreeSet<>(operators))) {
                throw new IllegalArgumentException("part " + serials.get(i) + " was measured by " + byOperator.keySet()
                        + "; every part needs every operator " + operators);
            }
            for (int j = 0; j < operators.size(); j++) {
                List<double[]> t = byOperator.get(operators.get(j));
                if (t.size() != trials) {
                    throw new IllegalArgumentException("part " + serials.get(i) + " has " + t.size() + " trial(s) by "
                            + operators.get(j) + "; every part and operator needs " + trials);
                }
                t.sort((a, b) -> Double.compare(a[0], b[0]));
                y[i][j] = t.stream().mapToDouble(a -> a[1]).toArray();
            }
        }
        return new Layout(serials, operators, y);
    }
}
