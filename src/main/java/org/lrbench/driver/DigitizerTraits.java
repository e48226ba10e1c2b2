package org.lrbench.driver;

import java.time.Duration;
import java.util.List;
import java.util.Map;

/**
 * How a digitizer differs from the generic one, as its driver file declares it:
 * <ul>
 * <li>{@link Vertical}: what the number in {@code {range}} and in the range reply means (full-scale
 * peak-to-peak, plus-minus full scale, or volts per division over a number of divisions) and,
 * optionally, the instrument's list of ranges in that unit;</li>
 * <li>{@link Scaling}: how trace codes become volts (four numbers from {@code scale_query}, fields
 * picked by position from the scale query's reply, one query per field, a fixed formula, or none when the data
 * are volts already),
 * and which codes mean clipped;</li>
 * <li>{@link Timebase}: whether {@code {interval}} and its reply are a sample interval or a sample rate;</li>
 * <li>{@link Acquisition}: how the end of an acquisition is known ({@code *OPC?}, polling a status
 * query until it answers a value, or a fixed wait);</li>
 * <li>whether a definite-length trace block ends with the message terminator;</li>
 * <li>whether both channels' traces may be asked for in one message (two blocks in one response,
 * separated by ';' as IEEE 488.2 separates response message units).</li>
 * </ul>
 */
public record DigitizerTraits(Vertical vertical, Scaling scaling, Timebase timebase, Acquisition acquisition,
                              boolean blockTerminated, boolean fetchTogether) {

    public DigitizerTraits(Vertical vertical, Scaling scaling, Timebase timebase, Acquisition acquisition,
                           boolean blockTerminated) {
        this(vertical, scaling, timebase, acquisition, blockTerminated, false);
    }

    public static final DigitizerTraits GENERIC = new DigitizerTraits(new Vertical(VerticalSetting.PEAK_TO_PEAK, 1,
            List.of()), new Scaling(ScaleSource.SCALE_QUERY, Map.of(), Map.of(), 0, 0, null, null),
            new Timebase(false, List.of()), new Acquisition(Completion.OPC, null, null, Duration.ZERO), true);

    /** What the instrument's vertical number means. */
    public enum VerticalSetting { PEAK_TO_PEAK, PLUS_MINUS, PER_DIVISION }

    /**
     * @param divisions the screen's vertical divisions, for {@code per_division}
     * @param ranges    the instrument's ranges in its own unit, ascending; empty when its limits are queried
     * @param rounding  how the instrument rounds a requested range to one of its own (null: not declared)
     * @param noiseVolt the input noise, RMS volts, the manual's figure (null: not declared)
     */
    public record Vertical(VerticalSetting setting, int divisions, List<Double> ranges,
                           org.lrbench.instrument.RangeLimits.Rounding rounding, Double noiseVolt) {

        public Vertical(VerticalSetting setting, int divisions, List<Double> ranges) {
            this(setting, divisions, ranges, null, null);
        }

        /** Instrument value per volt of full-scale peak-to-peak range. */
        public double perPeakToPeak() {
            return switch (setting) {
                case PEAK_TO_PEAK -> 1;
                case PLUS_MINUS -> 0.5;
                case PER_DIVISION -> 1.0 / divisions;
            };
        }
    }

    /** Where the code-to-volts scaling comes from. */
    public enum ScaleSource { SCALE_QUERY, REPLY_FIELDS, QUERIES, FORMULA, NONE }

    /**
     * @param fields         reply_fields: field name ({@code x_increment}, {@code x_origin},
     *                       {@code y_increment}, {@code y_origin}, {@code y_reference}) to its 1-based
     *                       position in the reply
     * @param queries        queries: the same field names to the query that answers each one
     * @param zeroCode       formula: the code of 0 V relative to the channel offset
     * @param fullScaleCodes formula: how many codes span the full-scale (peak-to-peak) range
     * @param clipLow        the code at or below which a sample counts as clipped (null: the format's own)
     * @param clipHigh       the code at or above which a sample counts as clipped (null: the format's own)
     */
    public record Scaling(ScaleSource source, Map<String, Integer> fields, Map<String, CommandTemplate> queries,
                          double zeroCode, double fullScaleCodes, Double clipLow, Double clipHigh) {
    }

    /**
     * @param rate          true when the {@code interval_query} reply is a sample rate (per second)
     * @param recordLengths the record lengths the instrument offers, ascending; empty when any length
     *                      goes (the shortest listed length that holds the request is asked for)
     */
    public record Timebase(boolean rate, List<Integer> recordLengths, org.lrbench.instrument.RangeLimits.Rounding rounding) {

        public Timebase(boolean rate, List<Integer> recordLengths) {
            this(rate, recordLengths, null);
        }
    }

    /** How the end of an acquisition is known. */
    public enum Completion { OPC, POLL, WAIT }

    /**
     * @param pollQuery with {@code poll}: the status query
     * @param until     with {@code poll}: the reply that means complete
     * @param pause     with {@code wait}: how long an acquisition takes; with {@code poll}: the pause
     *                  between polls
     */
    public record Acquisition(Completion complete, String pollQuery, String until, Duration pause) {
    }
}
