package org.lrbench.cli;

import java.time.Instant;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.lrbench.results.Names;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SwitchingRules;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code scheme}: where a part number's inspection scheme with a supplier stands under the ISO
 * 2859-1 switching rules, its history, and a recorded decision on it.
 */
@Command(name = "scheme", mixinStandardHelpOptions = true,
        description = {"Shows a supplier's inspection scheme (ISO 2859-1 switching rules) or records a decision on it.",
            "Without PART: every scheme in the store and its severity. With --set: a decision (reduced inspection once"
                + " the switching score allows it, back to normal from reduced, a restart at tightened after"
                + " discontinuation), or with --override any severity; each is kept with its reason and never changed."})
final class SchemeCommand implements Callable<Integer> {

    @Mixin
    StoreLocation location;

    @Parameters(index = "0", arity = "0..1", paramLabel = "PART", description = "the part number")
    String part;

    @Option(names = "--supplier", paramLabel = "NAME",
            description = {"the supplier (default: the part's one supplier in the store; a part from several needs",
                    "this; --supplier \"\" for lots of plans without a supplier key)"})
    String supplier;

    @Option(names = "--simulated", description = "the simulated bench's scheme (its lots are kept apart from real"
            + " ones and steer no real supplier's scheme)")
    boolean simulated;

    @Option(names = "--set", paramLabel = "SEVERITY", description = "record a decision: normal, tightened, reduced or"
            + " discontinued")
    String set;

    @Option(names = "--reason", paramLabel = "TEXT", description = "why (required with --set)")
    String reason;

    @Option(names = "--override", description = "with --set: a severity the rules would not give now, recorded as an override")
    boolean override;

    @Option(names = "--operator", paramLabel = "NAME", description = "who decides (default: the login name)")
    String operator;

    @Override
    public Integer call() {
        if (part == null) {
            if (set != null) {
                throw new BadInputException("--set needs the part number");
            }
            try (ResultStore store = location.openForReading()) {
                for (String[] k : store.schemes()) {
                    SwitchingRules.State s = SwitchingRules.replay(store.schemeHistory(k[0], k[1]));
                    System.out.printf(Locale.ROOT, "%-20s %-28s %-12s score %d%n", k[0], k[1].isEmpty() ? "(no supplier)" : k[1],
                            s.severity().word(), s.score());
                }
                List<String[]> simulated = store.schemes(true);
                if (!simulated.isEmpty()) {
                    System.out.println("simulated bench (apart: these lots steer no real supplier's scheme):");
                    for (String[] k : simulated) {
                        SwitchingRules.State s = SwitchingRules.replay(store.schemeHistory(k[0], k[1], true));
                        System.out.printf(Locale.ROOT, "%-20s %-28s %-12s score %d%n", k[0], k[1].isEmpty() ? "(no supplier)"
                                : k[1], s.severity().word(), s.score());
                    }
                }
            }
            return ExitCodes.PASS;
        }
        if (supplier != null && Names.supplierProblem(supplier) != null) {
            throw new BadInputException("--" + Names.supplierProblem(supplier));
        }
        if (set == null) {
            if (reason != null || override) {
                throw new BadInputException("--reason and --override go with --set");
            }
            try (ResultStore store = location.openForReading()) {
                print(part, supplierOf(store), store, simulated);
            }
            return ExitCodes.PASS;
        }
        Severity to = Severity.of(set);
        if (to == null) {
            throw new BadInputException("--set '" + set + "': allowed normal, tightened, reduced, discontinued");
        }
        if (reason == null || reason.isBlank()) {
            throw new BadInputException("--set needs --reason: why, in words (it is kept with the decision)");
        }
        String who = operator != null ? operator : System.getProperty("user.name", "unknown");
        try (ResultStore store = location.open()) {
            String sup = supplierOf(store);
            try {
                store.decideScheme(part, sup, to, reason.trim(), who, override, Instant.now().toString(), simulated);
            } catch (IllegalArgumentException e) {
                throw new BadInputException(e.getMessage() + (override ? "" : " (give --override to set it anyway,"
                        + " recorded as an override)"));
            }
            System.out.println("recorded: " + to.word() + " inspection" + (override ? " (override)" : "") + ", by " + who);
            print(part, sup, store, simulated);
        }
        return ExitCodes.PASS;
    }

    /**
     * The supplier asked about: the one given, else the part's one supplier in the store (as its plan names
     * it); a part the store has from several suppliers needs --supplier.
     */
    private String supplierOf(ResultStore store) {
        if (supplier != null) {
            return supplier.trim();
        }
        List<String> known = store.schemes(simulated).stream().filter(k -> k[0].equals(part)).map(k -> k[1]).distinct().toList();
        if (known.size() > 1) {
            throw new BadInputException(part + " comes from " + known.size() + " suppliers in the store: " + String.join(", ",
                    known.stream().map(k -> k.isEmpty() ? "(no supplier named)" : "'" + k + "'").toList())
                    + "; give --supplier NAME");
        }
        return known.isEmpty() ? "" : known.get(0);
    }

    private static void print(String part, String supplier, ResultStore store, boolean simulated) {
        if (simulated) {
            System.out.println("the simulated bench's scheme (apart from the real supplier's):");
        }
        var history = store.schemeHistory(part, supplier, simulated);
        SwitchingRules.State s = SwitchingRules.replay(history);
        System.out.printf(Locale.ROOT, "%s, %s: %s inspection%n", part, supplier.isEmpty() ? "no supplier named"
                : "supplier " + supplier, s.severity().word());
        System.out.println("  why: " + s.why());
        System.out.printf(Locale.ROOT, "  switching score: %d%s%n", s.score(), s.reducedAllowed()
                ? " (reduced inspection may be decided: production steady and approved, with --set reduced)" : "");
        System.out.println("  history (lots on original inspection, decisions):");
        for (SwitchingRules.Event e : history) {
            if (e instanceof SwitchingRules.LotOutcome l) {
                System.out.printf(Locale.ROOT, "    %s  lot %-16s %-10s %s%n", l.at(), l.lot(), l.severity().word(),
                        l.accepted() ? "accepted" : "not accepted");
            } else if (e instanceof SwitchingRules.Decision d) {
                System.out.printf(Locale.ROOT, "    %s  %s: %s (%s, by %s)%n", d.at(), d.override() ? "override" : "decision",
                        d.to().word(), d.reason(), d.operator());
            }
        }
        for (SwitchingRules.Transition t : s.transitions()) {
            System.out.printf(Locale.ROOT, "  %s  %s -> %s: %s%n", t.at(), t.from().word(), t.to().word(), t.why());
        }
        s.notCounted().forEach(n -> System.out.println("  note: " + n));
    }
}
