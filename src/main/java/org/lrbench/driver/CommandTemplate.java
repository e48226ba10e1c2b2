package org.lrbench.driver;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * A SCPI command with {@code {name}} placeholders, from a driver file. The values put into it are
 * produced by lrbench itself (SCPI numbers, or words from the driver's own tables), never text from
 * a plan or an operator, so nothing can inject a second command.
 */
public final class CommandTemplate {
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
                String name = text.substring(i + 1, end);
                if (!allowed.contains(name)) {
                    throw new IllegalArgumentException("unknown placeholder {" + name + "} at index " + i
                            + "; allowed here: " + (allowed.isEmpty() ? "none" : String.join(", ", sorted(allowed))));
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
                String name = text.substring(i + 1, end);
                String value = values.get(name);
                if (value == null) {
                    throw new IllegalStateException("no value for placeholder {" + name + "} in '" + text + "'");
                }
                requireToken(name, value);
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
        // a SCPI channel list of whole channel numbers, "(@101)" or "(@101,102)", is the one other form
        if (!value.matches("[A-Za-z0-9+\\-.]+") && !value.matches("\\(@[0-9]{1,6}(,[0-9]{1,6})*\\)")) {
            throw new IllegalArgumentException("value '" + value + "' for {" + name
                    + "} is not a SCPI number or mnemonic (letters, digits, + - . only)");
        }
    }

    private static List<String> sorted(Set<String> s) {
        return s.stream().sorted().toList();
    }

    @Override
    public String toString() {
        return text;
    }
}
