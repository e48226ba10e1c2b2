package org.lrbench.scpi;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.Locale;

/**
 * How a digitizer encodes trace samples in a block: signed or unsigned integers of 8 or 16 bits (16 in
 * either byte order; an unsigned code's zero volts is wherever the scaling puts it, such as code 512 of
 * a 10-bit converter), IEEE 754 floats of 32 or 64 bits, ASCII numbers separated by commas or blanks on
 * one line, or ASCII numbers one per line.
 */
public enum TraceEncoding {
    INT8("int8", 1, true),
    INT16_BIG("int16-big", 2, true),
    INT16_LITTLE("int16-little", 2, true),
    UINT8("uint8", 1, true),
    UINT16_BIG("uint16-big", 2, true),
    UINT16_LITTLE("uint16-little", 2, true),
    REAL32_BIG("real32-big", 4, false),
    REAL32_LITTLE("real32-little", 4, false),
    REAL64_BIG("real64-big", 8, false),
    ASCII("ascii", 0, false),
    /** ASCII numbers one per line: the reply is as many lines as the record has samples. */
    ASCII_LINES("ascii-lines", 0, false);

    private final String key;
    private final int bytesPerSample;
    private final boolean integer;

    TraceEncoding(String key, int bytesPerSample, boolean integer) {
        this.key = key;
        this.bytesPerSample = bytesPerSample;
        this.integer = integer;
    }

    /** Bytes per sample on the wire; for ASCII about 14 (a signed six-digit mantissa, exponent, separator). */
    public int bytesOnWire() {
        return bytesPerSample > 0 ? bytesPerSample : 14;
    }

    public String key() {
        return key;
    }

    public boolean isInteger() {
        return integer;
    }

    public boolean isBinary() {
        return bytesPerSample > 0;
    }

    /** Whether the integer codes are unsigned. */
    public boolean isUnsigned() {
        return this == UINT8 || this == UINT16_BIG || this == UINT16_LITTLE;
    }

    /** Smallest and largest integer code; only for integer encodings. */
    public int minCode() {
        return isUnsigned() ? 0 : bytesPerSample == 1 ? Byte.MIN_VALUE : Short.MIN_VALUE;
    }

    public int maxCode() {
        return isUnsigned() ? (bytesPerSample == 1 ? 0xFF : 0xFFFF) : bytesPerSample == 1 ? Byte.MAX_VALUE : Short.MAX_VALUE;
    }

    public static TraceEncoding byKey(String key) {
        for (TraceEncoding e : values()) {
            if (e.key.equals(key.toLowerCase(Locale.ROOT))) {
                return e;
            }
        }
        return null;
    }

    /** Decodes a binary block; its length must be a whole number of samples. */
    public double[] decode(byte[] block) {
        if (!isBinary()) {
            throw new IllegalStateException(key + " traces are text, not blocks");
        }
        if (block.length % bytesPerSample != 0) {
            throw new BlockFormatException("block of " + block.length + " bytes is not a whole number of "
                    + bytesPerSample + "-byte " + key + " samples");
        }
        int n = block.length / bytesPerSample;
        double[] out = new double[n];
        ByteBuffer bb = ByteBuffer.wrap(block);
        bb.order(this == INT16_LITTLE || this == UINT16_LITTLE || this == REAL32_LITTLE ? ByteOrder.LITTLE_ENDIAN
                : ByteOrder.BIG_ENDIAN);
        for (int i = 0; i < n; i++) {
            out[i] = switch (this) {
                case INT8 -> bb.get();
                case INT16_BIG, INT16_LITTLE -> bb.getShort();
                case UINT8 -> bb.get() & 0xFF;
                case UINT16_BIG, UINT16_LITTLE -> bb.getShort() & 0xFFFF;
                case REAL32_BIG, REAL32_LITTLE -> bb.getFloat();
                case REAL64_BIG -> bb.getDouble();
                case ASCII, ASCII_LINES -> throw new IllegalStateException();
            };
        }
        return out;
    }

    /** Decodes an ASCII trace reply: numbers separated by commas. */
    public static double[] decodeAscii(String reply) {
        String t = reply.trim();
        if (t.isEmpty()) {
            return new double[0];
        }
        // values separated by commas, blanks, or both (instruments differ)
        String[] parts = t.split("[,\\s]+");
        double[] out = new double[parts.length];
        for (int i = 0; i < parts.length; i++) {
            try {
                out[i] = ScpiNumbers.parse(parts[i]);
            } catch (NumberFormatException e) {
                throw new BlockFormatException("ASCII trace value " + (i + 1) + " is '" + parts[i].trim() + "'");
            }
        }
        return out;
    }
}
