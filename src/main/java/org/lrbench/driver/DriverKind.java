package org.lrbench.driver;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The kinds of instrument a driver file can drive, each with its logical operations (and the
 * placeholders each operation's template may use) and its word tables (logical word -> SCPI word).
 */
public enum DriverKind {
    SOURCE("source",
            ops("prepare", Set.of(),
                "waveform", Set.of("shape"),
                "frequency", Set.of("frequency"),
                "amplitude", Set.of("amplitude_vpp", "amplitude_vpk"),
                "offset", Set.of("offset"),
                "output_on", Set.of(),
                "output_off", Set.of(),
                "arbitrary_data", Set.of("points", "count"),
                "arbitrary_rate", Set.of("rate", "frequency"),
                "arbitrary_select", Set.of()),
            Map.of("shapes", List.of("sine", "triangle", "square"))),
    DIGITIZER("digitizer",
            ops("prepare", Set.of(),
                "range", Set.of("channel", "range"),
                "range_query", Set.of("channel"),
                "range_min_query", Set.of("channel"),
                "range_max_query", Set.of("channel"),
                "range_list_query", Set.of("channel"),
                "offset", Set.of("channel", "offset"),
                "coupling", Set.of("channel", "coupling"),
                "interval", Set.of("interval", "rate", "duration"),
                "interval_query", Set.of(),
                "points", Set.of("points"),
                "points_query", Set.of(),
                "trigger", Set.of("source", "level", "slope"),
                "acquire", Set.of(),
                "scale_query", Set.of("channel"),
                "fetch", Set.of("channel")),
            Map.of("couplings", List.of("dc", "ac"),
                   "trigger_sources", List.of("channel1", "channel2", "external", "immediate"),
                   "slopes", List.of("rising", "falling"))),
    METER("meter",
            ops("prepare", Set.of(),
                "resistance_2w_query", Set.of(),
                "resistance_4w_query", Set.of()),
            Map.of()),
    SWITCH("switch",
            ops("prepare", Set.of(),
                "close", Set.of("channels"),
                "open_all", Set.of(),
                "closed_query", Set.of("channels")),
            Map.of());

    /** A source's optional operations for an arbitrary waveform: all of them or none. */
    public static final List<String> ARBITRARY_OPERATIONS = List.of("arbitrary_data", "arbitrary_rate", "arbitrary_select");

    private final String key;
    private final Map<String, Set<String>> operations;
    private final Map<String, List<String>> wordTables;

    DriverKind(String key, Map<String, Set<String>> operations, Map<String, List<String>> wordTables) {
        this.key = key;
        this.operations = operations;
        this.wordTables = wordTables;
    }

    public String key() {
        return key;
    }

    /** Operation name -> placeholders its template may use; required unless the loader says otherwise. */
    public Map<String, Set<String>> operations() {
        return operations;
    }

    /** Table name -> the logical words it must map. */
    public Map<String, List<String>> wordTables() {
        return wordTables;
    }

    private static Map<String, Set<String>> ops(Object... pairs) {
        Map<String, Set<String>> m = new LinkedHashMap<>();
        for (int i = 0; i < pairs.length; i += 2) {
            @SuppressWarnings("unchecked")
            Set<String> placeholders = (Set<String>) pairs[i + 1];
            m.put((String) pairs[i], placeholders);
        }
        return m;
    }
}
