package org.lrbench.scpi;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/**
 * A SCPI conversation with one instrument over any {@link Transport}: program messages out,
 * response messages and IEEE 488.2 definite-length blocks in, each bounded in size and time.
 * Every failure names the instrument, the command, what came back and how long it waited.
 */
public final class ScpiSession implements AutoCloseable {
    /** Longest text reply accepted. */
    public static final int MAX_LINE = 1 << 20;
    /** Largest binary block accepted. */
    public static final long MAX_BLOCK = 256L << 20;
    private static final int MAX_ERRORS_DRAINED = 64;

    private final String instrument;
    private final Transport transport;
    private final Duration timeout;
    private final byte[] buffer = new byte[64 * 1024];
    private int position;
    private int limit;

    public ScpiSession(String instrument, Transport transport, Duration timeout) {
        this.instrument = Objects.requireNonNull(instrument, "instrument");
        this.transport = Objects.requireNonNull(transport, "transport");
        this.timeout = Objects.requireNonNull(timeout, "timeout");
    }

    public String instrument() {
        return instrument;
    }

    /** Sends one program message; the text must not carry its own terminator. */
    public synchronized void write(String command) {
        requireSingleMessage(command);
        try {
            transport.write((command + "\n").getBytes(StandardCharsets.US_ASCII));
        } catch (IOException e) {
            throw new InstrumentException(instrument + " (" + transport.address() + "): sending '" + command
                    + "' failed: " + e.getMessage(), e);
        }
    }

