package org.lrbench.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.lrbench.results.Attempt;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.LotRecord;
import org.lrbench.store.LotStatistics;
import org.lrbench.store.ResultStore;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** Reading the results store: {@code lots}, {@code lot LOT}, {@code history PART}, each optionally as CSV. */
final class StoreCommands {

    private StoreCommands() {
    }

    /** Options every store query takes. */
    static class StoreOptions {
        @picocli.CommandLine.Mixin
        StoreLocation location;

        @Option(names = "--csv", paramLabel = "FILE", description = "also write the rows to this CSV file")
        Path csv;

        ResultStore open() {
            // queries only read
            return location.openForReading();
        }

        void print(List<String> header, List<List<String>> rows) throws IOException {
            print(header, rows, Map.of());
        }

        /**
         * Prints a table and, with --csv, writes the rows. Columns named in {@code units} hold SI
         * base-unit numbers: the table shows them with a prefix and four figures (as every command
         * prints them), the CSV keeps them at full precision for other programs.
         */
        void print(List<String> header, List<List<String>> raw, Map<String, Dimension> units)
                throws IOException {
            List<List<String>> rows = new ArrayList<>();
            for (List<String> r : raw) {
                List<String> shown = new ArrayList<>();
                for (int i = 0; i < r.size(); i++) {
                    var d = units.get(header.get(i));
                    String v = r.get(i);
                    shown.add(d == null || v.isEmpty() ? v : Units.format(Double.parseDouble(v), d));
                }
                rows.add(shown);
            }
            int[] w = new int[header.size()];
            for (int i = 0; i < w.length; i++) {
                w[i] = header.get(i).length();
                for (List<String> r : rows) {
                    w[i] = Math.max(w[i], r.get(i).length());
                }
            }
            StringBuilder fmt = new StringBuilder();
            for (int x : w) {
                fmt.append("%-").append(x).append("s  ");
            }
            String f = fmt.toString().stripTrailing() + "%n";
            System.out.printf(f, header.toArray());
            for (List<String> r : rows) {
                System.out.printf(f, r.toArray());
            }
            if (csv != null) {
                StringBuilder sb = new StringBuilder(String.join(",", header.stream().map(StoreCommands::csv).toList())).append('\n');
                for (List<String> r : raw) {
                    sb.append(String.join(",", r.stream().map(StoreCommands::csv).toList())).append('\n');
                }
                ResultFiles.writeAtomically(csv, sb.toString().getBytes(StandardCharsets.UTF_8));
                System.out.println("written: " + csv);
            }
        }
    }

    static String csv(String v) {
        return v.contains(",") || v.contains("\"") || v.contains("\n") ? "\"" + v.replace("\"", "\"\"") + "\"" : v;
    }

    static String num(Double v, String fmt) {
        return v == null ? "" : String.format(Locale.ROOT, fmt, v);
    }

    /** A number at full precision (the table formats it with a prefix; the CSV keeps it). */
    static String full(Double v) {
        return v == null || !Double.isFinite(v) ? "" : Double.toString(v);
    }

    @Command(name = "lots", mixinStandardHelpOptions = true, description = "List every inspection of every lot in the results store, with its counts.")
    static final class Lots extends StoreOptions implements Callable<Integer> {
        @Override
        public Integer call() throws Exception {
            try (ResultStore s = open()) {
                List<List<String>> rows = new ArrayList<>();
                for (LotRecord l : s.lots()) {
                    rows.add(List.of(l.lot(), String.valueOf(l.round()), l.partNumber(), l.createdAt(),
                            String.valueOf(l.lotSize()), String.valueOf(l.sampleSize()), String.valueOf(l.measured()),
                            String.valueOf(l.passed()), String.valueOf(l.failed()), String.valueOf(l.errors()),
                            String.valueOf(l.skipped()), String.valueOf(l.attempts()),
                            l.disposition() == null ? "open" : l.disposition().word(),
                            l.severity() == null ? "normal" : l.severity(), l.supplier() == null ? "" : l.supplier(),
                            l.simulated() ? "simulated" : "real"));
                }
                print(List.of("lot", "inspection", "part_number", "started", "lot_size", "sample", "measured", "pass",
                        "fail", "error", "skipped", "attempts", "disposition", "severity", "supplier", "bench_kind"), rows);
            }
            return ExitCodes.PASS;
        }
    }

