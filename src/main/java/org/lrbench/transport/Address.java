package org.lrbench.transport;

import java.util.Locale;
import java.util.Set;

/**
 * An instrument address: {@code scheme://rest}. Schemes: {@code sim} (an instrument of the
 * in-process simulated bench, {@code sim://generator} or {@code sim://digitizer}), and, reserved
 * for the instrument links, {@code tcp}, {@code serial}, {@code usbtmc}.
 */
public record Address(String scheme, String rest, String text) {

    public static final Set<String> SCHEMES = Set.of("sim", "tcp", "serial", "usbtmc");

    public static Address parse(String text) {
        if (text == null || text.isBlank()) {
            throw new AddressException("instrument address is empty; expected scheme://..., schemes: " + schemeList());
        }
        String t = text.trim();
        int sep = t.indexOf("://");
        if (sep <= 0) {
            throw new AddressException("instrument address '" + t + "' has no scheme; expected scheme://..., schemes: "
                    + schemeList());
        }
        String scheme = t.substring(0, sep).toLowerCase(Locale.ROOT);
        if (!SCHEMES.contains(scheme)) {
            throw new AddressException("instrument address '" + t + "': unknown scheme '" + scheme + "'; schemes: "
                    + schemeList());
        }
        String rest = t.substring(sep + 3);
        if (rest.isEmpty()) {
            throw new AddressException("instrument address '" + t + "': nothing after '" + scheme + "://'");
        }
        return new Address(scheme, rest, t);
    }

    private static String schemeList() {
        return String.join(", ", SCHEMES.stream().sorted().toList());
    }

    @Override
    public String toString() {
        return text;
    }
}