    /** Sends a query and returns its response message without the terminator. */
    public synchronized String query(String command) {
        write(command);
        long start = System.nanoTime();
        try {
            return readLine(command);
        } catch (TransportTimeoutException e) {
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): no reply to '" + command
                    + "' after " + elapsedMillis(start) + " ms (timeout " + timeout.toMillis() + " ms)", e);
        } catch (IOException e) {
            throw new InstrumentException(instrument + " (" + transport.address() + "): reading the reply to '"
                    + command + "' failed after " + elapsedMillis(start) + " ms: " + e.getMessage(), e);
        }
    }

    /** Sends a query whose response is one definite-length arbitrary block; returns its bytes. */
    public synchronized byte[] queryBlock(String command) {
        write(command);
        long start = System.nanoTime();
        try {
            return readBlock();
        } catch (BlockFormatException e) {
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): reply to '" + command
                    + "' is not a valid block: " + e.getMessage(), e);
        } catch (TransportTimeoutException e) {
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): block reply to '" + command
                    + "' incomplete after " + elapsedMillis(start) + " ms (timeout " + timeout.toMillis() + " ms)", e);
        } catch (IOException e) {
            throw new InstrumentException(instrument + " (" + transport.address() + "): reading the block reply to '"
                    + command + "' failed: " + e.getMessage(), e);
        }
    }

    /** {@code *IDN?} parsed into its four fields. */
    public Identity identify() {
        String reply = query("*IDN?");
        try {
            return Identity.parse(reply);
        } catch (IllegalArgumentException e) {
            throw new InstrumentException(instrument + ": " + e.getMessage());
        }
    }

    /** Waits for pending operations with {@code *OPC?}, which answers 1 when they are done. */
    public void waitComplete() {
        String reply = query("*OPC?").trim();
        if (!reply.equals("1") && !reply.equals("+1")) {
            throw new InstrumentException(instrument + ": *OPC? answered '" + reply + "', expected 1");
        }
    }

    /** Reads the error queue until it reports no error. */
    public List<ScpiError> drainErrors(String errorQuery) {
        List<ScpiError> errors = new ArrayList<>();
        for (int i = 0; i < MAX_ERRORS_DRAINED; i++) {
            String reply = query(errorQuery);
            ScpiError error;
            try {
                error = ScpiError.parse(reply);
            } catch (IllegalArgumentException e) {
                throw new InstrumentException(instrument + ": " + e.getMessage());
            }
            if (error.isNoError()) {
                return errors;
            }
            errors.add(error);
        }
        throw new InstrumentException(instrument + ": error queue still not empty after " + MAX_ERRORS_DRAINED
                + " reads of '" + errorQuery + "': " + errors);
    }

    /** Drains the error queue and throws, naming the command that caused them, if it held any. */
    public void checkErrors(String errorQuery, String afterCommand) {
        List<ScpiError> errors = drainErrors(errorQuery);
        if (!errors.isEmpty()) {
            throw new InstrumentException(instrument + ": '" + afterCommand + "' caused " + errors);
        }
    }

    @Override
    public void close() throws IOException {
        transport.close();
    }

    private void flushLateReplies() {
        position = 0;
        limit = 0;
        try {
            transport.discardInput();
        } catch (IOException ignored) {
            // the link is already failing; the caller reports the original fault
        }
    }

    private String readLine(String command) throws IOException {
        ByteArrayOutputStream line = new ByteArrayOutputStream();
        while (true) {
            int b = nextByte();
            if (b == '\n') {
                break;
            }
            if (line.size() >= MAX_LINE) {
                flushLateReplies();
                throw new InstrumentException(instrument + ": reply to '" + command + "' is longer than "
                        + MAX_LINE + " bytes without a terminator");
            }
            line.write(b);
        }
        String text = line.toString(StandardCharsets.ISO_8859_1);
        return text.endsWith("\r") ? text.substring(0, text.length() - 1) : text;
    }

    private byte[] readBlock() throws IOException {
        int hash = nextByte();
        if (hash != '#') {
            throw new BlockFormatException("expected '#' to start a block, got " + describe(hash));
        }
        int digitsChar = nextByte();
        if (digitsChar < '0' || digitsChar > '9') {
            throw new BlockFormatException("expected a digit after '#', got " + describe(digitsChar));
        }
        int digits = digitsChar - '0';
        if (digits == 0) {
            throw new BlockFormatException("indefinite-length block (#0) is not accepted on this link");
        }
        long length = 0;
        for (int i = 0; i < digits; i++) {
            int c = nextByte();
            if (c < '0' || c > '9') {
                throw new BlockFormatException("length digit " + (i + 1) + " of " + digits + " is " + describe(c));
            }
            length = length * 10 + (c - '0');
        }
        if (length > MAX_BLOCK) {
            throw new BlockFormatException("block length (" + length + ") exceeds the allowed maximum (" + MAX_BLOCK + ")");
        }
        byte[] data = new byte[(int) length];
        int filled = 0;
        while (filled < length) {
            if (position == limit) {
                fill();
            }
            int n = Math.min(limit - position, data.length - filled);
            System.arraycopy(buffer, position, data, filled, n);
            position += n;
            filled += n;
        }
        int end = nextByte();
        if (end == '\r') {
            end = nextByte();
        }
        if (end != '\n') {
            throw new BlockFormatException("block of " + length + " bytes is followed by " + describe(end)
                    + " instead of the terminator (declared length wrong?)");
        }
        return data;
    }

    private int nextByte() throws IOException {
        if (position == limit) {
            fill();
        }
        return buffer[position++] & 0xff;
    }

    private void fill() throws IOException {
        position = 0;
        limit = transport.read(buffer, 0, buffer.length, timeout);
    }

    private static String describe(int b) {
        return b >= 0x20 && b < 0x7f ? "'" + (char) b + "'" : String.format("byte 0x%02x", b);
    }

    private static long elapsedMillis(long startNanos) {
        return (System.nanoTime() - startNanos) / 1_000_000;
    }

    private static void requireSingleMessage(String command) {
        for (int i = 0; i < command.length(); i++) {
            char c = command.charAt(i);
            if (c == '\n' || c == '\r' || c < 0x20 || c > 0x7e) {
                throw new IllegalArgumentException("command '" + command.replace("\n", "\\n")
                        + "' holds a control or non-ASCII character at index " + i);
            }
        }
    }
}
