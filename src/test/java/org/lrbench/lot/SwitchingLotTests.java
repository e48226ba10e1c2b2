package org.lrbench.lot;

import org.lrbench.run.PartRun;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.records.RecordCheck;
import org.lrbench.records.StoreLedger;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sampling.SeverityTableTests;
import org.lrbench.sampling.Severity;
import org.lrbench.sim.SimLot;
import org.lrbench.store.LotRecord;
import org.lrbench.store.ResultStore;

/**
 * The switching rules end to end on the simulated bench: the demo tray's lot is rejected under
 * normal inspection (lot 40, level II: D, n = 8; AQL 6.5: Ac 1, Re 2, ISO 2859-1 Tables I and II-A),
 * so two such lots put the supplier's scheme at tightened (ISO 2859-1:1999 9.3.1).
 */
class SwitchingLotTests {

    private static LotRunner.Setup lot(ResultStore store, Path dir, String name, String supplier) throws Exception {
        LotRunner.Setup s = LotRunTests.setup(store, dir);
        PartRun.Request t = s.template();
        PartRun.Request named = new PartRun.Request(t.plan(), t.planSha256(), t.bench(), name, "-", true, "test");
        return LotRunner.Setup.of(named, 40, s.drivers(), s.ledger()).withOperator("tester")
                .withScheme(LotScheme.of(supplier, dir.resolve("sampling")));
    }

    private static LotRunner.Outcome run(LotRunner.Setup s, SimLot tray) throws Exception {
        return LotRunner.run(s, new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { });
    }

