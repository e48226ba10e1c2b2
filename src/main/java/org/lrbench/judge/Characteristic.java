package org.lrbench.judge;

import java.util.LinkedHashMap;
import java.util.Map;
import org.lrbench.units.Dimension;

/** What a limit judges, the word a plan uses for it, its dimension, and whether it needs a frequency. */
public enum Characteristic {
    INDUCTANCE("inductance", Dimension.INDUCTANCE, false),
    SERIES_RESISTANCE("series_resistance", Dimension.RESISTANCE, false),
    QUALITY_FACTOR("quality_factor", Dimension.NONE, true),
    SELF_RESONANCE("self_resonance", Dimension.FREQUENCY, false);

    private final String key;
    private final Dimension dimension;
    private final boolean needsFrequency;

    Characteristic(String key, Dimension dimension, boolean needsFrequency) {
        this.key = key;
        this.dimension = dimension;
        this.needsFrequency = needsFrequency;
    }

    public String key() {
        return key;
    }

    public Dimension dimension() {
        return dimension;
    }

    public boolean needsFrequency() {
        return needsFrequency;
    }

    public static Map<String, Characteristic> byKey() {
        Map<String, Characteristic> m = new LinkedHashMap<>();
        for (Characteristic c : values()) {
            m.put(c.key, c);
        }
        return m;
    }
}
