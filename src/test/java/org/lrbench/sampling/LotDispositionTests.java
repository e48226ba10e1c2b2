package org.lrbench.sampling;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.lrbench.judge.CharacteristicClass;

class LotDispositionTests {

    static List<Set<CharacteristicClass>> parts(int good, int badMajor) {
        List<Set<CharacteristicClass>> out = new ArrayList<>();
        for (int i = 0; i < badMajor; i++) {
            out.add(EnumSet.of(CharacteristicClass.MAJOR));
        }
        for (int i = 0; i < good; i++) {
            out.add(EnumSet.noneOf(CharacteristicClass.class));
        }
        return out;
    }

    @Test
    void acceptAtAcRejectAtReAndOpenUntilTheSampleIsComplete() {
        // ISO 2859-1 single sampling: accept with at most Ac nonconforming in n, reject at Re or more.
        // Lot 1000, level II: J, n = 80; AQL 1.0: Ac 2, Re 3 (Table II-A)
        SamplingScheme s = new SamplingScheme(InspectionLevel.II, Map.of(CharacteristicClass.MAJOR, 1.0));
        assertThat(LotDisposition.judge(1000, s, parts(78, 2)).state()).isEqualTo(LotDisposition.State.ACCEPT);
        assertThat(LotDisposition.judge(1000, s, parts(77, 3)).state()).isEqualTo(LotDisposition.State.REJECT);
        // three nonconforming reject at once, before the sample is complete
        assertThat(LotDisposition.judge(1000, s, parts(0, 3)).state()).isEqualTo(LotDisposition.State.REJECT);
        assertThat(LotDisposition.judge(1000, s, parts(40, 2)).state()).isEqualTo(LotDisposition.State.OPEN);
        assertThat(LotDisposition.judge(1000, s, parts(78, 2)).sampleSize()).isEqualTo(80);
    }

    @Test
    void eachClassIsJudgedOnItsOwnPlan() {
        // lot 200, level II: G; AQL 0.65 -> arrow to F (n = 20, Ac 0); AQL 2.5 at G: n = 32, Ac 2
        SamplingScheme s = new SamplingScheme(InspectionLevel.II,
                Map.of(CharacteristicClass.MAJOR, 0.65, CharacteristicClass.MINOR, 2.5));
        List<Set<CharacteristicClass>> sample = parts(32, 0);
        sample.set(25, EnumSet.of(CharacteristicClass.MAJOR)); // beyond the major plan's 20 parts
        sample.set(3, EnumSet.of(CharacteristicClass.MINOR));
        LotDisposition.Result r = LotDisposition.judge(200, s, sample);
        assertThat(r.sampleSize()).isEqualTo(32);
        assertThat(r.state()).isEqualTo(LotDisposition.State.ACCEPT);
    }
}
