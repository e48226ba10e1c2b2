package org.lrbench.store;

/**
 * The record of one file of a bench's checks (a check-standard reading, or an override of the check
 * before a lot run): its path under the runs folder, size and SHA-256, as the store keeps them.
 *
 * @param kind {@link #READING} or {@link #OVERRIDE}
 * @param file the path relative to the runs folder, with '/' between names
 */
public record CheckFile(String bench, String kind, String file, long bytes, String sha256, String recordedAt) {
    public static final String READING = "reading";
    public static final String OVERRIDE = "override";

    /** The canonical content its link hashes (every field, in order, as text). */
    String content() {
        return String.join("\n", "check-file", bench, kind, file, Long.toString(bytes), sha256, recordedAt);
    }
}
