package org.lrbench.yaml;

import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/**
 * Whether a file's bytes are UTF-8, and if not what they likely are: a byte order mark names UTF-16 or
 * UTF-32 (Unicode Standard, 3.10, from memory); zero bytes at every other position are UTF-16 without
 * one; bytes that are not valid UTF-8 sequences are most likely a single-byte encoding such as Latin-1
 * or Windows-1252 (common practice, no source). The problem says which and how to fix it.
 */
final class TextEncoding {

    private TextEncoding() {
    }

    /** Null when the bytes are UTF-8; else what they look like and the fix, in words. */
    static String problem(byte[] b) {
        String fix = "; save it as UTF-8 (in most editors: Save As, encoding UTF-8)";
        if (b.length >= 4 && (b[0] == 0 && b[1] == 0 && (b[2] & 0xff) == 0xFE && (b[3] & 0xff) == 0xFF
                || (b[0] & 0xff) == 0xFF && (b[1] & 0xff) == 0xFE && b[2] == 0 && b[3] == 0)) {
            return "is not UTF-8: it starts with a UTF-32 byte order mark" + fix;
        }
        if (b.length >= 2 && ((b[0] & 0xff) == 0xFE && (b[1] & 0xff) == 0xFF || (b[0] & 0xff) == 0xFF && (b[1] & 0xff) == 0xFE)) {
            return "is not UTF-8: it starts with a UTF-16 byte order mark" + fix;
        }
        int zeros = 0;
        for (byte x : b) {
            if (x == 0) {
                zeros++;
            }
        }
        if (b.length >= 4 && zeros * 4 >= b.length) {
            return "is not UTF-8: " + zeros + " of its " + b.length + " bytes are zero, as in UTF-16 or UTF-32 text" + fix;
        }
        try {
            StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(b));
            return null;
        } catch (CharacterCodingException e) {
            int at = firstInvalid(b);
            int line = 1;
            int column = 1;
            for (int i = 0; i < at; i++) {
                if (b[i] == '\n') {
                    line++;
                    column = 1;
                } else {
                    column++;
                }
            }
            return String.format(java.util.Locale.ROOT, "is not UTF-8: byte 0x%02X at line %d, column %d is not part of"
                    + " a UTF-8 character; it looks like a single-byte encoding such as Latin-1 or Windows-1252%s",
                    b[at] & 0xff, line, column, fix);
        }
    }

    /** The offset of the first byte that does not start or continue a valid UTF-8 sequence. */
    private static int firstInvalid(byte[] b) {
        int i = 0;
        while (i < b.length) {
            int c = b[i] & 0xff;
            int n = c < 0x80 ? 0 : c >= 0xC2 && c < 0xE0 ? 1 : c >= 0xE0 && c < 0xF0 ? 2 : c >= 0xF0 && c < 0xF5 ? 3 : -1;
            if (n < 0 || i + n >= b.length + (n == 0 ? 1 : 0) && n > 0) {
                return i;
            }
            for (int k = 1; k <= n; k++) {
                if (i + k >= b.length || (b[i + k] & 0xC0) != 0x80) {
                    return i;
                }
            }
            i += n + 1;
        }
        return Math.max(0, b.length - 1);
    }
}
