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
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * A SCPI conversation with one instrument over any {@link Transport}: program messages out,
 * response messages and IEEE 488.2 arbitrary blocks in, each bounded in size and time. Every
 * failure names the instrument, the command, what came back and how long it waited. After a
 * timeout the session discards whatever arrives before its next message, so a late reply can never
 * be taken for the answer to a later query.
 */
public final class ScpiSession implements AutoCloseable {
    /** Every message to and from every instrument, at DEBUG: off unless the I/O log is asked for. */
    private static final Logger IO = LoggerFactory.getLogger("org.lrbench.io");
    /** Longest text reply accepted. */
    public static final int MAX_LINE = 64 << 20;
    /** Largest binary block accepted. */
    public static final long MAX_BLOCK = 256L << 20;
    /** Quiet time that ends an indefinite-length block on a link without message boundaries. */
    static final Duration INDEFINITE_BLOCK_QUIET = Duration.ofMillis(50);
    private static final int MAX_ERRORS_DRAINED = 64;
    /** How long the error query after a timed-out message is waited for: a queue answers at once. */
    private static final Duration AFTER_TIMEOUT = Duration.ofSeconds(1);

    private final String instrument;
    private final Transport transport;
    private final Duration timeout;
    private final byte[] terminator;
    private final byte[] buffer = new byte[256 * 1024];
    private int position;
    private int limit;
    private boolean stale;
    private long queries;
    private long messages;
    private long ioNanos;
    /** When the reply being read must be complete (System.nanoTime): the whole reply has one deadline. */
    private long deadline;
    /** Slowest transfer of a block's bytes accepted, bytes per second (the driver's declaration). */
    private double minimumBytesPerSecond = DEFAULT_MINIMUM_RATE;
    /**
     * 1000 bytes per second: a tenth of a 115200-baud serial line's 11 520 (10 bits per byte), so any
     * working link delivers a block long before, and a trickle of one byte every few milliseconds does
     * not (common practice, no source).
     */
    public static final double DEFAULT_MINIMUM_RATE = 1000;

    public ScpiSession(String instrument, Transport transport, Duration timeout) {
        this(instrument, transport, timeout, "\n");
    }

    /**
     * @param terminator what ends a program message and a response message: "\n", "\r\n" or "\r"
     */
    public ScpiSession(String instrument, Transport transport, Duration timeout, String terminator) {
        this.instrument = Objects.requireNonNull(instrument, "instrument");
        this.transport = Objects.requireNonNull(transport, "transport");
        this.timeout = Objects.requireNonNull(timeout, "timeout");
        if (!terminator.equals("\n") && !terminator.equals("\r\n") && !terminator.equals("\r")) {
            throw new IllegalArgumentException("terminator must be LF, CR LF or CR");
        }
        this.terminator = terminator.getBytes(StandardCharsets.US_ASCII);
    }

    public String instrument() {
        return instrument;
    }

    /** How many program messages this session has sent, queries or not. */
    public synchronized long messages() {
        return messages;
    }

    /** How many queries this session has sent (each one a round trip to the instrument). */
    public synchronized long queries() {
        return queries;
    }

    /** Nanoseconds spent inside the transport, writing or waiting for replies. */
    public synchronized long ioNanos() {
        return ioNanos;
    }

    /** Sends one program message; the text must not carry its own terminator. */
    public synchronized void write(String command) {
        requireSingleMessage(command);
        messages++;
        if (stale) {
            flushLateReplies();
            stale = false;
        }
        // ISO 8859-1: ASCII text byte for byte, and a definite block's bytes as they are
        byte[] text = command.getBytes(StandardCharsets.ISO_8859_1);
        byte[] message = new byte[text.length + terminator.length];
        System.arraycopy(text, 0, message, 0, text.length);
        System.arraycopy(terminator, 0, message, text.length, terminator.length);
        if (IO.isDebugEnabled()) {
            IO.debug("{} > {}", instrument, printable(command));
        }
        long start = System.nanoTime();
        try {
            transport.write(message);
        } catch (IOException e) {
            throw new InstrumentException(instrument + " (" + transport.address() + "): sending '" + printable(command)
                    + "' failed: " + cause(e), e);
        } finally {
            ioNanos += System.nanoTime() - start;
        }
    }

    /** The slowest block transfer accepted (bytes per second): a block of n bytes has the timeout plus n / rate. */
    public void setMinimumTransferRate(double bytesPerSecond) {
        if (!(bytesPerSecond > 0)) {
            throw new IllegalArgumentException("a transfer rate must be above 0");
        }
        this.minimumBytesPerSecond = bytesPerSecond;
    }