    @Command(name = "lot", mixinStandardHelpOptions = true, description = "Every attempt of a lot's parts from the results store, and which one counts.")
    static final class Lot extends StoreOptions implements Callable<Integer> {
        @Parameters(index = "0", paramLabel = "LOT")
        String lot;

        @Override
        public Integer call() throws Exception {
            try (ResultStore s = open()) {
                List<List<String>> rows = new ArrayList<>();
                List<Attempt> all = s.attempts(lot);
                for (var inspection : s.lot(lot)) {
                    var counting = Attempt.counting(all.stream().filter(a -> a.round() == inspection.round()).toList());
                    for (Attempt p : all) {
                        if (p.round() != inspection.round()) {
                            continue;
                        }
                        rows.add(List.of(String.valueOf(p.round()), String.valueOf(p.position()), p.serial(),
                                String.valueOf(p.number()), counting.contains(p) ? "yes" : "no", p.verdict().word(),
                                full(p.inductanceH()), full(p.seriesResistanceOhm()), p.measuredAt(),
                                p.operator() == null ? "-" : p.operator(), p.reason() == null ? "" : p.reason()));
                    }
                }
                if (rows.isEmpty()) {
                    throw new BadInputException("lot " + lot + " has no stored parts");
                }
                print(List.of("inspection", "position", "serial", "attempt", "counts", "verdict", "inductance_h",
                        "series_resistance_ohm", "measured_at", "operator", "reason"), rows, Map.of(
                        "inductance_h", Dimension.INDUCTANCE,
                        "series_resistance_ohm", Dimension.RESISTANCE));
            }
            return ExitCodes.PASS;
        }
    }

    @Command(name = "history", mixinStandardHelpOptions = true, description = "A part number's lots over time: yield, mean and spread of L and R.")
    static final class History extends StoreOptions implements Callable<Integer> {
        @Parameters(index = "0", paramLabel = "PART_NUMBER")
        String partNumber;

        @picocli.CommandLine.Option(names = "--simulated", description = "the lots measured on the simulated bench"
                + " (default: real lots only; the two are never mixed)")
        boolean simulated;

        @Override
        public Integer call() throws Exception {
            try (ResultStore s = open()) {
                List<List<String>> rows = new ArrayList<>();
                for (LotStatistics l : s.history(partNumber, simulated)) {
                    rows.add(List.of(l.lot(), String.valueOf(l.round()), l.createdAt(), l.disposition() == null ? "open" : l.disposition().word(),
                            String.valueOf(l.measured()), num(Double.isNaN(l.yield()) ? null : 100 * l.yield(), "%.1f"),
                            full(l.meanInductanceH()), full(l.sdInductanceH()),
                            full(l.meanResistanceOhm()), full(l.sdResistanceOhm())));
                }
                if (rows.isEmpty()) {
                    throw new BadInputException("no " + (simulated ? "simulated" : "real") + " lots of part number "
                            + partNumber + " in the store" + (simulated ? "" : " (--simulated lists the simulated bench's)"));
                }
                print(List.of("lot", "inspection", "started", "disposition", "measured", "yield_percent", "mean_inductance_h",
                        "sd_inductance_h", "mean_series_resistance_ohm", "sd_series_resistance_ohm"), rows, Map.of(
                        "mean_inductance_h", Dimension.INDUCTANCE,
                        "sd_inductance_h", Dimension.INDUCTANCE,
                        "mean_series_resistance_ohm", Dimension.RESISTANCE,
                        "sd_series_resistance_ohm", Dimension.RESISTANCE));
            }
            return ExitCodes.PASS;
        }
    }
}
