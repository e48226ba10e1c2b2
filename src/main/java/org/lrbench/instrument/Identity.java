package org.lrbench.instrument;

import java.util.List;
import java.util.Arrays;

/** The four fields of an IEEE 488.2 {@code *IDN?} reply. */
public record Identity(String manufacturer, String model, String serial, String firmware) {

    /**
     * Parses the reply: exactly four comma-separated fields (IEEE Std 488.2-1992, 10.14).
     *
     * @throws IllegalArgumentException when the reply has another number of fields
     */
    public static Identity parse(String reply) {
        List<String> fields = Arrays.stream(reply.trim().split(",", -1)).map(String::trim).toList();
        if (fields.size() != 4) {
            throw new IllegalArgumentException("*IDN? reply '" + reply.trim() + "' has " + fields.size()
                    + " fields; IEEE 488.2 requires 4 (manufacturer, model, serial, firmware)");
        }
        return new Identity(fields.get(0), fields.get(1), fields.get(2), fields.get(3));
    }

    @Override
    public String toString() {
        return manufacturer + "," + model + "," + serial + "," + firmware;
    }
}
