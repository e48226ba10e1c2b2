package org.lrbench.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.records.RecordCheck;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench verify}: re-reads the store, the result files and the trace archives and names what is not whole. */
@Command(name = "verify", mixinStandardHelpOptions = true, description = {"Check that a lot's records are as they were written: the store's hash chain,"
        + " every result file and every trace archive.", "Exit codes: 0 every record whole, 1 something altered,"
        + " truncated or missing (each named), 2 bad input."})
final class VerifyCommand implements Callable<Integer> {

    @Mixin
    FolderOptions.Runs runsOption;

    @Mixin
    StoreCommands.StoreOptions store;

    @Option(names = "--lot", paramLabel = "LOT", description = "the lot to check (default: every lot in the store)")
    String lot;

    @Override
    public Integer call() {
        List<String> findings = new ArrayList<>();
        int lots = 0;
        try (ResultStore s = store.open()) {
            List<String> names = lot != null ? List.of(Inputs.name("--lot", lot)) : s.lotNames();
            if (lot != null && !s.lotNames().contains(lot)) {
                throw new BadInputException("--lot " + lot + ": no such lot in the store");
            }
            for (String l : names) {
                lots++;
                findings.addAll(RecordCheck.findings(s, runsOption.runs, l));
                if (lot != null) {
                    findings.addAll(RecordCheck.lotFolderFindings(s, runsOption.runs, l));
                }
            }
            if (lot == null) {
                // the whole runs folder: every lot folder and file must belong to a record
                findings.addAll(RecordCheck.folderFindings(s, runsOption.runs));
            }
        }
        findings.forEach(System.out::println);
        if (findings.isEmpty()) {
            System.out.printf("%d lot(s) checked: every stored record, result file and trace archive is whole, and"
                    + " every file under the lot folders belongs to one%n", lots);
            return ExitCodes.PASS;
        }
        System.out.printf("%d lot(s) checked: %d finding(s)%n", lots, findings.size());
        return ExitCodes.FAIL;
    }
}