    /** Sends a query and returns its response message without the terminator. */
    public synchronized String query(String command) {
        return queryLines(command, 1).get(0);
    }

    /** Sends a query whose response is {@code lines} lines (an ASCII list one value per line). */
    public synchronized List<String> queryLines(String command, int lines) {
        return queryLines(command, lines, timeout);
    }

    private List<String> queryLines(String command, int lines, Duration within) {
        write(command);
        queries++;
        long start = System.nanoTime();
        // the whole reply within the timeout; a reply of many lines (an ASCII trace) also gets its
        // bytes' time at the slowest accepted rate (about 16 bytes a line)
        deadline = start + within.toNanos() + (lines > 1 ? (long) (lines * 16 / minimumBytesPerSecond * 1e9) : 0);
        List<String> out = new ArrayList<>(lines);
        try {
            for (int i = 0; i < lines; i++) {
                out.add(readLine(command));
            }
            if (IO.isDebugEnabled()) {
                String first = out.get(0);
                IO.debug("{} < {}{}", instrument, first.length() > 240 ? first.substring(0, 240) + "... ("
                        + first.length() + " characters)" : first, lines > 1 ? " (and " + (lines - 1) + " more lines)" : "");
            }
            return out;
        } catch (TransportTimeoutException e) {
            IO.debug("{} ! no reply after {} ms", instrument, elapsedMillis(start));
            stale = true;
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): " + (lines == 1 ? "no reply"
                    : out.size() + " of " + lines + " lines of the reply") + " to '" + command + "' after "
                    + elapsedMillis(start) + " ms (timeout " + within.toMillis() + " ms)", e);
        } catch (IOException e) {
            stale = true;
            throw new InstrumentException(instrument + " (" + transport.address() + "): reading the reply to '"
                    + command + "' failed after " + elapsedMillis(start) + " ms: " + cause(e), e);
        } finally {
            ioNanos += System.nanoTime() - start;
        }
    }

    /** Sends a query whose response is one arbitrary block (definite or indefinite length). */
    public synchronized byte[] queryBlock(String command) {
        return queryBlock(command, true);
    }

    /**
     * Sends a query whose response is one block; {@code terminated} says whether the instrument
     * ends a definite-length block with the message terminator (most do; some send the bytes only).
     */
    public synchronized byte[] queryBlock(String command, boolean terminated) {
        return queryBlocks(command, 1, terminated).get(0);
    }

    /**
     * Sends one message of {@code count} block queries joined with ';' and reads their blocks, which
     * the instrument separates with ';' in one response message (IEEE 488.2 response message units);
     * the whole response has one deadline, the timeout plus every block's bytes at the slowest rate.
     */
    public synchronized List<byte[]> queryBlocks(String command, int count, boolean terminated) {
        write(command);
        queries++;
        long start = System.nanoTime();
        deadline = start + timeout.toNanos();
        blockProgress = "its header not received";
        String what = count == 1 ? "a valid block" : count + " valid blocks";
        List<byte[]> out = new ArrayList<>();
        try {
            for (int i = 0; i < count; i++) {
                if (i > 0) {
                    int sep = nextByte();
                    if (sep != ';') {
                        throw new BlockFormatException("block " + i + " of " + count + " is followed by " + describe(sep)
                                + " instead of ';' (does the instrument answer several block queries in one message?"
                                + " If not, leave out fetch_together)");
                    }
                }
                // the last block is followed by the message terminator where the instrument sends one
                byte[] block = readBlock(terminated && i == count - 1);
                if (IO.isDebugEnabled()) {
                    IO.debug("{} < block of {} bytes: {}", instrument, block.length, firstBytes(block));
                }
                out.add(block);
            }
            return out;
        } catch (BlockFormatException e) {
            IO.debug("{} ! not {}: {}", instrument, what, e.getMessage());
            stale = true;
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): reply to '" + command
                    + "' is not " + what + ": " + e.getMessage(), e);
        } catch (TransportTimeoutException e) {
            stale = true;
            flushLateReplies();
            throw new InstrumentException(instrument + " (" + transport.address() + "): block reply to '" + command
                    + "' incomplete after " + elapsedMillis(start) + " ms, " + (count == 1 ? "" : out.size() + " of "
                    + count + " blocks and ") + blockProgress + " (timeout " + timeout.toMillis() + " ms, plus the"
                    + (count == 1 ? " block's" : " blocks'") + " bytes at " + Math.round(minimumBytesPerSecond)
                    + " bytes/s at the slowest)", e);
        } catch (IOException e) {
            stale = true;
            throw new InstrumentException(instrument + " (" + transport.address() + "): reading the block reply to '"
                    + command + "' failed after " + elapsedMillis(start) + " ms: " + cause(e), e);
        } finally {
            ioNanos += System.nanoTime() - start;
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
            ScpiError error = parseError(query(errorQuery));
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

    /**
     * Sends a configuration message and the error query in one program message (one round trip)
     * and returns the replies before the error's. When the error reply is not "no error", the rest
     * of the queue is drained and the command is named in the exception. When the combined message
     * gets no complete reply (an instrument that drops the rest of a message after an error does
     * that), the queue is read with separate queries before reporting.
     *
     * @param command the configuration, possibly with its own queries
     * @param errorQuery an absolute header such as {@code :SYSTem:ERRor?}
     */
    public synchronized List<String> configure(String command, String errorQuery) {
        String message = command + ";" + errorQuery;
        List<String> replies;
        try {
            replies = ScpiReplies.split(query(message));
        } catch (InstrumentException timeout) {
            if (!(timeout.getCause() instanceof TransportTimeoutException)) {
                throw timeout;
            }
            // an instrument that drops a message's rest after an error answers the error query at once;
            // one that answers nothing (busy, or deaf to a query it does not know) is not waited for twice
            Duration brief = AFTER_TIMEOUT.compareTo(this.timeout) < 0 ? AFTER_TIMEOUT : this.timeout;
            ScpiError error;
            try {
                error = parseError(queryLines(errorQuery, 1, brief).get(0));
            } catch (InstrumentException silent) {
                if (!(silent.getCause() instanceof TransportTimeoutException)) {
                    throw silent;
                }
                throw new InstrumentException(timeout.getMessage() + "; '" + errorQuery + "' was not answered within "
                        + brief.toMillis() + " ms either", timeout);
            }
            List<ScpiError> errors = new ArrayList<>();
            if (!error.isNoError()) {
                errors.add(error);
                errors.addAll(drainErrors(errorQuery));
            }
            throw new InstrumentException(errors.isEmpty() ? timeout.getMessage()
                    : instrument + ": '" + printable(command) + "' caused " + errors, timeout);
        }
        if (replies.isEmpty()) {
            throw new InstrumentException(instrument + ": reply to '" + printable(message) + "' is empty");
        }
        ScpiError first = parseError(replies.get(replies.size() - 1));
        if (!first.isNoError()) {
            List<ScpiError> errors = new ArrayList<>();
            errors.add(first);
            errors.addAll(drainErrors(errorQuery));
            throw new InstrumentException(instrument + ": '" + printable(command) + "' caused " + errors);
        }
        return replies.subList(0, replies.size() - 1);
    }

    @Override
    public void close() throws IOException {
        transport.close();
    }

    private ScpiError parseError(String reply) {
        try {
            return ScpiError.parse(reply);
        } catch (IllegalArgumentException e) {
            throw new InstrumentException(instrument + ": " + e.getMessage() + (reply.trim().matches("[01]")
                    ? " (it looks like an *OPC? reply that arrived late: is the driver's timeout shorter than the"
                    + " operation it waits for?)" : " (a reply left over from an earlier query, or an error_query that"
                    + " is not this instrument's)"));
        }
    }

    /** An I/O failure in words, also when it carries no message (a link refused or closed under us). */
    static String cause(IOException e) {
        if (e.getMessage() != null && !e.getMessage().isBlank()) {
            return e.getMessage();
        }
        Throwable c = e.getCause();
        if (c != null && c.getMessage() != null) {
            return c.getClass().getSimpleName() + ": " + c.getMessage();
        }
        return e.getClass().getSimpleName() + " (the link was closed or refused by the other end: is the instrument"
                + " on, at that address, and not held by another program?)";
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
        int last = terminator[terminator.length - 1];
        while (true) {
            int b = nextByte();
            if (b == last) {
                break;
            }
            if (line.size() >= MAX_LINE) {
                stale = true;
                flushLateReplies();
                throw new InstrumentException(instrument + ": reply to '" + command + "' is longer than "
                        + MAX_LINE + " bytes without a terminator");
            }
            line.write(b);
        }
        String text = line.toString(StandardCharsets.ISO_8859_1);
        return last == '\n' && text.endsWith("\r") ? text.substring(0, text.length() - 1) : text;
    }

    private byte[] readBlock(boolean terminated) throws IOException {
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
            return readIndefiniteBlock();
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
        // the bytes get their time at the slowest accepted rate on top of the reply's timeout
        deadline += (long) (length / minimumBytesPerSecond * 1e9);
        blockProgress = "0 of " + length + " bytes received";
        while (filled < length) {
            if (position == limit) {
                int n = data.length - filled;
                if (n >= buffer.length) {
                    // large remainder: read straight into the result, no intermediate copy
                    filled += transport.read(data, filled, n, remaining());
                    blockProgress = filled + " of " + length + " bytes received";
                    continue;
                }
                fill();
            }
            int n = Math.min(limit - position, data.length - filled);
            System.arraycopy(buffer, position, data, filled, n);
            position += n;
            filled += n;
            blockProgress = filled + " of " + length + " bytes received";
        }
        if (terminated) {
            expectTerminator("block of " + length + " bytes");
        }
        return data;
    }

    /**
     * IEEE 488.2 indefinite-length block ({@code #0}): data up to a newline sent with END. A byte
     * stream carries no END, so the newline counts as the end only when nothing follows it within
     * {@link #INDEFINITE_BLOCK_QUIET}.
     */
    private byte[] readIndefiniteBlock() throws IOException {
        ByteArrayOutputStream data = new ByteArrayOutputStream();
        long base = deadline;
        while (true) {
            // the bytes so far get their time at the slowest accepted rate
            deadline = base + (long) (data.size() / minimumBytesPerSecond * 1e9);
            int b = nextByte();
            if (b == '\n' && position == limit) {
                try {
                    position = 0;
                    limit = transport.read(buffer, 0, buffer.length, INDEFINITE_BLOCK_QUIET);
                } catch (TransportTimeoutException quiet) {
                    position = 0;
                    limit = 0;
                    return data.toByteArray();
                }
            }
            if (data.size() >= MAX_BLOCK) {
                throw new BlockFormatException("indefinite block exceeds the allowed maximum (" + MAX_BLOCK + ")");
            }
            data.write(b);
        }
    }

    private void expectTerminator(String after) throws IOException {
        for (int i = 0; i < terminator.length; i++) {
            int end = nextByte();
            if (end == '\r' && terminator[i] == '\n') {
                end = nextByte();
            }
            if (end != terminator[i]) {
                boolean otherTerminator = end == '\r' || end == '\n';
                throw new BlockFormatException(after + " is followed by " + describe(end)
                        + " instead of the terminator" + (otherTerminator ? " (the instrument ends its messages"
                        + " differently: set term=crlf, lf or cr in the address to match)" : " (declared length wrong?)"));
            }
        }
    }

    private int nextByte() throws IOException {
        if (position == limit) {
            fill();
        }
        return buffer[position++] & 0xff;
    }

    private void fill() throws IOException {
        position = 0;
        limit = 0;
        limit = transport.read(buffer, 0, buffer.length, remaining());
    }

    /** What is left of the reply's deadline; none left is a timeout. */
    private Duration remaining() throws TransportTimeoutException {
        long left = deadline - System.nanoTime();
        if (left <= 0) {
            throw new TransportTimeoutException("the reply's deadline passed");
        }
        return Duration.ofNanos(left);
    }

    /** How much of the block being read has arrived, for a timeout's message. */
    private String blockProgress = "its header not received";

    private static String describe(int b) {
        return b >= 0x20 && b < 0x7f ? "'" + (char) b + "'" : String.format("byte 0x%02x", b);
    }

    private static String firstBytes(byte[] block) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < Math.min(16, block.length); i++) {
            sb.append(String.format("%02x ", block[i] & 0xff));
        }
        return block.length > 16 ? sb.append("...").toString() : sb.toString().trim();
    }

    private static long elapsedMillis(long startNanos) {
        return (System.nanoTime() - startNanos) / 1_000_000;
    }

    /** The command with each definite block shown as its size, for the I/O log and messages. */
    static String printable(String command) {
        if (command.indexOf('#') < 0) {
            return command;
        }
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < command.length(); i++) {
            int end = DefiniteBlock.end(command, i);
            if (end > 0) {
                out.append("<block of ").append(end - i).append(" bytes>");
                i = end - 1;
            } else {
                out.append(command.charAt(i));
            }
        }
        return out.toString();
    }

    /** One program message: printable ASCII, except inside definite blocks, which may hold any byte. */
    private static void requireSingleMessage(String command) {
        for (int i = 0; i < command.length(); i++) {
            int end = command.charAt(i) == '#' ? DefiniteBlock.end(command, i) : -1;
            if (end > 0) {
                if (command.chars().skip(i).limit(end - i).anyMatch(ch -> ch > 0xff)) {
                    throw new IllegalArgumentException("a block holds a character that is not a byte");
                }
                i = end - 1;
                continue;
            }
            char c = command.charAt(i);
            if (c == '\n' || c == '\r' || c < 0x20 || c > 0x7e) {
                throw new IllegalArgumentException("command '" + printable(command).replace("\n", "\\n")
                        + "' holds a control or non-ASCII character at index " + i);
            }
        }
    }
}
