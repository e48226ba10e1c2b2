package org.lrbench.sim.scpi;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A command header in the notation of the SCPI standard's command tables:
 * {@code [SOURce#]:FREQuency[:CW]}. Upper-case letters form the short mnemonic, the whole word the
 * long one; {@code [ ]} marks an optional node; {@code #} a node that takes a numeric suffix
 * (default 1). A received header matches when each of its mnemonics is the long or the short form
 * of the next node, case-insensitively, optional nodes being skippable.
 */
public final class HeaderPattern {

    private record Node(String longForm, String shortForm, boolean optional, boolean suffix) {
    }

    /** A mnemonic of a received header: upper-cased letters and the numeric suffix, if any. */
    public record Token(String mnemonic, int suffix, boolean hasSuffix) {
    }

    private final String text;
    private final List<Node> nodes;

    private HeaderPattern(String text, List<Node> nodes) {
        this.text = text;
        this.nodes = nodes;
    }

    public static HeaderPattern parse(String text) {
        List<Node> nodes = new ArrayList<>();
        int i = 0;
        while (i < text.length()) {
            char c = text.charAt(i);
            if (c == ':') {
                i++;
            } else if (c == '[') {
                int end = text.indexOf(']', i);
                String inner = text.substring(i + 1, end);
                nodes.add(node(inner.startsWith(":") ? inner.substring(1) : inner, true));
                i = end + 1;
            } else {
                int end = i;
                while (end < text.length() && text.charAt(end) != ':' && text.charAt(end) != '[') {
                    end++;
                }
                nodes.add(node(text.substring(i, end), false));
                i = end;
            }
        }
        return new HeaderPattern(text, nodes);
    }

    private static Node node(String word, boolean optional) {
        boolean suffix = word.endsWith("#");
        String longForm = suffix ? word.substring(0, word.length() - 1) : word;
        StringBuilder shortForm = new StringBuilder();
        for (char ch : longForm.toCharArray()) {
            if (Character.isUpperCase(ch) || Character.isDigit(ch)) {
                shortForm.append(ch);
            }
        }
        return new Node(longForm.toUpperCase(Locale.ROOT), shortForm.toString(), optional, suffix);
    }

    /**
     * Matches received tokens.
     *
     * @return the numeric suffix of the first suffix node (1 when absent), or -1 for no match
     */
    public int match(List<Token> tokens) {
        int[] suffix = {1};
        return match(0, 0, tokens, suffix, false) ? suffix[0] : -1;
    }

    private boolean match(int ni, int ti, List<Token> tokens, int[] suffix, boolean suffixSeen) {
        if (ni == nodes.size()) {
            return ti == tokens.size();
        }
        Node node = nodes.get(ni);
        if (ti < tokens.size()) {
            Token token = tokens.get(ti);
            boolean name = token.mnemonic().equals(node.longForm()) || token.mnemonic().equals(node.shortForm());
            if (name && (!token.hasSuffix() || node.suffix())) {
                int saved = suffix[0];
                if (node.suffix() && !suffixSeen) {
                    suffix[0] = token.hasSuffix() ? token.suffix() : 1;
                }
                if (match(ni + 1, ti + 1, tokens, suffix, suffixSeen || node.suffix())) {
                    return true;
                }
                suffix[0] = saved;
            }
        }
        return node.optional() && match(ni + 1, ti, tokens, suffix, suffixSeen);
    }

    @Override
    public String toString() {
        return text;
    }
}
