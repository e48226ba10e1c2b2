package org.lrbench.run;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintStream;

/**
 * Operator prompts: "place part 3 of 8, enter or scan its serial". A keyboard-wedge scanner types
 * the serial and Enter. {@code s} skips a position (recorded as not measured), {@code q} stops the
 * lot (it can be resumed); after each part, {@code r} measures it again.
 */
public final class ConsoleFeeder implements PartFeeder {
    private static final String SERIAL = "[A-Za-z0-9][A-Za-z0-9._-]{0,63}";
    private final BufferedReader in;
    private final PrintStream out;

    public ConsoleFeeder(BufferedReader in, PrintStream out) {
        this.in = in;
        this.out = out;
    }

    @Override
    public Next next(int index, int of) {
        while (true) {
            out.printf("place part %d of %d, enter or scan its serial (s skip, q stop): ", index, of);
            out.flush();
            String line = read();
            if (line == null || line.equals("q")) {
                return Next.stop();
            }
            if (line.equals("s")) {
                out.print("serial of the skipped part (or Enter for none): ");
                out.flush();
                String serial = read();
                return new Next(Action.SKIP, serial == null || serial.isEmpty() ? "skipped-" + index : serial, null);
            }
            if (line.matches(SERIAL)) {
                return new Next(Action.MEASURE, line, null);
            }
            out.println("'" + line + "' is not a serial: 1 to 64 letters, digits, '.', '_' or '-'");
        }
    }

    @Override
    public boolean redo(String serial, String verdict) {
        out.printf("%s: %s. r + Enter to measure it again, Enter to go on: ", serial, verdict);
        out.flush();
        String line = read();
        return "r".equals(line);
    }

    private String read() {
        try {
            String line = in.readLine();
            return line == null ? null : line.trim();
        } catch (IOException e) {
            return null;
        }
    }
}
