package org.lrbench.judge;

/**
 * How a reading is compared with a tolerance limit (ILAC-G8:09/2019, JCGM 106:2012). SIMPLE:
 * the reading itself must lie within the tolerance limits. GUARDED: it must lie within acceptance
 * limits drawn inside the tolerance limits by the guard band w (by default w = U, the expanded
 * uncertainty of the reading), so the risk of accepting a nonconforming part stays small.
 */
public enum DecisionRule {
    SIMPLE("simple"), GUARDED("guarded");

    private final String key;

    DecisionRule(String key) {
        this.key = key;
    }

    public String key() {
        return key;
    }
}
