package org.lrbench.sim.scpi;

import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Deque;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.lrbench.scpi.DefiniteBlock;
import org.lrbench.transport.inproc.InProcessPeer;

/**
 * The SCPI front end of a simulated instrument: it frames program messages at the newline, splits
 * them at {@code ;} (a following header without a leading colon continues from the previous one's
 * path, as SCPI-1999 Volume 1, 6.2 specifies), matches headers against registered
 * {@link HeaderPattern}s, keeps an error queue and implements the IEEE 488.2 common commands
 * {@code *IDN? *RST *CLS *OPC? *OPC *WAI *TST? *ESR?}. Subclasses register their own commands and
 * reset their settings in {@link #reset()}.
 */
public abstract class ScpiDevice implements InProcessPeer {
    /** Error queue depth; on overflow the last entry becomes -350 (SCPI-1999 Vol. 2, 21.8). */
    public static final int QUEUE_DEPTH = 20;
    private static final int MAX_MESSAGE = 1 << 20;
    /** Framing a definite block: -1 outside one, -2 just after '#', else header digits still to read. */
    private int blockDigits = -1;
    private long blockCount;
    private long blockLeft;
    private boolean quoted;

    /** Executes one command; returns null, a response String, or response bytes (a block). */
    @FunctionalInterface
    public interface Handler {
        Object handle(Call call) throws ScpiFault;
    }

    private record Entry(HeaderPattern pattern, boolean query, Handler handler) {
    }

    private final String identity;
    private final List<Entry> entries = new ArrayList<>();
    private final Map<String, Handler> common = new LinkedHashMap<>();
    private final Deque<String> errors = new ArrayDeque<>();
    private final ByteArrayOutputStream input = new ByteArrayOutputStream();
    private byte[] output = new byte[0];
    private int outputPosition;
    private int eventStatus;

    protected ScpiDevice(String identity) {
        this.identity = identity;
        common.put("*IDN?", c -> this.identity);
        common.put("*RST", c -> {
            reset();
            return null;
        });
        common.put("*CLS", c -> {
            errors.clear();
            eventStatus = 0;
            return null;
        });
        common.put("*OPC?", c -> "1");
        common.put("*OPC", c -> {
            eventStatus |= 1;
            return null;
        });
        common.put("*WAI", c -> null);
        common.put("*TST?", c -> "0");
        common.put("*ESR?", c -> {
            int v = eventStatus;
            eventStatus = 0;
            return Integer.toString(v);
        });
        register("SYSTem:ERRor[:NEXT]", true, c -> nextError());
        register("SYSTem:ERRor:COUNt", true, c -> Integer.toString(errors.size()));
    }

    /** Returns every setting to its *RST value. */
    protected abstract void reset();

    /** Registers a command ({@code query} false) or a query. */
    protected final void register(String pattern, boolean query, Handler handler) {
        entries.add(new Entry(HeaderPattern.parse(pattern), query, handler));
    }

    /** Adds an error to the queue. */
    protected final synchronized void pushError(int code, String text) {
        if (errors.size() >= QUEUE_DEPTH) {
            errors.pollLast();
            errors.addLast("-350,\"Queue overflow\"");
            return;
        }
        errors.addLast(code + ",\"" + text.replace("\"", "'") + "\"");
    }

    private String nextError() {
        String e = errors.pollFirst();
        return e == null ? "0,\"No error\"" : e;
    }

    @Override
    public synchronized void receive(byte[] bytes) {
        for (byte b : bytes) {
            if (blockLeft > 0) {
                // inside a definite block (IEEE 488.2 7.7.6) every byte is data, a newline too
                blockLeft--;
                keep(b);
                continue;
            }
            if (b == '\n' && blockDigits < 0) {
                String message = input.toString(StandardCharsets.ISO_8859_1);
                input.reset();
                quoted = false;
                blockDigits = -1;
                execute(message.endsWith("\r") ? message.substring(0, message.length() - 1) : message);
                continue;
            }
            keep(b);
            watchForBlock(b);
        }
    }