    @Test
    void twoRejectedLotsTightenTheSuppliersSchemeAndTheNextLotIsInspectedUnderIt(@TempDir Path dir) throws Exception {
        SimLot tray = LotRunTests.tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            // a lot started under normal inspection and left open before the switch
            LotRunner.run(lot(store, dir, "A0", "Halvern"), LotRunTests.stoppingAfter(
                    new TrayFeeder(SimulatedPart.tray(tray.parts())), 2), r -> { });
            assertThat(run(lot(store, dir, "A1", "Halvern"), tray).disposition().state())
                    .isEqualTo(LotDisposition.State.REJECT);
            assertThat(run(lot(store, dir, "A2", "Halvern"), tray).disposition().state())
                    .isEqualTo(LotDisposition.State.REJECT);
            // the lots were measured on the simulated bench: they move the simulated scheme, never the real one
            var scheme = new StoreLedger(store, dir, true).scheme("QFD-IND-1M0", "Halvern", true);
            assertThat(scheme.severity()).isEqualTo(Severity.TIGHTENED);
            assertThat(scheme.why()).contains("A1").contains("A2");
            assertThat(new StoreLedger(store, dir, true).scheme("QFD-IND-1M0", "Halvern").severity())
                    .isEqualTo(Severity.NORMAL);
            assertThat(store.schemeHistory("QFD-IND-1M0", "Halvern")).isEmpty();
            assertThat(store.lot("A1").get(0).simulated()).isTrue();
            assertThat(store.history("QFD-IND-1M0")).isEmpty();
            assertThat(store.history("QFD-IND-1M0", true)).isNotEmpty();

            // without a table of the lab's own, the next lot runs under the standard's Table 2-B as lrbench ships it:
            // lot 40 at level II is D, and D at AQL 6.5 is an arrow down to E: n = 13, Ac 1, Re 2 (ISO 2859-1:1999
            // Tables I and 2-B)
            run(lot(store, dir, "A3", "Halvern"), tray);
            LotRecord a3 = store.lot("A3").get(0);
            assertThat(a3.severity()).isEqualTo("tightened");
            assertThat(a3.supplier()).isEqualTo("Halvern");
            assertThat(a3.sampling()).endsWith("; tightened inspection");
            assertThat(a3.severityReason()).contains("A1").contains("A2");
            assertThat(a3.classPlans()).hasSize(2).allSatisfy(c -> {
                assertThat(c.severity()).isEqualTo(Severity.TIGHTENED);
                assertThat(c.plan().sampleSize()).isEqualTo(13);
                assertThat(c.plan().acceptance()).isEqualTo(1);
                assertThat(c.plan().rejection()).isEqualTo(2);
            });

            // another supplier's scheme is its own: still normal
            assertThat(LotRunner.resolved(lot(store, dir, "B1", "Other Co")).scheme().severity())
                    .isEqualTo(Severity.NORMAL);

            // a lab's own table overrides the built-in one (here Table II-A written in the table format)
            Files.createDirectories(dir.resolve("sampling"));
            Files.writeString(dir.resolve("sampling/tightened.yaml"), SeverityTableTests.tableIIA("tightened"));
            run(lot(store, dir, "A4", "Halvern"), tray);
            LotRecord a4 = store.lot("A4").get(0);
            assertThat(a4.severity()).isEqualTo("tightened");
            // the lab's table here is Table II-A relabelled, so lot 40 at level II is D, n = 8, and AQL 6.5 (the
            // plan's major and minor) is Ac 1, Re 2 (ISO 2859-1 Tables I and II-A)
            assertThat(a4.classPlans()).hasSize(2).allSatisfy(c -> {
                assertThat(c.severity()).isEqualTo(Severity.TIGHTENED);
                assertThat(c.plan().codeLetter()).isEqualTo('D');
                assertThat(c.plan().sampleSize()).isEqualTo(8);
                assertThat(c.plan().acceptance()).isEqualTo(1);
                assertThat(c.plan().rejection()).isEqualTo(2);
            });
            // and the report shows that data, whatever the sampling line says
            var report = org.jsoup.Jsoup.parse(org.lrbench.report.LotReport.html(store, "A4"));
            assertThat(report.select("#sampling tr").get(1).select("td").eachText())
                    .containsExactly("major", "6.5", "D", "8", "1", "2", "tightened");
            assertThat(RecordCheck.findings(store, dir, "A3")).isEmpty();
            assertThat(RecordCheck.findings(store, dir, "A1")).isEmpty();

            // the open lot resumes under the severity it started with; its decision is kept but not counted
            LotRunner.Setup resumed = LotRunner.resolved(lot(store, dir, "A0", "Halvern"));
            assertThat(resumed.scheme().severity()).isEqualTo(Severity.NORMAL);
            run(resumed, tray);
            assertThat(store.lot("A0").get(0).severity()).isEqualTo("normal");
            var after = new StoreLedger(store, dir, true).scheme("QFD-IND-1M0", "Halvern", true);
            assertThat(after.notCounted()).anyMatch(n -> n.contains("A0"));
            assertThat(after.severity()).isEqualTo(Severity.TIGHTENED);
        }
    }

    @Test
    void aDiscontinuedSchemeRefusesNewLotsUntilADecisionRestartsIt(@TempDir Path dir) throws Exception {
        SimLot tray = LotRunTests.tray();
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            // decisions on the simulated bench's scheme (the lots below are simulated); the real one stays as it was
            store.decideScheme("QFD-IND-1M0", "", Severity.DISCONTINUED, "supplier's process changed without notice",
                    "qa", true, "2026-01-01T00:00:00Z", true);
            assertThat(store.schemeHistory("QFD-IND-1M0", "")).isEmpty();
            assertThatThrownBy(() -> run(lot(store, dir, "D1", ""), tray)).isInstanceOf(LotRefused.class)
                    .hasMessageContaining("discontinued").hasMessageContaining("supplier's process changed");
            assertThat(store.latestInspection("D1")).isEmpty();
            // without override the rules allow only a restart at tightened from here (ISO 2859-1:1999 9.4)
            assertThatThrownBy(() -> store.decideScheme("QFD-IND-1M0", "", Severity.NORMAL, "asked", "qa", false,
                    "2026-01-02T00:00:00Z", true)).isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("not recorded");
            store.decideScheme("QFD-IND-1M0", "", Severity.TIGHTENED, "supplier's corrective action 8D-17 verified", "qa",
                    false, "2026-01-03T00:00:00Z", true);
            assertThat(store.schemeHistory("QFD-IND-1M0", "", true)).hasSize(2);
            // restarted at tightened: the lot runs under the standard's Table 2-B
            run(lot(store, dir, "D1", ""), tray);
            assertThat(store.lot("D1").get(0).severity()).isEqualTo("tightened");
        }
    }
}
