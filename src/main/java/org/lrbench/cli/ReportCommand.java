package org.lrbench.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.report.LotReport;
import org.lrbench.results.Attempt;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench report --lot LOT}: one self-contained HTML file from the results store. */
@Command(name = "report", mixinStandardHelpOptions = true, description = "Write a lot's report: one HTML file with its plots embedded, readable offline.")
final class ReportCommand extends StoreCommands.StoreOptions implements Callable<Integer> {

    @Option(names = "--lot", required = true, paramLabel = "LOT", description = "the lot")
    String lot;

    @Option(names = "--out", paramLabel = "FILE", description = "the HTML file (default: runs/LOT/report.html)")
    Path out;

    @Override
    public Integer call() throws Exception {
        Inputs.name("--lot", lot);
        String html;
        try (ResultStore s = open()) {
            if (s.lot(lot).isEmpty()) {
                throw new BadInputException("no lot " + lot + " in " + (location.url != null ? location.url : location.file()));
            }
            html = LotReport.html(s, lot);
            if (csv != null) {
                writeCsv(s);
            }
        }
        Path file = out != null ? out : Path.of("runs", lot, "report.html");
        ResultFiles.writeAtomically(file, html.getBytes(StandardCharsets.UTF_8));
        System.out.println("report: " + file);
        return ExitCodes.PASS;
    }

    /**
     * Every attempt of every part with every limit: value, expanded uncertainty, zone, pass and the
     * part's verdict, one row per attempt and limit (numbers in SI base units, full precision).
     */
    private void writeCsv(ResultStore s) throws IOException {
        StringBuilder sb = new StringBuilder("lot,inspection,position,serial,attempt,counts,verdict,limit,value,"
                + "expanded_uncertainty,zone,pass\n");
        var all = s.attempts(lot);
        for (var i : s.lot(lot)) {
            var round = all.stream().filter(a -> a.round() == i.round()).toList();
            var counting = Attempt.counting(round);
            for (var a : round) {
                var limits = ResultFiles.JSON.readTree(a.resultJson()).path("limits");
                if (limits.isEmpty()) {
                    sb.append(row(a, counting.contains(a), "", "", "", "", "")).append('\n');
                }
                for (var l : limits) {
                    sb.append(row(a, counting.contains(a), l.path("name").asText(), l.path("value").asText(""),
                            l.path("expanded_uncertainty").asText(""), l.path("zone").asText(""),
                            l.path("pass").asText(""))).append('\n');
                }
            }
        }
        ResultFiles.writeAtomically(csv, sb.toString().getBytes(StandardCharsets.UTF_8));
        System.out.println("written: " + csv);
    }

    private static String row(Attempt a, boolean counts, String limit, String value, String u,
                              String zone, String pass) {
        return String.join(",", List.of(a.lot(), String.valueOf(a.round()), String.valueOf(a.position()),
                a.serial(), String.valueOf(a.number()), String.valueOf(counts), a.verdict().word(), StoreCommands.csv(limit),
                value, u, zone, pass));
    }
}