    /** Follows a definite block's header ('#', a digit d, d digits of count) so its data frame whole. */
    private void watchForBlock(byte b) {
        if (blockDigits == -2) {
            // after '#': a digit 1 to 9 starts a definite block's header
            blockDigits = b >= '1' && b <= '9' ? b - '0' : -1;
            blockCount = 0;
            return;
        }
        if (blockDigits > 0) {
            blockCount = b >= '0' && b <= '9' ? blockCount * 10 + (b - '0') : -1;
            if (blockCount < 0) {
                blockDigits = -1;
                return;
            }
            if (--blockDigits == 0) {
                blockLeft = blockCount;
                blockDigits = -1;
            }
            return;
        }
        if (b == '"') {
            quoted = !quoted;
        } else if (b == '#' && !quoted) {
            blockDigits = -2;
        }
    }

    private void keep(byte b) {
        if (input.size() < MAX_MESSAGE) {
            input.write(b);
        } else {
            input.reset();
            blockLeft = 0;
            blockDigits = -1;
            pushError(-102, "Syntax error;program message too long");
        }
    }

    @Override
    public synchronized int transmit(byte[] dst, int offset, int length) {
        int n = Math.min(length, output.length - outputPosition);
        System.arraycopy(output, outputPosition, dst, offset, n);
        outputPosition += n;
        return n;
    }

    /** Takes every reply byte not yet transmitted (servers push replies as soon as they exist). */
    public synchronized byte[] takeOutput() {
        byte[] out = outputPosition == 0 ? output
                : Arrays.copyOfRange(output, outputPosition, output.length);
        output = new byte[0];
        outputPosition = 0;
        return out;
    }

    @Override
    public synchronized void discardOutput() {
        output = new byte[0];
        outputPosition = 0;
    }

    private double messageSecond;
    private double bytesPerSecond;

    /**
     * How long each program message takes to reach the device and be processed, and the link's
     * rate for the message and its response (0: at once).
     */
    public synchronized void setTiming(double messageSecond, double bytesPerSecond) {
        this.messageSecond = messageSecond;
        this.bytesPerSecond = bytesPerSecond;
    }

    /**
     * Lets the simulated time of one message of {@code bytes} in and out pass, after the time its
     * handlers simulated (an acquisition, a frequency change); the simulator's computing outside
     * those is hidden inside the message's time.
     */
    private void take(long bytes, long startNanos, long simulatedBefore) {
        double seconds = messageSecond + (bytesPerSecond > 0 ? bytes / bytesPerSecond : 0);
        long computing = System.nanoTime() - startNanos - (SimulatedTime.simulatedNanos() - simulatedBefore);
        SimulatedTime.passSince(System.nanoTime() - Math.max(0, computing), seconds);
    }

    /** Executes one whole program message. */
    public synchronized void execute(String message) {
        long startNanos = System.nanoTime();
        long simulatedBefore = SimulatedTime.simulatedNanos();
        if (outputPosition < output.length) {
            // IEEE 488.2 6.3.2.3: a new message before the response was read interrupts the query
            pushError(-410, "Query INTERRUPTED");
        }
        output = new byte[0];
        outputPosition = 0;
        ByteArrayOutputStream response = new ByteArrayOutputStream();
        List<HeaderPattern.Token> path = List.of();
        for (String unit : splitUnits(message)) {
            String trimmed = strip(unit);
            if (trimmed.isEmpty()) {
                if (!message.isBlank()) {
                    pushError(-102, "Syntax error;empty message unit");
                }
                continue;
            }
            try {
                Parsed parsed = parse(trimmed, path);
                if (!parsed.common) {
                    path = parsed.tokens.subList(0, parsed.tokens.size() - 1);
                }
                Object reply = parsed.handler.handle(parsed.call);
                if (reply != null) {
                    if (response.size() > 0) {
                        response.write(';');
                    }
                    byte[] bytes = reply instanceof byte[] b ? b
                            : ((String) reply).getBytes(StandardCharsets.ISO_8859_1);
                    response.write(bytes, 0, bytes.length);
                }
            } catch (ScpiFault fault) {
                pushError(fault.code(), fault.getMessage());
            }
        }
        if (response.size() > 0) {
            response.write('\n');
            output = response.toByteArray();
        }
        take(message.length() + 1L + output.length, startNanos, simulatedBefore);
    }

    private record Parsed(Handler handler, Call call, List<HeaderPattern.Token> tokens, boolean common) {
    }

