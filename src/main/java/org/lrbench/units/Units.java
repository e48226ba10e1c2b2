package org.lrbench.units;

import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The one parser and formatter of quantities: a decimal number, optional spaces, then an SI unit
 * symbol with an optional SI prefix ({@code 470 uH}, {@code 1.5kHz}, {@code 100 ohm}, {@code 20 ms}),
 * or a percent sign ({@code 10 %}). A bare number is dimensionless.
 */
public final class Units {

    private static final Pattern NUMBER_THEN_UNIT =
            Pattern.compile("^([+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?)\\s*(\\S*)$");

    /** Unit symbols, longest first so that "Hz" is tried before "H". */
    private static final List<Map.Entry<String, Dimension>> SYMBOLS = List.of(
            Map.entry("ohm", Dimension.RESISTANCE),
            Map.entry("Ohm", Dimension.RESISTANCE),
            Map.entry("Hz", Dimension.FREQUENCY),
            Map.entry("\u03A9", Dimension.RESISTANCE),
            Map.entry("V", Dimension.VOLTAGE),
            Map.entry("A", Dimension.CURRENT),
            Map.entry("H", Dimension.INDUCTANCE),
            Map.entry("F", Dimension.CAPACITANCE),
            Map.entry("s", Dimension.TIME),
            Map.entry("m", Dimension.LENGTH),
            Map.entry("\u00B0C", Dimension.TEMPERATURE),
            Map.entry("degC", Dimension.TEMPERATURE),
            Map.entry("C", Dimension.TEMPERATURE));

    private static final Map<String, Double> PREFIXES = Map.of(
            "p", 1e-12, "n", 1e-9, "u", 1e-6, "\u00B5", 1e-6, "m", 1e-3,
            "k", 1e3, "M", 1e6, "G", 1e9);

    private static final String ALLOWED = "a number with a unit such as 470 uH, 2.2 mH, 1 kHz, 100 ohm,"
            + " 3 V, 20 ms, 12 pF, 0.5 mm, 10 %, 50 ppm (prefixes p n u m k M G)";

    private Units() {
    }

    /** Parses any quantity; the caller checks the dimension. */
    public static Quantity parse(String text) {
        if (text != null) {
            for (int i = 0; i < text.length(); i++) {
                char c = text.charAt(i);
                if (Character.isISOControl(c) && c != ' ') {
                    // trim() would drop a NUL or a control character silently: a quantity has none
                    throw new UnitException(String.format(java.util.Locale.ROOT, "'%s' holds the control character"
                            + " U+%04X at position %d; a quantity is a number and a unit only",
                            text.replaceAll("\\p{Cntrl}", "?"), (int) c, i + 1));
                }
            }
        }
        String trimmed = text == null ? "" : text.trim();
        Matcher m = NUMBER_THEN_UNIT.matcher(trimmed);
        if (!m.matches()) {
            throw new UnitException("'" + trimmed + "' is not " + ALLOWED);
        }
        double number = Double.parseDouble(m.group(1));
        String unit = m.group(2);
        if (unit.isEmpty()) {
            return Quantity.of(number, Dimension.NONE);
        }
        if (unit.equals("%")) {
            return new Quantity(number / 100.0, Dimension.NONE, true);
        }
        if (unit.equals("ppm")) {
            return new Quantity(number * 1e-6, Dimension.NONE, true);
        }
        for (Map.Entry<String, Dimension> symbol : SYMBOLS) {
            if (unit.endsWith(symbol.getKey())) {
                String prefix = unit.substring(0, unit.length() - symbol.getKey().length());
                Double scale = prefix.isEmpty() ? Double.valueOf(1.0) : PREFIXES.get(prefix);
                if (scale != null && !prefix.isEmpty() && symbol.getValue() == Dimension.TEMPERATURE) {
                    throw new UnitException("'" + trimmed + "': a temperature takes no prefix; give degrees Celsius,"
                            + " such as 23 C");
                }
                if (scale != null) {
                    return Quantity.of(number * scale, symbol.getValue());
                }
            }
        }
        throw new UnitException("unknown unit '" + unit + "' in '" + trimmed + "'; expected " + ALLOWED);
    }

