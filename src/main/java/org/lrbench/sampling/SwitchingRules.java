package org.lrbench.sampling;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.List;
import java.util.Locale;

/**
 * The switching rules of ISO 2859-1:1999 clause 9 for one part number from one supplier, as a fold
 * over the scheme's history: the lots decided on original inspection (round 1) in the order they
 * were decided, and the decisions people recorded. The same history always gives the same state,
 * so the state is never stored, only the history.
 *
 * <ul>
 * <li>normal to tightened: 2 lots not accepted within 5 or fewer consecutive lots (9.3.1);</li>
 * <li>tightened to normal: 5 consecutive lots accepted (9.3.2);</li>
 * <li>normal to reduced: the switching score at 30 or more, and a recorded decision that
 *     production is steady and the responsible authority approves (9.3.3);</li>
 * <li>reduced to normal: a lot not accepted, a lot accepted with more than Ac nonconforming on a
 *     plan with a gap, or a recorded decision (irregular production, other conditions) (9.3.4);</li>
 * <li>tightened to discontinued: the lots not accepted on tightened inspection since it began reach
 *     5 (9.4); a recorded decision restarts inspection, at tightened.</li>
 * </ul>
 *
 * The switching score (9.3.3.2) starts at 0 when normal inspection starts. A lot under normal
 * inspection adds 3 when its plan has Ac of 2 or more and it would have been accepted at the AQL one
 * step tighter, 2 when its plan has Ac 0 or 1 and it was accepted, and resets the score otherwise.
 * A lot with several classes of nonconformity adds the smallest of its classes' steps (any reset
 * resets): our choice, the standard treats one AQL at a time. A lot inspected under a severity the
 * scheme has left by the time it is decided (it was started before a switch) is kept in the
 * history but does not count.
 */
public final class SwitchingRules {
    /** The score at which reduced inspection may be decided. */
    public static final int REDUCED_SCORE = 30;

    private SwitchingRules() {
    }

    /** One entry of the history. */
    public sealed interface Event permits LotOutcome, Decision {
        String at();
    }

    /**
     * A lot decided on original inspection.
     *
     * @param scoreStep 2 or 3 to add to the switching score, 0 to reset it (normal inspection only)
     * @param reinstatesNormal accepted on a reduced plan with more than Ac nonconforming
     */
    public record LotOutcome(String at, String lot, Severity severity, boolean accepted, int scoreStep,
                             boolean reinstatesNormal) implements Event {
    }

    /** A recorded decision: the severity a person set, why, and whether it overrides the rules. */
    public record Decision(String at, Severity to, String reason, String operator, boolean override) implements Event {
    }

    /** A change of severity, with the entry that caused it. */
    public record Transition(String at, Severity from, Severity to, String why) {
    }

    /**
     * Where the scheme stands: the severity the next lot is inspected under (discontinued: none is),
     * the switching score, whether reduced inspection may be decided, why the scheme is where it is,
     * and every transition so far.
     */
    public record State(Severity severity, int score, boolean reducedAllowed, String why, List<Transition> transitions,
                        List<String> notCounted) {
    }

    /** The score step of a lot decided under normal inspection (clause 9.3.3.2). */
    public static int scoreStep(LotDisposition.Result d) {
        if (d.state() != LotDisposition.State.ACCEPT) {
            return 0;
        }
        int step = Integer.MAX_VALUE;
        for (LotDisposition.ClassCount c : d.classes()) {
            SamplingPlan p = c.plan();
            int s;
            if (p.acceptance() >= 2) {
                int tighter = SingleSampling.tighterAcceptance(p.planLetter(), p.aql());
                s = tighter >= 0 && c.nonconforming() <= tighter ? 3 : 0;
            } else {
                s = c.nonconforming() <= p.acceptance() ? 2 : 0;
            }
            step = Math.min(step, s);
        }
        return step == Integer.MAX_VALUE ? 0 : step;
    }

    /** Whether an accepted lot had more than Ac nonconforming in some class (a reduced plan's gap). */
    public static boolean reinstatesNormal(LotDisposition.Result d) {
        return d.state() == LotDisposition.State.ACCEPT
                && d.classes().stream().anyMatch(c -> c.nonconforming() > c.plan().acceptance());
    }

    /** The state after a history, in its order. */
    public static State replay(List<? extends Event> history) {
        Fold f = new Fold();
        for (Event e : history) {
            if (e instanceof LotOutcome lot) {
                f.lot(lot);
            } else {
                f.decision((Decision) e);
            }
        }
        return new State(f.severity, f.score, f.severity == Severity.NORMAL && f.score >= REDUCED_SCORE, f.why,
                List.copyOf(f.transitions), List.copyOf(f.notCounted));
    }