    private Parsed parse(String unit, List<HeaderPattern.Token> path) throws ScpiFault {
        int space = 0;
        while (space < unit.length() && !Character.isWhitespace(unit.charAt(space))) {
            space++;
        }
        String header = unit.substring(0, space);
        List<String> params = splitParameters(strip(unit.substring(space)), header);
        if (header.startsWith("*")) {
            Handler h = common.get(header.toUpperCase(Locale.ROOT));
            if (h == null) {
                throw ScpiFault.undefinedHeader(header);
            }
            if (!params.isEmpty()) {
                throw ScpiFault.parameterNotAllowed(header);
            }
            return new Parsed(h, new Call(header, 1, params), List.of(), true);
        }
        boolean absolute = header.startsWith(":");
        boolean query = header.endsWith("?");
        String body = header.substring(absolute ? 1 : 0, header.length() - (query ? 1 : 0));
        List<HeaderPattern.Token> tokens = new ArrayList<>(absolute ? List.of() : path);
        for (String word : body.split(":", -1)) {
            tokens.add(token(word, header));
        }
        for (Entry e : entries) {
            if (e.query == query) {
                int suffix = e.pattern.match(tokens);
                if (suffix >= 0) {
                    return new Parsed(e.handler, new Call(header, suffix, params), tokens, false);
                }
            }
        }
        throw ScpiFault.undefinedHeader(header);
    }

    private static HeaderPattern.Token token(String word, String header) throws ScpiFault {
        int i = 0;
        while (i < word.length() && Character.isLetter(word.charAt(i))) {
            i++;
        }
        String letters = word.substring(0, i);
        String digits = word.substring(i);
        if (letters.isEmpty() || !digits.chars().allMatch(Character::isDigit) || digits.length() > 6) {
            throw ScpiFault.syntax(header);
        }
        return new HeaderPattern.Token(letters.toUpperCase(Locale.ROOT),
                digits.isEmpty() ? 1 : Integer.parseInt(digits), !digits.isEmpty());
    }

    private static List<String> splitUnits(String message) {
        List<String> units = new ArrayList<>();
        StringBuilder current = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < message.length(); i++) {
            char c = message.charAt(i);
            int block = c == '#' && !quoted ? DefiniteBlock.end(message, i) : -1;
            if (block > 0) {
                current.append(message, i, block);
                i = block - 1;
                continue;
            }
            if (c == '"') {
                quoted = !quoted;
            }
            if (c == ';' && !quoted) {
                units.add(current.toString());
                current.setLength(0);
            } else {
                current.append(c);
            }
        }
        units.add(current.toString());
        return units;
    }

    private static List<String> splitParameters(String text, String header) throws ScpiFault {
        List<String> params = new ArrayList<>();
        if (text.isEmpty()) {
            return params;
        }
        // commas inside a channel list "(@101,102)" (SCPI-1999 Vol. 1, 8.3.2) do not separate parameters
        StringBuilder current = new StringBuilder();
        int depth = 0;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            int block = c == '#' ? DefiniteBlock.end(text, i) : -1;
            if (block > 0) {
                current.append(text, i, block);
                i = block - 1;
                continue;
            }
            if (c == '(') {
                depth++;
            } else if (c == ')') {
                depth--;
            }
            if (c == ',' && depth == 0) {
                add(params, current, header);
            } else {
                current.append(c);
            }
        }
        add(params, current, header);
        return params;
    }

    private static void add(List<String> params, StringBuilder current, String header) throws ScpiFault {
        if (current.toString().isBlank()) {
            throw ScpiFault.syntax(header + " empty parameter");
        }
        params.add(strip(current.toString()));
        current.setLength(0);
    }

    /** Strips white space around a unit or parameter, but none from inside a definite block's data. */
    static String strip(String text) {
        String lead = text.stripLeading();
        int keep = 0;
        for (int i = 0; i < lead.length(); i++) {
            int end = lead.charAt(i) == '#' ? DefiniteBlock.end(lead, i) : -1;
            if (end > 0) {
                keep = end;
                i = end - 1;
            }
        }
        return lead.substring(0, keep) + lead.substring(keep).stripTrailing();
    }
}
