package org.lrbench.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.concurrent.Callable;
import org.lrbench.records.AnchorFile;
import org.lrbench.store.ChainAnchor;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/**
 * {@code lrbench anchor FILE}: every lot's chain length and head now, written to a new file, and the
 * line that closes it printed for the lab to keep outside the store.
 */
@Command(name = "anchor", mixinStandardHelpOptions = true, description = {"Write every lot's hash chain length and head"
        + " to a new anchor file and print its closing line.", "Keep the line outside the store (the bench log, a"
        + " signed-off sheet, a message): verify --anchor FILE --anchor-sha256 HEX then proves the store still holds"
        + " every link it had, which the chain alone cannot prove of its own last links.",
        "Exit codes: 0 written, 2 bad input (the file exists: an anchor is never replaced)."})
final class AnchorCommand implements Callable<Integer> {

    @Mixin
    StoreCommands.StoreOptions store;

    @Parameters(index = "0", paramLabel = "FILE", description = "the anchor file to write (must not exist)")
    Path file;

    @Override
    public Integer call() {
        try (ResultStore s = store.open()) {
            var lots = s.chainAnchors();
            String closing;
            try {
                closing = AnchorFile.write(file, lots, Instant.now().truncatedTo(ChronoUnit.SECONDS));
            } catch (IOException e) {
                throw new BadInputException("anchor: " + e.getMessage());
            }
            int links = lots.stream().mapToInt(ChainAnchor::length).sum();
            System.out.printf("anchored %d lot(s), %d link(s) in %s%n", lots.size(), links, file);
            System.out.println("keep this line outside the store: " + closing);
            return ExitCodes.PASS;
        }
    }
}
