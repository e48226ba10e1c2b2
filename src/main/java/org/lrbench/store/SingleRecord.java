package org.lrbench.store;

/**
 * The record of one part measured outside a lot's sample ({@code run --serial}): its result file and
 * trace archive in the lot's folder, each with its size and SHA-256, as the store keeps them.
 */
public record SingleRecord(String lot, String serial, int attempt, String bench, String resultFile, long resultBytes,
                           String resultSha256, String tracesFile, Long tracesBytes, String tracesSha256,
                           boolean simulated, String recordedAt) {

    /** The canonical content its link hashes (every field, in order, as text). */
    String content() {
        return String.join("\n", "single", lot, serial, Integer.toString(attempt), bench, resultFile,
                Long.toString(resultBytes), resultSha256, String.valueOf(tracesFile), String.valueOf(tracesBytes),
                String.valueOf(tracesSha256), simulated ? "simulated" : "real", recordedAt);
    }
}
