package org.lrbench.cli;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.lrbench.report.LotReport;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench report --lot LOT}: one self-contained HTML file from the results store. */
@Command(name = "report", description = "Write a lot's report: one HTML file with its plots embedded, readable offline.")
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
                throw new BadInputException("no lot " + lot + " in " + data.resolve("lrbench.db"));
            }
            html = LotReport.html(s, lot);
        }
        Path file = out != null ? out : Path.of("runs", lot, "report.html");
        ResultFiles.writeAtomically(file, html.getBytes(StandardCharsets.UTF_8));
        System.out.println("report: " + file);
        return ExitCodes.PASS;
    }
}
