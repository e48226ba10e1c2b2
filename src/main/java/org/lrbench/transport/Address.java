package org.lrbench.transport;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * An instrument address, one syntax for every link:
 * <pre>
 *   tcp://HOST[:PORT][?options]              raw SCPI socket, PORT defaults to 5025
 *   serial://DEVICE[?options]                e.g. serial:///dev/ttyUSB0?baud=115200&amp;parity=none
 *   usbtmc://DEVICE[?options]                e.g. usbtmc:///dev/usbtmc0 (Linux kernel driver)
 *   sim://generator | sim://digitizer        the in-process simulated bench
 * </pre>
 * Options are {@code key=value} pairs joined by {@code &}; which keys a scheme takes is checked
 * when its transport opens. Every link accepts {@code term=lf|crlf|cr}, the message terminator.
 */
public record Address(String scheme, String target, Map<String, String> options, String text) {

    public static final int DEFAULT_TCP_PORT = 5025;

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
        if (!Transports.known(scheme)) {
            throw new AddressException("instrument address '" + t + "': unknown scheme '" + scheme + "'; schemes: "
                    + schemeList());
        }
        String rest = t.substring(sep + 3);
        int q = rest.indexOf('?');
        String target = q < 0 ? rest : rest.substring(0, q);
        Map<String, String> options = new LinkedHashMap<>();
        if (q >= 0) {
            for (String pair : rest.substring(q + 1).split("&", -1)) {
                int eq = pair.indexOf('=');
                if (eq <= 0 || eq == pair.length() - 1) {
                    throw new AddressException("instrument address '" + t + "': option '" + pair
                            + "' is not key=value");
                }
                String key = pair.substring(0, eq).toLowerCase(Locale.ROOT);
                if (options.put(key, pair.substring(eq + 1)) != null) {
                    throw new AddressException("instrument address '" + t + "': option '" + key + "' given twice");
                }
            }
        }
        if (target.isEmpty()) {
            throw new AddressException("instrument address '" + t + "': nothing after '" + scheme + "://'");
        }
        return new Address(scheme, target, Map.copyOf(options), t);
    }

    /** Letters, digits, dots and hyphens: a host name or an IPv4 address (RFC 1123). */
    private static final java.util.regex.Pattern HOST_NAME = java.util.regex.Pattern.compile("[A-Za-z0-9]([A-Za-z0-9.-]*[A-Za-z0-9])?");
    /** Hex digits, colons, dots (an IPv4 tail) and a zone after '%' (RFC 4291, RFC 6874). */
    private static final java.util.regex.Pattern IPV6 = java.util.regex.Pattern.compile("[0-9A-Fa-f:.]+(%[A-Za-z0-9._-]+)?");

    /** {host, port text or null} of a tcp target, refused when it is not HOST, HOST:PORT, [IPv6] or [IPv6]:PORT. */
    private String[] hostAndPort() {
        if (target.startsWith("[")) {
            int close = target.indexOf(']');
            if (close < 0) {
                throw new AddressException("instrument address '" + text + "': the IPv6 address has no closing ']'"
                        + " (write it as tcp://[::1]:5025)");
            }
            String host = target.substring(1, close);
            String rest = target.substring(close + 1);
            if (!IPV6.matcher(host).matches() || !host.contains(":")) {
                throw new AddressException("instrument address '" + text + "': '" + host + "' is not an IPv6 address");
            }
            if (!rest.isEmpty() && !rest.startsWith(":")) {
                throw new AddressException("instrument address '" + text + "': after ']' only ':PORT' may follow");
            }
            return new String[] {host, rest.isEmpty() ? null : rest.substring(1)};
        }
        int colon = target.indexOf(':');
        if (colon >= 0 && target.indexOf(':', colon + 1) >= 0) {
            throw new AddressException("instrument address '" + text + "': an IPv6 address goes in brackets, as in"
                    + " tcp://[::1]:5025");
        }
        String host = colon < 0 ? target : target.substring(0, colon);
        if (!host.isEmpty() && !HOST_NAME.matcher(host).matches()) {
            throw new AddressException("instrument address '" + text + "': '" + host + "' is not a host name or an IPv4"
                    + " address (letters, digits, '.' and '-')");
        }
        return new String[] {host, colon < 0 ? null : target.substring(colon + 1)};
    }

    /** The host of a tcp address. */
    public String host() {
        String host = hostAndPort()[0];
        if (host.isEmpty()) {
            throw new AddressException("instrument address '" + text + "': the host is empty");
        }
        return host;
    }

    /** The port of a tcp address, 5025 when absent. */
    public int port() {
        String p = hostAndPort()[1];
        if (p == null) {
            return DEFAULT_TCP_PORT;
        }
        try {
            int port = Integer.parseInt(p);
            if (port < 1 || port > 65535) {
                throw new NumberFormatException();
            }
            return port;
        } catch (NumberFormatException e) {
            throw new AddressException("instrument address '" + text + "': port '" + p + "' is not 1 to 65535");
        }
    }

    /** Refuses options the scheme does not know, naming the bad key and the allowed ones. */
    public void requireOptions(Set<String> allowed) {
        for (String key : options.keySet()) {
            if (!allowed.contains(key)) {
                throw new AddressException("instrument address '" + text + "': unknown option '" + key + "' for "
                        + scheme + "; allowed: " + String.join(", ", allowed.stream().sorted().toList()));
            }
        }
    }

    /** An option as a whole number within [min, max], or the default. */
    public int intOption(String key, int def, int min, int max) {
        String v = options.get(key);
        if (v == null) {
            return def;
        }
        try {
            int n = Integer.parseInt(v);
            if (n < min || n > max) {
                throw new NumberFormatException();
            }
            return n;
        } catch (NumberFormatException e) {
            throw new AddressException("instrument address '" + text + "': " + key + "=" + v + " is not a whole number "
                    + min + " to " + max);
        }
    }

    /** An option out of a fixed set of words, or the default. */
    public String wordOption(String key, String def, Set<String> allowed) {
        String v = options.get(key);
        if (v == null) {
            return def;
        }
        String lower = v.toLowerCase(Locale.ROOT);
        if (!allowed.contains(lower)) {
            throw new AddressException("instrument address '" + text + "': " + key + "=" + v + " is not allowed; allowed: "
                    + String.join(", ", allowed.stream().sorted().toList()));
        }
        return lower;
    }

    /** The message terminator option: {@code term=lf} (default), {@code crlf} or {@code cr}. */
    public String terminator() {
        return switch (wordOption("term", "lf", Set.of("lf", "crlf", "cr"))) {
            case "crlf" -> "\r\n";
            case "cr" -> "\r";
            default -> "\n";
        };
    }

    private static String schemeList() {
        return String.join(", ", Transports.schemes());
    }

    @Override
    public String toString() {
        return text;
    }
}
