package org.lrbench.sim.scpi;

import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.lrbench.scpi.DefiniteBlock;

/** One received command or query: its header suffix and its parameters, with typed accessors. */
public final class Call {
    private static final Pattern NUMBER =
            Pattern.compile("([+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?)\\s*([A-Za-z]*)");
    /** IEEE 488.2 suffix multipliers (7.7.3.4); "M" is milli, "MA" mega. */
    private static final Map<String, Double> MULTIPLIERS = Map.ofEntries(
            Map.entry("", 1.0), Map.entry("EX", 1e18), Map.entry("PE", 1e15), Map.entry("T", 1e12),
            Map.entry("G", 1e9), Map.entry("MA", 1e6), Map.entry("K", 1e3), Map.entry("M", 1e-3),
            Map.entry("U", 1e-6), Map.entry("N", 1e-9), Map.entry("P", 1e-12), Map.entry("F", 1e-15));
    private static final List<String> UNITS = List.of("OHM", "VPP", "VPK", "HZ", "V", "S");

    private final String header;
    private final int suffix;
    private final List<String> parameters;

    Call(String header, int suffix, List<String> parameters) {
        this.header = header;
        this.suffix = suffix;
        this.parameters = parameters;
    }

    public String header() {
        return header;
    }

    public int suffix() {
        return suffix;
    }

    public int count() {
        return parameters.size();
    }

    /** Requires between min and max parameters. */
    public Call expect(int min, int max) throws ScpiFault {
        if (parameters.size() < min) {
            throw ScpiFault.missingParameter(header);
        }
        if (parameters.size() > max) {
            throw ScpiFault.parameterNotAllowed(header);
        }
        return this;
    }

    /** Requires the suffix to lie in [1, max]. */
    public int suffixUpTo(int max) throws ScpiFault {
        if (suffix < 1 || suffix > max) {
            throw ScpiFault.suffixOutOfRange(header);
        }
        return suffix;
    }

    public String text(int index) {
        return parameters.get(index);
    }

    /**
     * A numeric parameter, with MINimum, MAXimum and DEFault resolved and suffix multipliers applied;
     * outside [min, max] it is error -222.
     */
    public double number(int index, double min, double max, double def) throws ScpiFault {
        String p = parameters.get(index).trim();
        if (plainDecimal(p)) {
            // the common case, a plain decimal number without a suffix (an arbitrary waveform has thousands)
            double value;
            try {
                value = Double.parseDouble(p);
            } catch (NumberFormatException e) {
                throw ScpiFault.dataType(header + " " + p);
            }
            if (!(value >= min && value <= max)) {
                throw ScpiFault.outOfRange(header + " " + p);
            }
            return value;
        }
        String upper = p.toUpperCase(Locale.ROOT);
        if (upper.equals("MIN") || upper.equals("MINIMUM")) {
            return min;
        }
        if (upper.equals("MAX") || upper.equals("MAXIMUM")) {
            return max;
        }
        if (upper.equals("DEF") || upper.equals("DEFAULT")) {
            return def;
        }
        Matcher m = NUMBER.matcher(p);
        if (!m.matches()) {
            throw ScpiFault.dataType(header + " " + p);
        }
        double value = Double.parseDouble(m.group(1)) * multiplier(m.group(2).toUpperCase(Locale.ROOT));
        if (!(value >= min && value <= max)) {
            throw ScpiFault.outOfRange(header + " " + p);
        }
        return value;
    }

    /**
     * A definite-length block parameter's bytes (IEEE 488.2 7.7.6); error -161 (invalid block data)
     * when the parameter is not one.
     */
    public byte[] block(int index) throws ScpiFault {
        byte[] data = DefiniteBlock.data(parameters.get(index));
        if (data == null) {
            throw ScpiFault.invalidBlock(header + ": expected a definite-length block");
        }
        return data;
    }

    /** Whether the parameter is a definite-length block. */
    public boolean isBlock(int index) {
        String p = parameters.get(index);
        return !p.isEmpty() && p.charAt(0) == '#' && DefiniteBlock.data(p) != null;
    }

    /** Digits, signs, a point and exponent letters only, starting with a digit, sign or point. */
    private static boolean plainDecimal(String p) {
        if (p.isEmpty()) {
            return false;
        }
        char first = p.charAt(0);
        if (!(first >= '0' && first <= '9' || first == '+' || first == '-' || first == '.')) {
            return false;
        }
        for (int i = 1; i < p.length(); i++) {
            char c = p.charAt(i);
            if (!(c >= '0' && c <= '9' || c == '+' || c == '-' || c == '.' || c == 'e' || c == 'E')) {
                return false;
            }
        }
        return true;
    }

    /** A character parameter matched against long-form mnemonics (long or short accepted). */
    public String word(int index, String... longForms) throws ScpiFault {
        String p = parameters.get(index).trim().toUpperCase(Locale.ROOT);
        for (String candidate : longForms) {
            String shortForm = candidate.chars().filter(c -> Character.isUpperCase(c) || Character.isDigit(c))
                    .collect(StringBuilder::new, StringBuilder::appendCodePoint, StringBuilder::append).toString();
            if (p.equals(candidate.toUpperCase(Locale.ROOT)) || p.equals(shortForm)) {
                return shortForm;
            }
        }
        throw ScpiFault.illegalValue(header + " " + parameters.get(index).trim());
    }

    /** A boolean parameter: ON, OFF, 1 or 0. */
    public boolean bool(int index) throws ScpiFault {
        String p = parameters.get(index).trim().toUpperCase(Locale.ROOT);
        switch (p) {
            case "ON", "1" -> {
                return true;
            }
            case "OFF", "0" -> {
                return false;
            }
            default -> throw ScpiFault.illegalValue(header + " " + p);
        }
    }

    private double multiplier(String suffixText) throws ScpiFault {
        if (suffixText.equals("MHZ")) {
            return 1e6;
        }
        if (suffixText.equals("MOHM")) {
            return 1e6;
        }
        String rest = suffixText;
        for (String unit : UNITS) {
            if (rest.endsWith(unit)) {
                rest = rest.substring(0, rest.length() - unit.length());
                break;
            }
        }
        Double m = MULTIPLIERS.get(rest);
        if (m == null) {
            throw ScpiFault.invalidSuffix(header + " " + suffixText);
        }
        return m;
    }
}
