package org.lrbench.scpi;

import java.nio.charset.StandardCharsets;

/**
 * IEEE 488.2 definite-length arbitrary block program data (7.7.6): {@code #}, one digit d (1 to 9),
 * d digits giving the byte count, then that many bytes of any value. In a program message held as
 * a Java string, each byte is one character from U+0000 to U+00FF (ISO 8859-1), so a message with
 * a block is sent byte for byte.
 */
public final class DefiniteBlock {

    private DefiniteBlock() {
    }

    /** The block for {@code data}, as ISO 8859-1 characters. */
    public static String of(byte[] data) {
        String count = Integer.toString(data.length);
        return "#" + count.length() + count + new String(data, StandardCharsets.ISO_8859_1);
    }

    /**
     * Where the block that starts at {@code at} (its {@code #}) ends, exclusive; -1 when no definite
     * block starts there (no '#', '#0' for an indefinite block, or a header that does not fit).
     */
    public static int end(CharSequence text, int at) {
        if (at + 1 >= text.length() || text.charAt(at) != '#') {
            return -1;
        }
        char d = text.charAt(at + 1);
        if (d < '1' || d > '9') {
            return -1;
        }
        int digits = d - '0';
        if (at + 2 + digits > text.length()) {
            return -1;
        }
        long count = 0;
        for (int i = at + 2; i < at + 2 + digits; i++) {
            char c = text.charAt(i);
            if (c < '0' || c > '9') {
                return -1;
            }
            count = count * 10 + (c - '0');
        }
        long end = at + 2L + digits + count;
        return end <= text.length() ? (int) end : -1;
    }

    /** The bytes of the block that is all of {@code text}; null when it is not one definite block. */
    public static byte[] data(String text) {
        if (end(text, 0) != text.length()) {
            return null;
        }
        int digits = text.charAt(1) - '0';
        return text.substring(2 + digits).getBytes(StandardCharsets.ISO_8859_1);
    }
}
