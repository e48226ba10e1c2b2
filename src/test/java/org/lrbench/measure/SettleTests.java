package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Set;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.plan.SineSweep;

class SettleTests {

    private static final SineSweep FIXED = new SineSweep(1, 0, List.of(1e3, 10e3), 10, 100, 20e-3, Set.of(), 0.03);
    private static final SineSweep CIRCUIT = FIXED.withSettleFromCircuit(true);

    /**
     * A step in a series R-L loop decays as exp(-t / tau) with tau = L / R (circuit theory, any
     * textbook; common practice, no source): 1 mH in a loop of 100 + 2.3 ohm has tau = 9.775 us, and
     * 14 tau bring the step under 1e-6 of itself.
     */
    @Test
    void theCircuitRuleWaitsFourteenTimeConstantsUnderThePlansCeiling() {
        double f = 1e3;
        ImpedancePoint part = new ImpedancePoint(f, new Complex(2.3, 2 * Math.PI * f * 1e-3), 1e-4, Complex.ONE);
        assertThat(Settle.seconds(CIRCUIT, 100, part, 0)).isCloseTo(14 * 1e-3 / 102.3, within(1e-12));
        assertThat(Math.exp(-14)).isLessThan(1e-6);
        // the generator's declared settling when it is longer; the plan's settle as the ceiling
        assertThat(Settle.seconds(CIRCUIT, 100, part, 1e-3)).isEqualTo(1e-3);
        ImpedancePoint big = new ImpedancePoint(f, new Complex(2.3, 2 * Math.PI * f * 10.0), 1e-4, Complex.ONE);
        assertThat(Settle.seconds(CIRCUIT, 100, big, 0)).isEqualTo(20e-3);
    }

    @Test
    void withNothingKnownOrNoInductorShownThePlansSettleApplies() {
        ImpedancePoint capacitive = new ImpedancePoint(1e5, new Complex(50, -4e4), 1, Complex.ONE);
        assertThat(Settle.seconds(CIRCUIT, 100, null, 0)).isEqualTo(20e-3);
        assertThat(Settle.seconds(CIRCUIT, 100, capacitive, 0)).isEqualTo(20e-3);
        ImpedancePoint part = new ImpedancePoint(1e3, new Complex(2.3, 6.28), 1e-4, Complex.ONE);
        assertThat(Settle.seconds(FIXED, 100, part, 0)).isEqualTo(20e-3);
    }

    @Test
    void thePlanChoosesTheRuleAndIsToldWhichExist() throws Exception {
        String plan = java.nio.file.Files.readString(org.lrbench.TestBench.home().resolve("plans/qfd-ind-1m0.yaml"));
        String circuit = plan.replaceFirst("(?m)^(\\s+)settle: (.*)$", "$1settle: $2\n$1settle_rule: circuit");
        assertThat(org.lrbench.plan.PlanLoader.parse(circuit, "c.yaml", 5).sweep().settleFromCircuit()).isTrue();
        assertThat(org.lrbench.plan.PlanLoader.parse(plan, "p.yaml", 5).sweep().settleFromCircuit()).isFalse();
        String wrong = plan.replaceFirst("(?m)^(\\s+)settle: (.*)$", "$1settle: $2\n$1settle_rule: guess");
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> org.lrbench.plan.PlanLoader.parse(wrong, "w.yaml", 5))
                .hasMessageContaining("w.yaml:").hasMessageContaining("settle_rule")
                .hasMessageContaining("allowed: circuit, fixed");
    }

    @Test
    void aSettleShorterThanAMillisecondIsWaitedInFull() {
        // the circuit rule's settle for the 1 mH part above is 137 us: a bench must wait at least that
        // long (rounding it to whole milliseconds waited nothing); only the lower bound is checked
        double settle = 14 * 1e-3 / 102.3;
        for (int i = 0; i < 20; i++) {
            long t0 = System.nanoTime();
            BenchClock.REAL.sleep(settle);
            assertThat((System.nanoTime() - t0) / 1e9).isGreaterThanOrEqualTo(settle);
        }
    }
}
