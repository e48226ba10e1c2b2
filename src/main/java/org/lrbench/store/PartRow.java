package org.lrbench.store;

/** One stored part result, with the full JSON record it was written from. */
public record PartRow(String lot, String serial, int position, String verdict, Double inductanceH,
                      Double seriesResistanceOhm, String measuredAt, String resultJson) {
}