    /** Parses a quantity and requires the given dimension; percent is refused. */
    public static double parse(String text, Dimension expected) {
        Quantity q = parse(text);
        if (q.relative()) {
            throw new UnitException("'" + text.trim() + "' is a percentage; expected " + expected.describe());
        }
        if (q.dimension() != expected) {
            throw new UnitException("'" + text.trim() + "' is " + q.dimension().describe()
                    + "; expected " + expected.describe());
        }
        return q.value();
    }

    /**
     * Formats a value with an engineering prefix and four significant digits: "1.000 mH". A pure
     * number (a quality factor) gets no prefix: "0.01532", not "15.32 m".
     */
    public static String format(double value, Dimension dimension) {
        String unit = dimension.symbol();
        if (dimension == Dimension.NONE && Double.isFinite(value)) {
            return String.format(Locale.ROOT, "%.4g", value);
        }
        if (value == 0 || !Double.isFinite(value)) {
            return String.format(Locale.ROOT, "%s %s", value, unit).trim();
        }
        String[] prefixes = {"p", "n", "u", "m", "", "k", "M", "G"};
        if (Math.abs(value) < 1e-15 || Math.abs(value) >= 1e15) {
            // beyond the prefixes' reach a prefixed figure would read 0.000 p or thousands of G: the exponent instead
            return String.format(Locale.ROOT, "%.3e %s", value, unit).trim();
        }
        int exp3 = (int) Math.floor(Math.log10(Math.abs(value)) / 3.0);
        exp3 = Math.max(-4, Math.min(3, exp3));
        double scaled = value / Math.pow(10, exp3 * 3);
        String digits = String.format(Locale.ROOT, "%.4g", scaled);
        if (exp3 < 3 && Math.abs(Double.parseDouble(digits)) >= 1000) {
            // 999.97 u rounds to 1000 u: that is 1.000 m
            exp3++;
            scaled = value / Math.pow(10, exp3 * 3);
            digits = String.format(Locale.ROOT, "%.4g", scaled);
        }
        if (digits.contains("e")) {
            digits = String.format(Locale.ROOT, "%.3f", scaled);
        }
        return (digits + " " + prefixes[exp3 + 4] + unit).trim();
    }

    /** As {@link #format}, without trailing zeros, for axis ticks: "200 Hz", "1 kHz", "2.5 mohm". */
    public static String formatTick(double value, Dimension dimension) {
        if (dimension == Dimension.NONE || value == 0 || !Double.isFinite(value)) {
            // a pure number (a quality factor): no prefix
            return String.format(Locale.ROOT, "%.4g", value).replaceAll("(\\.\\d*?)0+$", "$1").replaceAll("\\.$", "");
        }
        String f = format(value, dimension);
        int space = f.indexOf(' ');
        if (space < 0) {
            return f;
        }
        String number = f.substring(0, space);
        if (number.contains(".")) {
            number = number.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return number + f.substring(space);
    }

    /**
     * A value and its expanded uncertainty in one SI prefix, U to two significant figures and the
     * value to the same decimal place (JCGM 100:2008 7.2.6: U with at most two significant digits,
     * the result rounded to match): "1.0120 mH +/- 0.0017 mH" as "1.0120 +/- 0.0017 mH".
     */
    public static String formatWithUncertainty(double value, double u, Dimension dimension) {
        if (!Double.isFinite(value)) {
            return format(value, dimension);
        }
        if (!(u > 0) || !Double.isFinite(u)) {
            return format(value, dimension);
        }
        String[] prefixes = {"p", "n", "u", "m", "", "k", "M", "G"};
        double ref = Math.abs(value) > 0 ? Math.abs(value) : u;
        int exp3 = dimension == Dimension.NONE ? 0 : Math.max(-4, Math.min(3, (int) Math.floor(Math.log10(ref) / 3.0)));
        double scale = Math.pow(10, exp3 * 3);
        double v = value / scale;
        double uu = u / scale;
        // the decimal place of U's second significant figure
        int place = (int) Math.floor(Math.log10(uu)) - 1;
        int decimals = Math.max(0, -place);
        double q = Math.pow(10, place);
        double uRounded = Math.ceil(uu / q - 1e-9) * q; // an uncertainty is rounded up, never down
        String unit = (dimension == Dimension.NONE ? "" : " " + prefixes[exp3 + 4] + dimension.symbol());
        return String.format(Locale.ROOT, "%." + decimals + "f \u00b1 %." + decimals + "f", Math.rint(v / q) * q, uRounded)
                + unit;
    }
}
