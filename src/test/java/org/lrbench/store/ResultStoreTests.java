package org.lrbench.store;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.results.PartResult;

public class ResultStoreTests {

    public static PartResult part(String lot, String serial, String verdict) {
        return new PartResult(PartResult.SCHEMA, "t", lot, serial, "P-1", "p.yaml", "ab".repeat(32), "b", true,
                "2026-12-01T00:00:00Z", "2026-12-01T00:00:01Z", verdict, verdict.equals("error") ? "lost" : null,
                List.of(), List.of(), 1e-3, 1e-6, 2e-6, 2.3, 0.01, 0.02, null, 1e6, Map.of(), null, null, null, null,
                List.of(), List.of(), Map.of(), Map.of());
    }

    @Test
    void schemaIsMigratedOnceAndPartsAreKeptPerLot(@TempDir Path dir) {
        Path db = dir.resolve("store.db");
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.version()).isEqualTo(Migrations.STEPS.size());
            s.beginLot("L1", "P-1", "p.yaml", "ab".repeat(32), "b", 40, 8, "now");
            s.savePart(1, part("L1", "S1", "pass"));
            s.savePart(2, part("L1", "S2", "error"));
        }
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.version()).isEqualTo(Migrations.STEPS.size());
            assertThat(s.completed("L1")).containsExactly("S1");
            // an error is measured again and replaces its row; a completed part is never stored twice
            s.savePart(2, part("L1", "S2", "fail"));
            assertThat(s.completed("L1")).containsExactly("S1", "S2");
            assertThatThrownBy(() -> s.savePart(3, part("L1", "S1", "pass"))).hasMessageContaining("already stored");
            assertThat(s.parts("L1")).hasSize(2);
            LotRecord l = s.lots().get(0);
            assertThat(l.measured()).isEqualTo(2);
            assertThat(l.passed()).isEqualTo(1);
            assertThat(l.failed()).isEqualTo(1);
            s.finishLot("L1", "reject", "2 major nonconforming >= Re 2", "later");
            assertThat(s.lots().get(0).disposition()).isEqualTo("reject");
        }
    }

    static PartResult part(String lot, String serial, String verdict, double l, double r) {
        PartResult p = part(lot, serial, verdict);
        return new PartResult(p.schema(), p.programVersion(), lot, serial, p.partNumber(), p.planPath(), p.planSha256(),
                p.bench(), true, p.startedAt(), p.finishedAt(), verdict, null, List.of(), List.of(), l, 0.0, 0.0, r,
                0.0, 0.0, null, null, Map.of(), null, null, null, null, List.of(), List.of(), Map.of(), Map.of());
    }

    @Test
    void historyGivesYieldMeanAndSpreadPerLot(@TempDir Path dir) {
        double[] ls = {1.01e-3, 0.99e-3, 1.03e-3, 0.95e-3};
        double[] rs = {2.31, 2.28, 2.42, 2.90};
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            s.beginLot("L1", "P-1", "p.yaml", "ab".repeat(32), "b", 40, 8, "2026-12-01T00:00:00Z");
            for (int i = 0; i < ls.length; i++) {
                s.savePart(i + 1, part("L1", "S" + i, i == 3 ? "fail" : "pass", ls[i], rs[i]));
            }
            s.savePart(5, part("L1", "S9", "error"));
            LotStatistics st = s.history("P-1").get(0);
            // reference: Apache Commons Math DescriptiveStatistics (sample standard deviation)
            var dl = new org.apache.commons.math3.stat.descriptive.DescriptiveStatistics(ls);
            var dr = new org.apache.commons.math3.stat.descriptive.DescriptiveStatistics(rs);
            assertThat(st.measured()).isEqualTo(4);
            assertThat(st.yield()).isEqualTo(0.75);
            assertThat(st.meanInductanceH()).isCloseTo(dl.getMean(), org.assertj.core.api.Assertions.within(1e-15));
            assertThat(st.sdInductanceH()).isCloseTo(dl.getStandardDeviation(), org.assertj.core.api.Assertions.within(1e-15));
            assertThat(st.meanResistanceOhm()).isCloseTo(dr.getMean(), org.assertj.core.api.Assertions.within(1e-12));
            assertThat(st.sdResistanceOhm()).isCloseTo(dr.getStandardDeviation(), org.assertj.core.api.Assertions.within(1e-12));
        }
    }

    @Test
    void aLotCannotBeContinuedWithAnotherPlan(@TempDir Path dir) {
        try (ResultStore s = ResultStore.open(dir.resolve("store.db"))) {
            s.beginLot("L1", "P-1", "p.yaml", "ab".repeat(32), "b", 40, 8, "now");
            assertThatThrownBy(() -> s.beginLot("L1", "P-1", "p.yaml", "cd".repeat(32), "b", 40, 8, "now"))
                    .hasMessageContaining("started with another plan");
            // a part of an unknown lot breaks the foreign key
            assertThatThrownBy(() -> s.savePart(1, part("L9", "S1", "pass"))).isInstanceOf(StoreException.class);
        }
    }
}
