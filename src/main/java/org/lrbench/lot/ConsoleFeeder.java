package org.lrbench.lot;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintStream;
import org.lrbench.judge.Verdict;
import org.lrbench.results.Names;

/**
 * Operator prompts: "place part 3 of 8, enter or scan its serial". A keyboard-wedge scanner types
 * the serial and Enter. {@code s} skips a position (recorded as not measured), {@code q} stops the
 * lot (it can be resumed). A serial already measured in this inspection (a double scan, say) is
 * refused unless the operator gives a reason to measure it again; after each part, {@code r} with a
 * reason measures it again. Every measurement is kept as its own attempt.
 */
public final class ConsoleFeeder implements PartFeeder {
    private final BufferedReader in;
    private final PrintStream out;
    /** What was typed or scanned at the after-part question that was not an answer to it: the next part's entry. */
    private String pending;

    public ConsoleFeeder(BufferedReader in, PrintStream out) {
        this.in = in;
        this.out = out;
    }

    @Override
    public Next next(Prompt prompt) {
        while (true) {
            out.printf("%s, enter or scan its serial (s skip, q stop): ", prompt.words());
            String line;
            if (pending != null) {
                // scanned at the question after the last part: it is this prompt's entry
                line = pending;
                pending = null;
                out.println(line);
            } else {
                out.flush();
                line = read();
            }
            if (line == null || line.equals("q")) {
                return Next.stop();
            }
            if (line.equals("s")) {
                out.print("serial of the skipped part (or Enter for none): ");
                out.flush();
                String serial = read();
                if (serial == null || serial.isEmpty()) {
                    return Next.skip("skipped-" + prompt.index());
                }
                if (!Names.valid(serial)) {
                    out.println(Names.problem("serial", serial));
                    continue;
                }
                return Next.skip(serial);
            }
            if (!Names.valid(line)) {
                out.println(Names.problem("serial", line));
                continue;
            }
            if (prompt.measured().contains(line)) {
                out.printf("%s is already measured in this lot. Reason to measure it again (Enter: do not): ", line);
                out.flush();
                String reason = read();
                if (reason == null || reason.isBlank()) {
                    out.println(line + " not measured again");
                    continue;
                }
                if (Names.reasonProblem("reason", reason) != null) {
                    out.println(Names.reasonProblem("reason", reason) + "; " + line + " not measured again");
                    continue;
                }
                return new Next(Action.MEASURE, line, null, reason);
            }
            return Next.measure(line, null);
        }
    }

    @Override
    public String again(String serial, Verdict verdict) {
        out.printf("%s: %s. r + Enter to measure it again, Enter to go on: ", serial, verdict.word());
        out.flush();
        String answer = read();
        if (answer != null && !answer.isEmpty() && !answer.equals("r")) {
            // not an answer to this question (a serial scanned ahead, or s or q): kept for the next prompt, never lost
            out.println("going on; '" + answer + "' is taken as the entry for the next part");
            pending = answer;
            return null;
        }
        if (!"r".equals(answer)) {
            return null;
        }
        out.print("reason to measure it again: ");
        out.flush();
        String reason = read();
        if (reason != null && !reason.isBlank() && Names.reasonProblem("reason", reason) != null) {
            out.println(Names.reasonProblem("reason", reason) + "; " + serial + " is not measured again");
            return null;
        }
        return reason == null || reason.isBlank() ? null : reason;
    }

    @Override
    public void refused(String message) {
        out.println(message);
    }

    private String read() {
        try {
            String line = in.readLine();
            return line == null ? null : line.trim();
        } catch (IOException e) {
            // the console is gone: nothing more can be asked, so the lot stops here and stays open
            out.println();
            out.println("console input failed (" + e.getMessage() + "): stopping; the lot can be resumed");
            return null;
        }
    }
}
