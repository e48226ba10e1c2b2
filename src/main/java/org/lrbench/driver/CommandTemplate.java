package org.lrbench.driver;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.lrbench.scpi.DefiniteBlock;
import org.lrbench.scpi.ScpiNumbers;

/**
 * A SCPI command with {@code {name}} placeholders, from a driver file. The values put into it are
 * produced by lrbench itself (SCPI numbers, or words from the driver's own tables), never text from
 * a plan or an operator, so nothing can inject a second command. A numeric placeholder may carry
 * one factor, {@code {range*0.5}} or {@code {interval/10}}, for an instrument that wants a value
 * lrbench supplies in another scale (half the range, the time per division of a ten-division
 * screen); the result is sent as a SCPI NR3 number.
 */
public final class CommandTemplate {
    private static final Pattern PLACEHOLDER = Pattern.compile(
            "([a-z0-9_]+)(?:([*/])([0-9]+(?:\\.[0-9]+)?(?:[eE][-+]?[0-9]+)?))?");
    /** Placeholders whose values are words from the driver's tables or channel lists: no arithmetic. */
    private static final Set<String> WORDS = Set.of("shape", "coupling", "source", "slope", "channels");
    private final String text;
    private final List<String> placeholders;

    private CommandTemplate(String text, List<String> placeholders) {
        this.text = text;
        this.placeholders = List.copyOf(placeholders);
    }

    /**
     * Parses a template and checks its placeholders against the allowed ones.
     *
     * @throws IllegalArgumentException naming the first bad placeholder or brace
     */
    public static CommandTemplate parse(String text, Set<String> allowed) {
        List<String> found = new ArrayList<>();
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == '\n' || c == '\r' || c < 0x20 || c > 0x7e) {
                throw new IllegalArgumentException("a control or non-ASCII character at index " + i);
            }
            if (c == '}') {
                throw new IllegalArgumentException("'}' at index " + i + " closes no placeholder");
            }
            if (c == '{') {
                int end = text.indexOf('}', i);
                if (end < 0) {
                    throw new IllegalArgumentException("'{' at index " + i + " is never closed");
                }
                String inside = text.substring(i + 1, end);
                Matcher m = PLACEHOLDER.matcher(inside);
                String name = m.matches() ? m.group(1) : inside;
                if (!allowed.contains(name)) {
                    throw new IllegalArgumentException("unknown placeholder {" + inside + "} at index " + i
                            + "; allowed here: " + (allowed.isEmpty() ? "none" : String.join(", ", sorted(allowed))));
                }
                if (m.group(2) != null) {
                    if (WORDS.contains(name)) {
                        throw new IllegalArgumentException("{" + inside + "} at index " + i + ": {" + name
                                + "} is a word, not a number; only numbers take a factor");
                    }
                    if (!(Double.parseDouble(m.group(3)) > 0)) {
                        throw new IllegalArgumentException("{" + inside + "} at index " + i + ": the factor must be positive");
                    }
                }
                found.add(name);
                i = end;
            }
        }
        return new CommandTemplate(text, found);
    }

    /** Fills every placeholder; values must be SCPI-safe tokens (checked). */
    public String render(Map<String, String> values) {
        StringBuilder out = new StringBuilder();
        int i = 0;
        while (i < text.length()) {
            char c = text.charAt(i);
            if (c == '{') {
                int end = text.indexOf('}', i);
                Matcher m = PLACEHOLDER.matcher(text.substring(i + 1, end));
                m.matches();
                String name = m.group(1);
                String value = values.get(name);
                if (value == null) {
                    throw new IllegalStateException("no value for placeholder {" + name + "} in '" + text + "'");
                }
                requireToken(name, value);
                if (m.group(2) != null) {
                    double k = Double.parseDouble(m.group(3));
                    double v = ScpiNumbers.parse(value);
                    value = ScpiNumbers.nr3(m.group(2).equals("*") ? v * k : v / k);
                }
                out.append(value);
                i = end + 1;
            } else {
                out.append(c);
                i++;
            }
        }
        return out.toString();
    }

    public List<String> placeholders() {
        return placeholders;
    }

    public String text() {
        return text;
    }

    /** A value may hold only what SCPI numbers and mnemonics are made of. */
    static void requireToken(String name, String value) {
        // a SCPI channel list of whole channel numbers, "(@101)" or "(@101,102)", is another form, and
        // {points} alone (an arbitrary waveform's) takes numbers separated by commas or one definite block
        if (!value.matches("[A-Za-z0-9+\\-.]+") && !value.matches("\\(@[0-9]{1,6}(,[0-9]{1,6})*\\)")
                && !(name.equals("points") && (numberList(value) || DefiniteBlock.data(value) != null))) {
            throw new IllegalArgumentException("value '" + value + "' for {" + name
                    + "} is not a SCPI number or mnemonic (letters, digits, + - . only)");
        }
    }

    /** Decimal numbers separated by single commas (checked by hand: a regular expression would recurse per item). */
    private static boolean numberList(String value) {
        if (value.isEmpty() || value.charAt(0) == ',' || value.charAt(value.length() - 1) == ',') {
            return false;
        }
        for (int i = 0; i < value.length(); i++) {
            char c = value.charAt(i);
            boolean ok = c >= '0' && c <= '9' || c == '+' || c == '-' || c == '.' || c == 'E' || c == 'e'
                    || c == ',' && value.charAt(i - 1) != ',';
            if (!ok) {
                return false;
            }
        }
        return true;
    }

    private static List<String> sorted(Set<String> s) {
        return s.stream().sorted().toList();
    }

    @Override
    public String toString() {
        return text;
    }
}
