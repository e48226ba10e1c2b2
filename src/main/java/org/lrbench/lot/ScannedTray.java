package org.lrbench.lot;

import java.io.PrintStream;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.judge.Verdict;

/**
 * A lot run at the operator's prompts on the in-process simulated bench: the operator scans or types a
 * serial as on a real bench, and the part measured is the simulated tray's part of that serial. A serial
 * not on the tray is refused with a message and the prompt asked again; skips, stops and measuring again
 * are the prompts' own.
 */
public final class ScannedTray implements PartFeeder {
    private final PartFeeder prompts;
    private final Map<String, SimulatedPart> parts = new LinkedHashMap<>();
    private final PrintStream out;

    public ScannedTray(PartFeeder prompts, List<SimulatedPart.Slot> tray, PrintStream out) {
        this.prompts = prompts;
        this.out = out;
        tray.forEach(s -> parts.put(s.serial(), s.part()));
    }

    @Override
    public Next next(Prompt prompt) {
        while (true) {
            Next n = prompts.next(prompt);
            if (n.action() != Action.MEASURE) {
                return n;
            }
            SimulatedPart part = parts.get(n.serial());
            if (part != null) {
                return new Next(Action.MEASURE, n.serial(), part, n.reason());
            }
            out.println(n.serial() + " is not on the simulated tray (its serials: " + String.join(", ", parts.keySet())
                    + "); scan another");
        }
    }

    @Override
    public String again(String serial, Verdict verdict) {
        return prompts.again(serial, verdict);
    }

    @Override
    public void refused(String message) {
        prompts.refused(message);
    }
}
