package org.lrbench.results;

import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.lrbench.judge.Verdict;

/**
 * One stored measurement of a part: its number among the lot's measurements of that serial
 * (1, 2, ...), the inspection round it belongs to, its position in that round's sample, who
 * measured it and, for a measurement repeated, why. Attempts are only ever added.
 */
public record Attempt(String lot, String serial, int number, int round, int position, Verdict verdict,
                      Double inductanceH, Double seriesResistanceOhm, String measuredAt, String operator,
                      String reason, String resultJson, String jsonFile, String tracesFile, Long tracesBytes) {

    public boolean judged() {
        return verdict.judged();
    }

    public boolean skipped() {
        return verdict == Verdict.SKIPPED;
    }

    /**
     * The attempt that counts for each part of an inspection round, in position order: the part's
     * latest attempt in that round. A re-measure, always recorded with its reason, supersedes the
     * attempts before it; every attempt stays stored and reported.
     */
    public static List<Attempt> counting(List<Attempt> roundAttempts) {
        Map<String, Attempt> latest = new LinkedHashMap<>();
        for (Attempt a : roundAttempts) {
            Attempt had = latest.get(a.serial());
            if (had == null || a.number() > had.number()) {
                latest.put(a.serial(), a);
            }
        }
        return latest.values().stream().sorted(Comparator.comparingInt(Attempt::position)).toList();
    }

    /** The file name of an attempt's record in the lot's folder: SERIAL.EXT, then SERIAL~2.EXT, ... */
    public static String fileName(String serial, int number, String extension) {
        return (number == 1 ? serial : serial + "~" + number) + "." + extension;
    }
}
