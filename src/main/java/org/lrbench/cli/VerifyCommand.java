package org.lrbench.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.records.AnchorFile;
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

    @Option(names = "--files-of", paramLabel = "BENCH", description = "where each bench keeps its own runs folder:"
            + " the result files and archives checked in --runs are those of lots measured on these benches (repeat for"
            + " several), and of any other lot whose folder is there; every lot's chain in the store is checked")
    List<String> filesOf;

    @Option(names = "--anchor", paramLabel = "FILE", description = "an anchor file written by lrbench anchor: every"
            + " lot in it must still hold every link it had then")
    Path anchor;

    @Option(names = "--anchor-sha256", paramLabel = "HEX", description = "the anchor's closing sha256 as kept outside"
            + " the store: the anchor file must be the one it closes")
    String anchorSha256;

    /** Whether the lot's files are to be found in this runs folder: no --files-of, its bench named, or its folder here. */
    private boolean filesHere(ResultStore s, String l) {
        if (filesOf == null || java.nio.file.Files.isDirectory(runsOption.runs.resolve(l))) {
            return true;
        }
        return s.latestInspection(l).map(i -> filesOf.contains(i.terms().bench())).orElse(true);
    }

    @Override
    public Integer call() {
        List<String> findings = new ArrayList<>();
        int lots = 0;
        AnchorFile.Anchor anchored = null;
        if (anchorSha256 != null && anchor == null) {
            throw new BadInputException("--anchor-sha256 needs --anchor FILE");
        }
        if (anchor != null) {
            try {
                anchored = AnchorFile.read(anchor);
            } catch (java.io.IOException e) {
                throw new BadInputException("--anchor " + e.getMessage());
            }
            if (anchorSha256 != null && !anchored.sha256Line().equals("sha256: " + anchorSha256.trim().toLowerCase(
                    java.util.Locale.ROOT).replaceFirst("^sha256: ", ""))) {
                findings.add("anchor: " + anchor + " is not the anchor whose closing line was kept (" + anchored.sha256Line()
                        + ", kept sha256: " + anchorSha256.trim() + ")");
            }
        }
        try (ResultStore s = store.open()) {
            if (anchored != null) {
                findings.addAll(s.anchorFindings(lot == null ? anchored.lots()
                        : anchored.lots().stream().filter(a -> a.lot().equals(lot)).toList()));
            }
            boolean single = lot != null && s.singleParts().stream().anyMatch(r -> r.lot().equals(lot));
            // read once: the loop below asks of every lot whether the store has it
            List<String> all = s.lotNames();
            java.util.Set<String> stored = new java.util.HashSet<>(all);
            List<String> names = lot != null ? List.of(Inputs.name("--lot", lot)) : all;
            if (lot != null && !stored.contains(lot) && !single) {
                throw new BadInputException("--lot " + lot + ": no such lot in the store");
            }
            if (filesOf != null) {
                for (String b : filesOf) {
                    Inputs.name("--files-of", b);
                }
            }
            if (lot == null) {
                findings.addAll(s.decisionFindings());
                findings.addAll(RecordCheck.checkFileFindings(s, runsOption.runs,
                        filesOf == null ? null : java.util.Set.copyOf(filesOf)));
            }
            findings.addAll(RecordCheck.singlePartFindings(s, runsOption.runs, lot,
                    filesOf == null ? null : java.util.Set.copyOf(filesOf)));
            for (String l : names) {
                lots++;
                if (!stored.contains(l)) {
                    findings.addAll(RecordCheck.lotFolderFindings(s, runsOption.runs, l));
                    continue; // a lot of single parts only: their records were checked above
                }
                if (!filesHere(s, l)) {
                    findings.addAll(s.chainFindings(l)); // another bench's lot: its files live in its own folder
                    continue;
                }
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
            if (anchored != null) {
                System.out.printf("every lot of the anchor taken %s still holds every link it had then%s%n",
                        anchored.taken(), anchorSha256 == null ? " (the anchor file's own closing line was not given:"
                        + " --anchor-sha256 ties it to the line kept outside the store)" : "");
            } else {
                System.out.println("without an anchor (lrbench anchor, verify --anchor) the chain cannot show that its"
                        + " last links or a whole lot were removed together with their files");
            }
            return ExitCodes.PASS;
        }
        System.out.printf("%d lot(s) checked: %d finding(s)%n", lots, findings.size());
        return ExitCodes.FAIL;
    }
}
