package org.lrbench.sampling;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.lrbench.judge.CharacteristicClass;

/**
 * The switching rules walked with lot sequences taken from the rules of ISO 2859-1:1999 clause 9
 * (9.3.1 normal to tightened, 9.3.2 tightened to normal, 9.3.3 normal to reduced with the switching
 * score of 9.3.3.2, 9.3.4 reduced to normal, 9.4 discontinuation). The rules are as the standard
 * states them; the sequences are ours.
 */
class SwitchingRulesTests {
    private final List<SwitchingRules.Event> history = new ArrayList<>();
    private int clock;

    private SwitchingRules.State lots(Severity under, String pattern) {
        for (char c : pattern.toCharArray()) {
            boolean accepted = c == 'a';
            history.add(new SwitchingRules.LotOutcome(String.format("t%04d", clock++), "L" + clock, under, accepted,
                    accepted ? 2 : 0, false));
        }
        return SwitchingRules.replay(history);
    }

    private SwitchingRules.State decide(Severity to, boolean override) {
        history.add(new SwitchingRules.Decision(String.format("t%04d", clock++), to, "steady production, approved", "qa",
                override));
        return SwitchingRules.replay(history);
    }

    @Test
    void twoNotAcceptedWithinFiveConsecutiveLotsTighten() {
        // ISO 2859-1:1999 9.3.1: 2 lots out of 5 or fewer consecutive lots not accepted
        assertThat(lots(Severity.NORMAL, "arar").severity()).isEqualTo(Severity.TIGHTENED);
        history.clear();
        // the two rejections five lots apart are within a window of five: tightened
        assertThat(lots(Severity.NORMAL, "raaar").severity()).isEqualTo(Severity.TIGHTENED);
        history.clear();
        // six lots apart: never two within five consecutive lots
        assertThat(lots(Severity.NORMAL, "raaaar").severity()).isEqualTo(Severity.NORMAL);
    }

    @Test
    void fiveConsecutiveAcceptedUnderTightenedReturnToNormal() {
        // ISO 2859-1:1999 9.3.2
        lots(Severity.NORMAL, "rr");
        assertThat(lots(Severity.TIGHTENED, "aaaa").severity()).isEqualTo(Severity.TIGHTENED);
        SwitchingRules.State s = lots(Severity.TIGHTENED, "a");
        assertThat(s.severity()).isEqualTo(Severity.NORMAL);
        assertThat(s.score()).as("the score starts again with normal inspection (9.3.3.2)").isZero();
        // a rejection inside the run of five starts the count again
        lots(Severity.NORMAL, "rr");
        lots(Severity.TIGHTENED, "aaaara");
        assertThat(SwitchingRules.replay(history).severity()).isEqualTo(Severity.TIGHTENED);
        assertThat(lots(Severity.TIGHTENED, "aaaa").severity()).isEqualTo(Severity.NORMAL);
    }

    @Test
    void fiveNotAcceptedUnderTightenedDiscontinueUntilADecisionRestartsAtTightened() {
        // ISO 2859-1:1999 9.4: the lots not accepted on original tightened inspection reach 5
        lots(Severity.NORMAL, "rr");
        SwitchingRules.State s = lots(Severity.TIGHTENED, "rarararr");
        assertThat(s.severity()).isEqualTo(Severity.DISCONTINUED);
        assertThat(s.why()).contains("5 lots not accepted");
        // inspection resumes under tightened inspection after the supplier acted (9.4)
        assertThat(SwitchingRules.refusal(s, Severity.NORMAL)).isNotNull();
        assertThat(SwitchingRules.refusal(s, Severity.TIGHTENED)).isNull();
        assertThat(decide(Severity.TIGHTENED, false).severity()).isEqualTo(Severity.TIGHTENED);
    }

