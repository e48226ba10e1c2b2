package org.lrbench.driver;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.scpi.TraceEncoding;
import org.lrbench.units.Dimension;
import org.lrbench.yaml.YamlMap;

/** Reads a digitizer driver's {@code vertical}, {@code scaling}, {@code timebase} and {@code acquisition} sections. */
final class DigitizerTraitsReader {
    static final Set<String> REPLY_FIELDS = Set.of("x_increment", "x_origin", "y_increment", "y_origin", "y_reference");

    private DigitizerTraitsReader() {
    }

    static DigitizerTraits read(YamlMap root, TraceEncoding encoding) {
        DigitizerTraits g = DigitizerTraits.GENERIC;
        DigitizerTraits.Vertical vertical = g.vertical();
        YamlMap v = root.map("vertical", false, "setting", "divisions", "ranges", "rounding", "noise");
        if (v != null) {
            DigitizerTraits.VerticalSetting setting = v.has("setting") ? v.choice("setting", true, Map.of(
                    "peak_to_peak", DigitizerTraits.VerticalSetting.PEAK_TO_PEAK,
                    "plus_minus", DigitizerTraits.VerticalSetting.PLUS_MINUS,
                    "per_division", DigitizerTraits.VerticalSetting.PER_DIVISION))
                    : DigitizerTraits.VerticalSetting.PEAK_TO_PEAK; // as documented: peak-to-peak unless said
            Integer divisions = v.integer("divisions", setting == DigitizerTraits.VerticalSetting.PER_DIVISION, 1, 100);
            if (divisions != null && setting != DigitizerTraits.VerticalSetting.PER_DIVISION) {
                v.problem("divisions", "only a per_division setting has divisions");
            }
            List<Double> ranges = new ArrayList<>();
            for (YamlMap.Item item : v.has("ranges") ? v.list("ranges", false) : List.<YamlMap.Item>of()) {
                Double r = v.asQuantity(item, Dimension.VOLTAGE);
                if (r != null) {
                    if (!(r > 0) || (!ranges.isEmpty() && r <= ranges.get(ranges.size() - 1))) {
                        v.problem("ranges", "ranges must be positive and ascending; " + item.path() + " is not");
                    }
                    ranges.add(r);
                }
            }
            RangeLimits.Rounding rounding = v.has("rounding") ? v.choice("rounding", true, Map.of(
                    "up", RangeLimits.Rounding.UP, "down", RangeLimits.Rounding.DOWN,
                    "nearest", RangeLimits.Rounding.NEAREST)) : null;
            Double noise = v.quantity("noise", Dimension.VOLTAGE, false);
            if (noise != null && !(noise > 0 && noise < 1)) {
                v.problem("noise", "the input noise (RMS) must be above 0 V and below 1 V");
            }
            vertical = new DigitizerTraits.Vertical(setting == null ? DigitizerTraits.VerticalSetting.PEAK_TO_PEAK : setting,
                    divisions == null ? 1 : divisions, List.copyOf(ranges), rounding, noise);
        }
        DigitizerTraits.Scaling scaling = g.scaling();
        YamlMap s = root.map("scaling", false, "source", "fields", "queries", "zero_code", "full_scale_codes", "clip_codes");
        if (s != null) {
            // "preamble" is this format's earlier word for reply_fields: driver files written with it still load
            DigitizerTraits.ScaleSource source = "preamble".equals(s.text("source", false))
                    ? DigitizerTraits.ScaleSource.REPLY_FIELDS : s.choice("source", true, Map.of(
                    "scale_query", DigitizerTraits.ScaleSource.SCALE_QUERY,
                    "reply_fields", DigitizerTraits.ScaleSource.REPLY_FIELDS,
                    "queries", DigitizerTraits.ScaleSource.QUERIES,
                    "formula", DigitizerTraits.ScaleSource.FORMULA,
                    "none", DigitizerTraits.ScaleSource.NONE));
            Map<String, Integer> fields = new LinkedHashMap<>();
            YamlMap f = s.map("fields", source == DigitizerTraits.ScaleSource.REPLY_FIELDS,
                    REPLY_FIELDS.stream().sorted().toArray(String[]::new));
            if (f != null) {
                for (String name : REPLY_FIELDS) {
                    Integer pos = f.integer(name, name.equals("y_increment"), 1, 64);
                    if (pos != null) {
                        fields.put(name, pos);
                    }
                }
                if (source != DigitizerTraits.ScaleSource.REPLY_FIELDS) {
                    s.problem("fields", "only source: reply_fields has fields (positions in the scale query's reply)");
                }
            }
            Map<String, CommandTemplate> queries = new LinkedHashMap<>();
            YamlMap q = s.map("queries", source == DigitizerTraits.ScaleSource.QUERIES,
                    REPLY_FIELDS.stream().sorted().toArray(String[]::new));
            if (q != null) {
                for (String name : REPLY_FIELDS) {
                    String text = q.text(name, name.equals("y_increment"));
                    if (text != null) {
                        try {
                            CommandTemplate t = CommandTemplate.parse(text, Set.of("channel"));
                            queries.put(name, t);
                            if (!text.startsWith(":") || !text.endsWith("?") && !text.contains("? ")) {
                                q.problem(name, "must be an absolute query such as :DATA:YSTep? CH{channel}");
                            } else if (name.startsWith("y_") && !t.placeholders().contains("channel")) {
                                // each channel has its own vertical scale: without {channel} both would read one
                                q.problem(name, "'" + text + "' has no {channel}: the vertical scale is each channel's"
                                        + " own, and this query would read the same channel's for both");
                            }
                        } catch (IllegalArgumentException e) {
                            q.problem(name, e.getMessage());
                        }
                    }
                }
                if (source != DigitizerTraits.ScaleSource.QUERIES) {
                    s.problem("queries", "only source: queries has queries");
                }
            }
            boolean formula = source == DigitizerTraits.ScaleSource.FORMULA;
            Long zero = s.has("zero_code") ? s.longValue("zero_code", false) : null;
            Long full = s.has("full_scale_codes") ? s.longValue("full_scale_codes", false) : null;
            if (formula && full == null) {
                s.problem("source", "a formula needs full_scale_codes (codes spanning the full-scale range)");
            }
            if (!formula && (zero != null || full != null)) {
                s.problem(zero != null ? "zero_code" : "full_scale_codes", "only a formula has zero_code and full_scale_codes");
            }
            if (full != null && full <= 0) {
                s.problem("full_scale_codes", "must be a positive number of codes");
            }
            Double clipLow = null;
            Double clipHigh = null;
            List<YamlMap.Item> clip = s.has("clip_codes") ? s.list("clip_codes", false) : List.of();
            if (!clip.isEmpty()) {
                if (clip.size() != 2 || encoding == null || !encoding.isInteger()) {
                    s.problem("clip_codes", "give two codes [lowest, highest], for an integer trace format only");
                } else {
                    clipLow = s.asQuantity(clip.get(0), Dimension.NONE);
                    clipHigh = s.asQuantity(clip.get(1), Dimension.NONE);
                    if (clipLow != null && clipHigh != null && !(clipLow < clipHigh)) {
                        s.problem("clip_codes", "[" + fmt(clipLow) + ", " + fmt(clipHigh) + "] is not [lowest, highest]:"
                                + " the first code must be below the second");
                    } else if (clipLow != null && clipHigh != null
                            && (clipLow < encoding.minCode() || clipHigh > encoding.maxCode()
                            || clipLow != Math.rint(clipLow) || clipHigh != Math.rint(clipHigh))) {
                        s.problem("clip_codes", "[" + fmt(clipLow) + ", " + fmt(clipHigh) + "] is outside what "
                                + encoding.key() + " can carry: whole codes from " + encoding.minCode() + " to "
                                + encoding.maxCode());
                    }
                }
            }
            if (source == DigitizerTraits.ScaleSource.NONE && encoding != null && encoding.isInteger()) {
                s.problem("source", "an integer trace format needs scaling: scale_query, reply_fields, queries or formula");
            }
            scaling = new DigitizerTraits.Scaling(source == null ? DigitizerTraits.ScaleSource.SCALE_QUERY : source,
                    Map.copyOf(fields), Map.copyOf(queries), zero == null ? 0 : zero, full == null ? 0 : full, clipLow, clipHigh);
        }
        DigitizerTraits.Timebase timebase = g.timebase();
        YamlMap t = root.map("timebase", false, "setting", "record_lengths", "rounding");
        if (t != null) {
            Boolean rate = t.has("setting") ? t.choice("setting", true, Map.of("interval", false, "rate", true)) : Boolean.FALSE;
            List<Integer> lengths = new ArrayList<>();
            for (YamlMap.Item item : t.has("record_lengths") ? t.list("record_lengths", false) : List.<YamlMap.Item>of()) {
                Double n = t.asQuantity(item, Dimension.NONE);
                if (n != null) {
                    if (n != Math.rint(n) || n < 16 || n > Integer.MAX_VALUE
                            || (!lengths.isEmpty() && n <= lengths.get(lengths.size() - 1))) {
                        t.problem("record_lengths", "record lengths must be whole numbers from 16, ascending; "
                                + item.path() + " is not");
                    } else {
                        lengths.add((int) Math.round(n));
                    }
                }
            }
            RangeLimits.Rounding rounding = t.has("rounding") ? t.choice("rounding", true, Map.of(
                    "up", RangeLimits.Rounding.UP, "down", RangeLimits.Rounding.DOWN,
                    "nearest", RangeLimits.Rounding.NEAREST)) : null;
            timebase = new DigitizerTraits.Timebase(rate != null && rate, List.copyOf(lengths), rounding);
        }
        DigitizerTraits.Acquisition acquisition = g.acquisition();
        YamlMap a = root.map("acquisition", false, "complete", "poll_query", "until", "wait");
        if (a != null) {
            DigitizerTraits.Completion complete = a.choice("complete", true, Map.of("opc", DigitizerTraits.Completion.OPC,
                    "poll", DigitizerTraits.Completion.POLL, "wait", DigitizerTraits.Completion.WAIT));
            boolean poll = complete == DigitizerTraits.Completion.POLL;
            String query = a.text("poll_query", poll);
            String until = a.text("until", poll);
            Double wait = a.quantity("wait", Dimension.TIME, complete == DigitizerTraits.Completion.WAIT);
            if (query != null) {
                if (!poll) {
                    a.problem("poll_query", "only complete: poll polls");
                } else if (!query.startsWith(":") || !query.endsWith("?")) {
                    a.problem("poll_query", "must be an absolute query such as :ACQuire:STATe?");
                } else {
                    try {
                        CommandTemplate.parse(query, Set.of());
                    } catch (IllegalArgumentException e) {
                        a.problem("poll_query", e.getMessage());
                    }
                }
            }
            if (wait != null && !(wait > 0 && wait <= 60)) {
                a.problem("wait", "must be more than 0 s and at most 60 s");
            }
            acquisition = new DigitizerTraits.Acquisition(complete == null ? DigitizerTraits.Completion.OPC : complete,
                    query, until, Duration.ofNanos(Math.round((wait == null ? (poll ? 0.01 : 0) : wait) * 1e9)));
        }
        Boolean terminated = root.has("block_terminator") ? root.choice("block_terminator", true,
                Map.of("yes", true, "no", false)) : Boolean.TRUE;
        Boolean together = root.has("fetch_together") ? root.choice("fetch_together", true,
                Map.of("yes", true, "no", false)) : Boolean.FALSE;
        if (Boolean.TRUE.equals(together) && (encoding == null || !encoding.isBinary())) {
            root.problem("fetch_together", "only binary trace formats (one definite block per channel) fetch together");
        }
        return new DigitizerTraits(vertical, scaling, timebase, acquisition, terminated == null || terminated,
                Boolean.TRUE.equals(together));
    }

    /** Digitizer operations a driver may leave out, given its traits. */
    static Set<String> optional(DigitizerTraits traits) {
        Set<String> out = new HashSet<>();
        if (!traits.vertical().ranges().isEmpty()) {
            out.add("range_min_query");
            out.add("range_max_query");
        }
        // an instrument without an input offset: lrbench asks for none (an offset other than 0 is then refused)
        out.add("offset");
        // an instrument without a trigger setting runs free: the sine fit needs no trigger
        out.add("trigger");
        if (traits.scaling().source() == DigitizerTraits.ScaleSource.FORMULA
                || traits.scaling().source() == DigitizerTraits.ScaleSource.NONE
                || traits.scaling().source() == DigitizerTraits.ScaleSource.QUERIES) {
            out.add("scale_query");
        }
        return out;
    }

    private static String fmt(double code) {
        return code == Math.rint(code) ? Long.toString((long) code) : Double.toString(code);
    }
}
