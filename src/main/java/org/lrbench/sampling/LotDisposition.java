package org.lrbench.sampling;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.lrbench.judge.CharacteristicClass;

/**
 * A lot's disposition under single sampling: each class of nonconformity has its own plan for the
 * lot size; the first n of its class's measured parts count; the class rejects at Re nonconforming
 * parts or more, accepts with n parts measured and at most Ac nonconforming, and is still open
 * otherwise. The lot is rejected when any class rejects and accepted when every class accepts.
 * The plans are those of the scheme's severity (normal: Table II-A; tightened or reduced: the
 * lab's table); a reduced plan with a gap accepts a lot with more than Ac nonconforming but fewer
 * than Re, and {@link SwitchingRules} then reinstates normal inspection.
 */
public final class LotDisposition {

    private LotDisposition() {
    }

    /** Where a lot stands. */
    public enum State {
        ACCEPT, REJECT, OPEN;

        /** The state as records and the service write it: accept, reject, open. */
        @com.fasterxml.jackson.annotation.JsonValue
        public String word() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }

        /** The state a record's word names; anything else is refused, naming the word. */
        @com.fasterxml.jackson.annotation.JsonCreator
        public static State of(String word) {
            for (State s : values()) {
                if (s.word().equals(word)) {
                    return s;
                }
            }
            throw new IllegalArgumentException("disposition '" + word + "': one of accept, reject, open");
        }
    }

    /** The counts of one class against its plan. */
    public record ClassCount(String characteristicClass, SamplingPlan plan, int measured, int nonconforming, State state) {
    }

    public record Result(State state, int sampleSize, List<ClassCount> classes, String reason) {
    }

    /** The plans for a lot size; the sample is as large as the largest of them. */
    public static Map<CharacteristicClass, SamplingPlan> plans(int lotSize, SamplingScheme scheme) {
        Map<CharacteristicClass, SamplingPlan> out = new EnumMap<>(CharacteristicClass.class);
        scheme.aql().forEach((c, aql) -> out.put(c, scheme.severity() == Severity.NORMAL
                ? SingleSampling.plan(lotSize, scheme.level(), aql) : scheme.table().plan(lotSize, scheme.level(), aql)));
        return out;
    }

    /**
     * @param failedClasses per measured part in measuring order, the classes of the limits it failed
     */
    public static Result judge(int lotSize, SamplingScheme scheme, List<Set<CharacteristicClass>> failedClasses) {
        List<ClassCount> counts = new ArrayList<>();
        int sample = 0;
        boolean reject = false;
        boolean open = false;
        List<String> reasons = new ArrayList<>();
        for (var e : plans(lotSize, scheme).entrySet()) {
            SamplingPlan p = e.getValue();
            sample = Math.max(sample, p.sampleSize());
            int measured = Math.min(p.sampleSize(), failedClasses.size());
            int bad = 0;
            for (int i = 0; i < measured; i++) {
                if (failedClasses.get(i).contains(e.getKey())) {
                    bad++;
                }
            }
            State s = bad >= p.rejection() ? State.REJECT : measured >= p.sampleSize() ? State.ACCEPT : State.OPEN;
            reject |= s == State.REJECT;
            open |= s == State.OPEN;
            String name = e.getKey().name().toLowerCase(Locale.ROOT);
            counts.add(new ClassCount(name, p, measured, bad, s));
            reasons.add(String.format(Locale.ROOT, "%s: %d nonconforming in %d of %d (Ac %d, Re %d)", name, bad, measured,
                    p.sampleSize(), p.acceptance(), p.rejection()));
        }
        State state = reject ? State.REJECT : open ? State.OPEN : State.ACCEPT;
        return new Result(state, sample, List.copyOf(counts), String.join("; ", reasons));
    }
}
