package org.lrbench.rehearsal;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;

class RehearsalTests {
    static final BenchConfig BENCH;

    static {
        try {
            BENCH = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
    }

    static Plan plan(String from, String to) throws Exception {
        String text = Files.readString(TestBench.home().resolve("plans/qfd-ind-1m0.yaml")).replace(from, to);
        return PlanLoader.parse(text, "rehearsed.yaml", BENCH.maxAmplitudeVolt());
    }

    @Test
    void aPartIsTimedAtLeastAsLongAsItsRecordsAndSettles() throws Exception {
        // physical floor, common practice, no source: a stepped point cannot take less than its settle
        // and its record (cycles / f); the one multisine capture no less than the settle and its record
        Plan p = plan("", "");
        PartTime.Estimate t = PartTime.of(p, BENCH, new DriverLoader(TestBench.home().resolve("drivers")), true, null);
        assertThat(t.timing().name()).isEqualTo("lan"); // the bench file sets no timing
        double floor = 0;
        for (double f : p.sweep().frequenciesHz()) {
            floor += p.sweep().settleSecond() + p.sweep().cycles() / f;
        }
        assertThat(t.steppedSecond()).isGreaterThan(floor);
        assertThat(t.multisineSecond()).isGreaterThan(p.sweep().settleSecond() + p.sweep().cycles() / p.sweep().lowestHz());
        // which is faster is wall time with lrbench's processing in it, so a matter for the throughput
        // benchmark (quiet machine, side by side), not for a unit test on a machine that may be busy
    }

    @Test
    void theShippedPlanDecidesEveryLimitRightWithoutWarnings() throws Exception {
        Rehearsal.Result r = Rehearsal.rehearse(plan("", ""), BENCH, new DriverLoader(TestBench.home().resolve("drivers")), 1);
        assertThat(r.allRight()).isTrue();
        assertThat(r.limits()).hasSize(3).allMatch(l -> l.tur() != null && l.tur() >= Rehearsal.MIN_TUR);
        assertThat(r.warnings()).isEmpty();
        // nominal, just inside and just outside each bound: 5 parts for the two-sided limit, 3 for one-sided
        assertThat(r.limits().get(0).runs()).isEqualTo(5);
        assertThat(r.limits().get(1).runs()).isEqualTo(3);
        // each bound without and with the bench's corrections: a part half the uncorrected U inside a bound
        // is read with a U that leaves it inside the guard band without corrections (guarded acceptance,
        // ISO 14253-1, from memory: accepted only U inside the limit) and well clear of it with them
        assertThat(r.guarded()).hasSize(4).allSatisfy(g -> {
            assertThat(g.uAfter()).isLessThan(g.uBefore() / 4);
            assertThat(g.turAfter()).isGreaterThan(g.turBefore());
            assertThat(g.acceptedAfter()).isEqualTo(g.runs());
        });
        assertThat(r.guarded()).anySatisfy(g -> assertThat(g.acceptedBefore()).isLessThan(g.runs()));
    }

    @Test
    void aSenseResistorFarTooLargeIsFlagged() throws Exception {
        Rehearsal.Result r = Rehearsal.rehearse(plan("sense_resistor: 100 ohm", "sense_resistor: 20 kohm"), BENCH,
                new DriverLoader(TestBench.home().resolve("drivers")), 1);
        assertThat(r.warnings()).anyMatch(w -> w.contains("the sense resistor (20.00 kohm) is the largest impedance"));
        assertThat(r.warnings()).anyMatch(w -> w.contains("test uncertainty ratio"));
    }

    @Test
    void theAdviceNamesWhatLimitsTheCurrent() throws Exception {
        // a 10 uH part behind 1 ohm and a 50 ohm source: the loop impedance is mostly the source's
        // (series circuit, circuit theory), so a smaller sense resistor would change little
        var p = PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), BENCH.maxAmplitudeVolt());
        var small = new Plan(p.source(), p.partNumber(), p.description(), 1.0, p.sweep(), p.triangle(),
                p.limits(), p.sampling(), p.wiring(), p.dcResistance());
        assertThat(Rehearsal.limitingElement(small, BENCH, 0.05)).contains("generator's output impedance (50.00 ohm)")
                .contains("changes little");
        var big = new Plan(p.source(), p.partNumber(), p.description(), 20e3, p.sweep(), p.triangle(),
                p.limits(), p.sampling(), p.wiring(), p.dcResistance());
        assertThat(Rehearsal.limitingElement(big, BENCH, 5)).contains("the sense resistor (20.00 kohm) is the largest");
        assertThat(Rehearsal.limitingElement(p, BENCH, 5e3)).contains("the part's own impedance");
    }
}