    @Test
    void reducedNeedsTheScoreAndADecisionAndEndsOnARejection() {
        // ISO 2859-1:1999 9.3.3: score >= 30, production steady, approved; 9.3.3.2: +2 per accepted lot on Ac 0 or 1
        SwitchingRules.State s = lots(Severity.NORMAL, "aaaaaaaaaaaaaa");
        assertThat(s.score()).isEqualTo(28);
        assertThat(s.reducedAllowed()).isFalse();
        assertThat(SwitchingRules.refusal(s, Severity.REDUCED)).contains("28");
        s = lots(Severity.NORMAL, "a");
        assertThat(s.score()).isEqualTo(30);
        assertThat(s.reducedAllowed()).isTrue();
        assertThat(s.severity()).as("never reduced by the score alone").isEqualTo(Severity.NORMAL);
        assertThat(decide(Severity.REDUCED, false).severity()).isEqualTo(Severity.REDUCED);
        assertThat(lots(Severity.REDUCED, "aaa").severity()).isEqualTo(Severity.REDUCED);
        // 9.3.4 a): a lot not accepted returns to normal
        s = lots(Severity.REDUCED, "r");
        assertThat(s.severity()).isEqualTo(Severity.NORMAL);
        assertThat(s.score()).isZero();
    }

    @Test
    void aRejectionResetsTheScore() {
        // ISO 2859-1:1999 9.3.3.2: a lot not accepted resets the score to 0
        assertThat(lots(Severity.NORMAL, "aaaaar").score()).isZero();
        assertThat(lots(Severity.NORMAL, "aa").score()).isEqualTo(4);
    }

    @Test
    void reducedReturnsToNormalOnADecisionOrAGap() {
        lots(Severity.NORMAL, "aaaaaaaaaaaaaaa");
        decide(Severity.REDUCED, false);
        // 9.3.4: irregular production or other conditions, as a recorded decision
        assertThat(SwitchingRules.refusal(SwitchingRules.replay(history), Severity.NORMAL)).isNull();
        assertThat(decide(Severity.NORMAL, false).severity()).isEqualTo(Severity.NORMAL);
        // a lot accepted inside a reduced plan's gap reinstates normal (MIL-STD-105E 10.1.4, from memory)
        lots(Severity.NORMAL, "aaaaaaaaaaaaaaa");
        decide(Severity.REDUCED, false);
        history.add(new SwitchingRules.LotOutcome("t9999", "G1", Severity.REDUCED, true, 0, true));
        assertThat(SwitchingRules.replay(history).severity()).isEqualTo(Severity.NORMAL);
    }

    @Test
    void aLotInspectedUnderAnotherSeverityIsKeptButNotCounted() {
        lots(Severity.NORMAL, "rr");
        SwitchingRules.State s = lots(Severity.NORMAL, "r");
        assertThat(s.severity()).isEqualTo(Severity.TIGHTENED);
        assertThat(s.notCounted()).hasSize(1);
        assertThat(s.transitions()).hasSize(1);
    }

    @Test
    void theScoreStepFollowsTheAcceptanceNumberAndTheTighterAql() {
        // ISO 2859-1:1999 9.3.3.2 with Table II-A: lot 1000, level II: J (n 80); AQL 2.5: Ac 5, Re 6;
        // one step tighter, AQL 1.5 at n 80: Ac 3 (Table II-A). 3 nonconforming: +3; 4: accepted, reset.
        SamplingScheme s = new SamplingScheme(InspectionLevel.II, Map.of(CharacteristicClass.MAJOR, 2.5));
        assertThat(SwitchingRules.scoreStep(LotDisposition.judge(1000, s, LotDispositionTests.parts(77, 3)))).isEqualTo(3);
        LotDisposition.Result four = LotDisposition.judge(1000, s, LotDispositionTests.parts(76, 4));
        assertThat(four.state()).isEqualTo(LotDisposition.State.ACCEPT);
        assertThat(SwitchingRules.scoreStep(four)).isZero();
        // AQL 1.0 at lot 100 (F, n 20) moves up to E: Ac 0, so an accepted lot adds 2 (Table II-A)
        SamplingScheme one = new SamplingScheme(InspectionLevel.II, Map.of(CharacteristicClass.MAJOR, 1.0));
        assertThat(SwitchingRules.scoreStep(LotDisposition.judge(100, one, LotDispositionTests.parts(13, 0)))).isEqualTo(2);
        assertThat(SwitchingRules.scoreStep(LotDisposition.judge(100, one, LotDispositionTests.parts(12, 1)))).isZero();
    }
}
