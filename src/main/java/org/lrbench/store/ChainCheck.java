package org.lrbench.store;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.lrbench.results.Inspection;

/**
 * Checks one lot's rows against its hash chain: the links follow each other without a gap, each
 * link's hash is SHA-256 over the previous one and its content, each content hash matches the row
 * it records as it is stored now, every row has its link, and the chain's head is its last link.
 */
final class ChainCheck {

    /** The lot's chain row: how many links and the last one's hash. */
    record State(int length, String head) {
    }

    private ChainCheck() {
    }

    static List<String> findings(String lot, List<Inspection> inspections, List<ChainRows.HashedAttempt> attempts,
                                 List<ChainRecord> chain, State state) {
        List<String> out = new ArrayList<>();
        String prefix = "store: lot " + lot + ": ";
        Map<String, String> content = new HashMap<>();
        for (Inspection i : inspections) {
            content.put("terms/" + i.round(), Canonical.sha256(Canonical.terms(i)));
            if (i.decided()) {
                content.put("decision/" + i.round(), Canonical.sha256(Canonical.decision(i)));
            }
        }
        for (ChainRows.HashedAttempt h : attempts) {
            content.put("attempt/" + h.attempt().serial() + "/" + h.attempt().number(),
                    Canonical.sha256(Canonical.attempt(h.attempt(), h.programVersion(), h.tracesSha256())));
        }
        if (chain.isEmpty() && state == null) {
            if (!content.isEmpty()) {
                out.add(prefix + content.size() + " row(s) stored before the hash chain existed (schema 2 or older):"
                        + " they cannot be verified");
            }
            return out;
        }
        Set<String> linked = new HashSet<>();
        String previous = Canonical.GENESIS;
        int expected = 1;
        for (ChainRecord c : chain) {
            String what = c.describe();
            if (c.seq() != expected) {
                out.add(prefix + "hash chain link " + expected + (c.seq() > expected ? " is missing (removed)"
                        : " appears twice") + " before " + what);
                expected = c.seq();
            }
            if (!c.previousSha256().equals(previous)) {
                out.add(prefix + "link " + c.seq() + " (" + what + ") does not follow the link before it:"
                        + " a record was removed, inserted or reordered");
            }
            if (!Canonical.chain(c.previousSha256(), c.contentSha256()).equals(c.recordSha256())) {
                out.add(prefix + "link " + c.seq() + " (" + what + ") has a wrong chain hash: the link was altered");
            }
            String key = switch (c.kind()) {
                case "attempt" -> "attempt/" + c.serial() + "/" + c.attempt();
                default -> c.kind() + "/" + c.round();
            };
            linked.add(key);
            String now = content.get(key);
            if (now == null) {
                out.add(prefix + what + " is recorded in the hash chain but its row is missing (deleted)");
            } else if (!now.equals(c.contentSha256())) {
                out.add(prefix + what + ": the stored row was altered (its content no longer matches its hash)");
            }
            previous = c.recordSha256();
            expected++;
        }
        if (state == null) {
            out.add(prefix + "the lot's chain head row is missing");
        } else {
            if (state.length() != chain.size() || !state.head().equals(previous)) {
                out.add(prefix + "the chain head says " + state.length() + " link(s) ending " + abbreviate(state.head())
                        + ", the links found are " + chain.size() + " ending " + abbreviate(previous)
                        + ": links were removed or added");
            }
        }
        for (String key : content.keySet()) {
            if (!linked.contains(key)) {
                out.add(prefix + describe(key) + " has no link in the hash chain: it was added outside lrbench");
            }
        }
        return out;
    }

    private static String describe(String key) {
        String[] k = key.split("/");
        return switch (k[0]) {
            case "attempt" -> "attempt " + k[2] + " of " + k[1];
            case "decision" -> "decision of inspection " + k[1];
            default -> "terms of inspection " + k[1];
        };
    }

    private static String abbreviate(String sha) {
        return sha == null ? "nothing" : sha.substring(0, Math.min(12, sha.length())) + "...";
    }
}
