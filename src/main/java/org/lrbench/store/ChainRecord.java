package org.lrbench.store;

/** One link of a lot's hash chain: what it records (terms, an attempt, a decision) and its hashes. */
public record ChainRecord(String lot, int seq, String kind, int round, String serial, Integer attempt,
                          String contentSha256, String previousSha256, String recordSha256) {

    public String describe() {
        return switch (kind) {
            case "attempt" -> "attempt " + attempt + " of " + serial + " (inspection " + round + ")";
            case "decision" -> "decision of inspection " + round;
            default -> "terms of inspection " + round;
        };
    }
}
