package org.lrbench.results;

import java.util.List;
import java.util.Map;

/**
 * The record of one measured part, as written to its JSON file (schema {@value #SCHEMA}; field
 * names in snake_case; the README documents every field). Values the measurement did not reach are
 * null; a part whose measurement did not complete has verdict {@code error} and says why.
 */
public record PartResult(String schema, String programVersion, String lot, String serial, String partNumber,
                         String planPath, String planSha256, String bench, boolean simulated,
                         String startedAt, String finishedAt, String verdict, String error,
                         List<String> failedLimits, Double inductanceH, Double inductanceUncertaintyH,
                         Double seriesResistanceOhm, Double seriesResistanceUncertaintyOhm, String model,
                         Double reducedChiSquare, List<LimitRecord> limits, List<PointRecord> points,
                         Map<String, String> instruments) {

    public static final String SCHEMA = "lrbench.part-result.v1";

    /** One judged limit; a one-sided limit has a null bound. */
    public record LimitRecord(String name, String characteristic, Double atHz, String spec, Double value,
                              Double uncertainty, Double lower, Double upper, boolean pass, Double margin,
                              String reason) {
    }

    /** One sweep point and how it was captured. */
    public record PointRecord(double frequencyHz, double resistanceOhm, double reactanceOhm, double inductanceH,
                              double qualityFactor, double impedanceUncertaintyOhm, double currentPeakA,
                              double senseRangeV, double partRangeV, double sampleIntervalS, int samples,
                              int acquisitions) {
    }
}
