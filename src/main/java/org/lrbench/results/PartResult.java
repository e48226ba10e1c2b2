package org.lrbench.results;

import org.lrbench.judge.Verdict;

import java.util.List;
import java.util.Map;

/**
 * The record of one measured part, as written to its JSON file (schema {@value #SCHEMA}; field
 * names in snake_case; the README documents every field). Values the measurement did not reach are
 * null; a part whose measurement did not complete has verdict {@code error} and says why.
 */
public record PartResult(String schema, String programVersion, String lot, String serial, String partNumber,
                         String planPath, String planSha256, String bench, boolean simulated,
                         String startedAt, String finishedAt, Verdict verdict, String error,
                         List<String> failedLimits, List<String> warnings,
                         Double inductanceH, Double inductanceUncertaintyH, Double inductanceExpandedUncertaintyH,
                         Double seriesResistanceOhm, Double seriesResistanceUncertaintyOhm,
                         Double seriesResistanceExpandedUncertaintyOhm,
                         Double selfResonanceHz, Double selfResonanceAboveHz,
                         Map<String, String> methods, CorrectionsRecord corrections, ModelRecord model,
                         TriangleRecord triangle, DcResistanceRecord dcResistance, List<LimitRecord> limits,
                         List<PointRecord> points, Map<String, BudgetRecord> budgets, Map<String, String> instruments,
                         AttemptRecord attempt) {

    public static final String SCHEMA = "lrbench.part-result.v3";

    /**
     * Which measurement of the part this is: the lot's inspection round, the attempt number among
     * the measurements of this serial, the operator, and why a part was measured again (null the
     * first time).
     */
    public record AttemptRecord(int inspection, int number, String operator, String reason) {
    }

    /** The same record as attempt {@code a}. */
    public PartResult withAttempt(AttemptRecord a) {
        return new PartResult(schema, programVersion, lot, serial, partNumber, planPath, planSha256, bench, simulated,
                startedAt, finishedAt, verdict, error, failedLimits, warnings, inductanceH, inductanceUncertaintyH,
                inductanceExpandedUncertaintyH, seriesResistanceOhm, seriesResistanceUncertaintyOhm,
                seriesResistanceExpandedUncertaintyOhm, selfResonanceHz, selfResonanceAboveHz, methods, corrections,
                model, triangle, dcResistance, limits, points, budgets, instruments, a);
    }

    /** The sweep model: its name, each free parameter with its standard uncertainty, what was dropped. */
    public record ModelRecord(String name, Map<String, ParameterRecord> parameters, List<String> dropped,
                              Double reducedChiSquare, int degreesOfFreedom) {
    }

    /** The triangle-wave time-domain check: R and L with their type A standard uncertainties. */
    public record TriangleRecord(double frequencyHz, double resistanceOhm, double resistanceUncertaintyOhm,
                                 double inductanceH, double inductanceUncertaintyH, double residualRmsV, int harmonics) {
    }

    /** The bench corrections applied before the fit (null members: not in force). */
    public record CorrectionsRecord(String channelMatchMeasuredAt, Double channel2GainRatio, Double channel2SkewS,
                                    String fixtureMeasuredAt, Integer fixtureFrequencies, String inForce,
                                    String senseTracedAt, Double senseOhm) {

        /** Without a traced sense resistor. */
        public CorrectionsRecord(String channelMatchMeasuredAt, Double channel2GainRatio, Double channel2SkewS,
                                 String fixtureMeasuredAt, Integer fixtureFrequencies, String inForce) {
            this(channelMatchMeasuredAt, channel2GainRatio, channel2SkewS, fixtureMeasuredAt, fixtureFrequencies, inForce,
                    null, null);
        }

        /** Which corrections were in force, in words: "none", "channel match", "fixture", or both. */
        public static String words(boolean channelMatch, boolean fixture) {
            return channelMatch && fixture ? "channel match and fixture" : channelMatch ? "channel match"
                    : fixture ? "fixture" : "none";
        }
    }

    /**
     * The multimeter's DC resistance of the winding beside the sweep's R_dc: the reading, its
     * wiring, the entered temperature, the reading corrected to the reference temperature, and
     * whether the two methods agree within their combined uncertainty.
     */
    public record DcResistanceRecord(String wiring, double measuredOhm, double temperatureC, double referenceTemperatureC,
                                     double atReferenceOhm, Double sweepResistanceOhm, Boolean agrees) {
    }

    /** A fitted parameter. */
    public record ParameterRecord(double value, double standardUncertainty) {
    }

    /** One judged limit; a one-sided limit has a null bound. */
    public record LimitRecord(String name, String characteristic, Double atHz, String spec, String decisionRule,
                              Double value, Double uncertainty, Double expandedUncertainty, Double lower, Double upper,
                              Double acceptanceLower, Double acceptanceUpper, String zone, boolean pass, Double margin,
                              String reason) {
    }

    /** One sweep point and how it was captured. */
    public record PointRecord(double frequencyHz, double resistanceOhm, double reactanceOhm, double inductanceH,
                              double qualityFactor, double impedanceUncertaintyOhm, double currentPeakA,
                              double currentThd, double senseRangeV, double partRangeV, double sampleIntervalS,
                              int samples, int acquisitions, Double correctedResistanceOhm,
                              Double correctedReactanceOhm) {
    }

    /** An uncertainty budget (JCGM 100:2008). */
    public record BudgetRecord(double value, double standardUncertainty, double expandedUncertainty,
                               double coverageFactor, Double effectiveDegreesOfFreedom,
                               List<ContributionRecord> contributions) {
    }

    /** One line of a budget. */
    public record ContributionRecord(String source, String type, String distribution, Double inputStandardUncertainty,
                                     String inputUnit, double sensitivity, double contribution, double share) {
    }
}
