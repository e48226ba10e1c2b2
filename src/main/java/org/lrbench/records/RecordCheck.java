package org.lrbench.records;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.lrbench.results.Attempt;
import org.lrbench.store.Canonical;
import org.lrbench.store.ResultStore;

/**
 * Re-reads a lot's records and names everything that is not as it was written: store rows altered,
 * removed or added outside lrbench (through the lot's hash chain), result files altered or
 * missing (each must hold exactly the JSON the store holds), trace archives truncated, altered or
 * missing (size and SHA-256 as the store recorded them).
 */
public final class RecordCheck {

    private RecordCheck() {
    }

    /** Every finding for one lot; empty when the lot's records are whole. */
    public static List<String> findings(ResultStore store, Path runs, String lot) {
        List<String> out = new ArrayList<>(store.chainFindings(lot));
        Path dir = runs.resolve(lot);
        Map<String, String> traceHashes = store.tracesHashes(lot);
        for (Attempt a : store.attempts(lot)) {
            if (a.jsonFile() != null) {
                checkJson(out, dir.resolve(a.jsonFile()), a);
            }
            if (a.tracesFile() != null) {
                checkTraces(out, dir.resolve(a.tracesFile()), a, traceHashes.get(a.serial() + "~" + a.number()));
            }
        }
        return out;
    }

    private static void checkJson(List<String> out, Path file, Attempt a) {
        byte[] want = a.resultJson().getBytes(StandardCharsets.UTF_8);
        try {
            if (!Files.exists(file)) {
                out.add(file + ": missing (attempt " + a.number() + " of " + a.serial() + " is stored)");
                return;
            }
            byte[] have = Files.readAllBytes(file);
            if (!Arrays.equals(have, want)) {
                out.add(file + ": altered" + (have.length < want.length ? " or truncated" : "") + " (" + have.length
                        + " bytes; the store's record of attempt " + a.number() + " has " + want.length
                        + " bytes and differs)");
            }
        } catch (IOException e) {
            out.add(file + ": cannot be read: " + e.getMessage());
        }
    }

    private static void checkTraces(List<String> out, Path file, Attempt a, String sha) {
        try {
            if (!Files.exists(file)) {
                out.add(file + ": missing (trace archive of attempt " + a.number() + " of " + a.serial() + ")");
                return;
            }
            long size = Files.size(file);
            if (a.tracesBytes() != null && size != a.tracesBytes()) {
                out.add(file + ": " + (size < a.tracesBytes() ? "truncated" : "has bytes added") + " (" + size
                        + " bytes; the store recorded " + a.tracesBytes() + ")");
                return;
            }
            if (sha != null && !sha.equals(Canonical.sha256(Files.readAllBytes(file)))) {
                out.add(file + ": altered (its SHA-256 is not the one the store recorded)");
            }
        } catch (IOException e) {
            out.add(file + ": cannot be read: " + e.getMessage());
        }
    }
}