    /**
     * Why a decision to {@code to} may not be recorded without overriding the rules, or null when
     * the rules allow it: reduced only from normal with the score at 30 or more; normal from reduced
     * (irregular production, other conditions); tightened from discontinued (the supplier acted).
     */
    public static String refusal(State s, Severity to) {
        if (to == s.severity()) {
            return "the scheme is at " + to.word() + " inspection already";
        }
        return switch (to) {
            case REDUCED -> s.severity() == Severity.NORMAL && s.score() >= REDUCED_SCORE ? null
                    : s.severity() != Severity.NORMAL ? "reduced inspection follows normal inspection only (the scheme is at "
                    + s.severity().word() + ")" : "the switching score is " + s.score() + "; reduced inspection needs "
                    + REDUCED_SCORE + " or more";
            case NORMAL -> s.severity() == Severity.REDUCED ? null : "the rules return to normal inspection by themselves"
                    + " from " + s.severity().word() + (s.severity() == Severity.TIGHTENED ? " (5 consecutive lots accepted)"
                    : s.severity() == Severity.DISCONTINUED ? "; inspection restarts at tightened" : "");
            case TIGHTENED -> s.severity() == Severity.DISCONTINUED ? null
                    : "tightened inspection follows from the lots' results; set it only as an override";
            case DISCONTINUED -> "inspection is discontinued by the rules (5 lots not accepted under tightened"
                    + " inspection); set it only as an override";
        };
    }

    private static final class Fold {
        Severity severity = Severity.NORMAL;
        int score;
        String why = "a scheme starts at normal inspection (ISO 2859-1:1999 9.2)";
        final Deque<LotOutcome> window = new ArrayDeque<>();
        int consecutiveAccepted;
        int notAcceptedTightened;
        final List<String> notAcceptedNames = new ArrayList<>();
        final List<Transition> transitions = new ArrayList<>();
        final List<String> notCounted = new ArrayList<>();

        void lot(LotOutcome lot) {
            if (lot.severity() != severity) {
                notCounted.add(String.format(Locale.ROOT, "lot %s was inspected under %s inspection and decided when the"
                        + " scheme was at %s: not counted", lot.lot(), lot.severity().word(), severity.word()));
                return;
            }
            switch (severity) {
                case NORMAL -> normal(lot);
                case TIGHTENED -> tightened(lot);
                case REDUCED -> {
                    if (!lot.accepted()) {
                        move(lot.at(), Severity.NORMAL, "lot " + lot.lot() + " was not accepted under reduced inspection");
                    } else if (lot.reinstatesNormal()) {
                        move(lot.at(), Severity.NORMAL, "lot " + lot.lot() + " was accepted with more than Ac nonconforming"
                                + " under reduced inspection");
                    }
                }
                default -> { }
            }
        }

        private void normal(LotOutcome lot) {
            window.addLast(lot);
            while (window.size() > 5) {
                window.removeFirst();
            }
            score = lot.scoreStep() == 0 ? 0 : score + lot.scoreStep();
            List<String> rejected = window.stream().filter(l -> !l.accepted()).map(LotOutcome::lot).toList();
            if (rejected.size() >= 2) {
                move(lot.at(), Severity.TIGHTENED, String.format(Locale.ROOT, "lots %s not accepted on original inspection"
                        + " within %d consecutive lots", String.join(" and ", rejected), window.size()));
            }
        }

        private void tightened(LotOutcome lot) {
            if (lot.accepted()) {
                consecutiveAccepted++;
                if (consecutiveAccepted >= 5) {
                    move(lot.at(), Severity.NORMAL, "5 consecutive lots accepted under tightened inspection, the last "
                            + lot.lot());
                }
                return;
            }
            consecutiveAccepted = 0;
            notAcceptedTightened++;
            notAcceptedNames.add(lot.lot());
            if (notAcceptedTightened >= 5) {
                move(lot.at(), Severity.DISCONTINUED, "5 lots not accepted under tightened inspection ("
                        + String.join(", ", notAcceptedNames) + "); no lot is inspected until a recorded decision restarts"
                        + " inspection");
            }
        }

        void decision(Decision d) {
            move(d.at(), d.to(), (d.override() ? "override" : "decision") + (d.operator() == null ? "" : " by " + d.operator())
                    + ": " + d.reason());
        }

        private void move(String at, Severity to, String reason) {
            transitions.add(new Transition(at, severity, to, reason));
            severity = to;
            why = reason;
            window.clear();
            consecutiveAccepted = 0;
            notAcceptedTightened = 0;
            notAcceptedNames.clear();
            if (to == Severity.NORMAL) {
                score = 0;
            }
        }
    }
}
