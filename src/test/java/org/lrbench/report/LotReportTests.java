package org.lrbench.report;

import org.lrbench.bench.SimulatedPart;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Base64;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.lot.LotRunTests;
import org.lrbench.lot.LotRunner;
import org.lrbench.lot.TrayFeeder;
import org.lrbench.sim.SimLot;
import org.lrbench.results.Attempt;
import org.lrbench.store.ResultStore;

class LotReportTests {

    @Test
    void capabilityIndicesFollowTheirDefinitions() {
        // textbook definitions (from memory): Cp = (USL - LSL) / 6s, Cpk = min(USL - mean, mean - LSL) / 3s;
        // values 6, 7, 8 have mean 7 and s = 1: with limits 4 and 10, Cp = 1 and Cpk = 1; with 4 and 9, Cpk = 2/3
        Capability c = Capability.of(new double[] {6, 7, 8}, 4, 10);
        assertThat(c.sd()).isCloseTo(1, within(1e-12));
        assertThat(c.cp()).isCloseTo(1, within(1e-12));
        assertThat(c.cpk()).isCloseTo(1, within(1e-12));
        assertThat(Capability.of(new double[] {6, 7, 8}, 4, 9).cpk()).isCloseTo(2.0 / 3, within(1e-12));
        assertThat(Capability.of(new double[] {6, 7, 8}, Double.NEGATIVE_INFINITY, 9).cp()).isNull();
    }

    @Test
    void theReportParsesCarriesEveryPlotAndMatchesTheStore(@TempDir Path dir) throws Exception {
        SimLot tray = SimLot.load(TestBench.home().resolve("simulator/demo-lot.yaml"));
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.run(LotRunTests.setup(store, dir), new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { });
            Document d = Jsoup.parse(LotReport.html(store, "LOT-1"));
            assertThat(d.title()).isEqualTo("Inspection record, lot LOT-1");
            assertThat(d.text()).contains("REJECT");
            // 3 characteristics with a run chart and a histogram each + 8 parts + the history: 15 plots
            assertThat(d.select("img")).hasSize(15);
            for (Element img : d.select("img")) {
                String src = img.attr("src");
                assertThat(src).startsWith("data:image/png;base64,");
                byte[] png = Base64.getDecoder().decode(src.substring(src.indexOf(',') + 1));
                assertThat(png.length).isGreaterThan(1000);
                assertThat(png[1]).isEqualTo((byte) 'P');
                assertThat(png[2]).isEqualTo((byte) 'N');
            }
            // the simulated bench is announced before anything else
            assertThat(d.body().child(0).id()).isEqualTo("simulated");
            assertThat(d.getElementById("simulated").text()).contains("SIMULATED BENCH");
            // identity: program version, plan and its hash, bench, each instrument's *IDN?, calibration
            // dates and age, operators, start and finish
            Element identity = d.getElementById("identity");
            for (String key : new String[] {"program", "plan", "bench", "instruments", "calibration", "operators",
                "started / finished"}) {
                assertThat(identity.select("th:containsOwn(" + key + ")")).as(key).hasSize(1);
            }
            assertThat(identity.text()).contains("SHA-256").contains("generator: ").contains("digitizer: ")
                    .contains("tester")
                    // this lot ran without corrections, and the record says so rather than leave it out
                    .contains("no corrections in force");
            // sampling per class: ISO 2859-1 Table I / II-A for lot size 40 at level II: letter D, n = 8;
            // AQL 6.5 gives Ac 1, Re 2 (the standard's tables, as transcribed in sampling.SingleSamplingTests)
            var sampling = d.select("#sampling tr");
            assertThat(sampling).hasSizeGreaterThan(1);
            assertThat(sampling.get(1).select("td").eachText()).containsExactly("major", "6.5", "D", "8", "1", "2", "normal");
            // per part and limit: value +- U, decision rule, zone, margin
            var limitRows = d.select("#limits tr");
            assertThat(limitRows).hasSize(1 + 8 * 3);
            assertThat(limitRows.get(1).select("td").get(2).text()).matches("[0-9.]+ ± [0-9.]+ [mu]H");
            assertThat(limitRows.get(1).select("td").get(4).text()).isEqualTo("simple");
            assertThat(limitRows.get(1).select("td").get(5).text()).isIn("clear", "outside", "marginal");
            // every value says what it is: the winding resistance judged at the plan's reference temperature is
            // labelled so; the parts table's R_dc is the one measured at the bench
            assertThat(limitRows.get(2).select("td").get(1).text()).startsWith("winding resistance, at 20.00 C");
            assertThat(d.select("#parts th").eachText()).anySatisfy(t -> assertThat(t).contains("as measured at the bench"));
            // a place to sign
            assertThat(d.getElementById("signoff").text()).contains("inspected by").contains("approved by")
                    .contains("date").contains("REJECT");
            // printable: a print style that keeps tables and charts whole
            assertThat(d.select("style").html()).contains("@media print").contains("break-inside:avoid");
            // every attempt is listed, each with the one that counts marked
            assertThat(d.select("h2:contains(Attempts) + table tr")).hasSize(store.attempts("LOT-1").size() + 1);
            // the parts table matches the store row by row
            var rows = d.select("#parts tr");
            var stored = store.parts("LOT-1");
            assertThat(rows).hasSize(stored.size() + 1);
            for (int i = 0; i < stored.size(); i++) {
                Attempt p = stored.get(i);
                var cells = rows.get(i + 1).select("td");
                assertThat(cells.get(1).text()).isEqualTo(p.serial());
                assertThat(cells.get(2).text()).isEqualTo(p.verdict().word());
                assertThat(Double.parseDouble(cells.get(3).attr("data-value"))).isCloseTo(p.inductanceH(), within(1e-12 * p.inductanceH()));
                // shown with its prefix, unit and expanded uncertainty
                assertThat(cells.get(3).text()).matches("[0-9.]+ ± [0-9.]+ [mu]H");
            }
        }
    }

    /** The record says when the corrections in force were measured and how old they were at the lot's start. */
    @Test
    void theRecordDatesTheCorrectionsInForce(@TempDir Path dir) throws Exception {
        SimLot tray = SimLot.load(TestBench.home().resolve("simulator/demo-lot.yaml"));
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.Setup base = LotRunTests.setup(store, dir);
            var t = base.template();
            var match = new org.lrbench.calibration.ChannelMatch("2026-11-29T08:00:00Z", 1.0, 1e-4, 0, 1e-12, 11);
            var withMatch = new org.lrbench.run.PartRun.Request(t.plan(), t.planSha256(), t.bench(), t.lot(), t.serial(),
                    t.simulated(), t.programVersion(), new org.lrbench.calibration.Calibration(match, null));
            LotRunner.Setup setup = new LotRunner.Setup(withMatch, base.lotSize(), base.operator(), null, base.drivers(),
                    base.ledger(), base.sleeper(), base.listener(), null, base.stop(), base.scheme());
            LotRunner.run(setup, new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { });
            Element identity = Jsoup.parse(LotReport.html(store, "LOT-1")).getElementById("identity");
            // measured 2026-11-29, the lot started today: days before, and the fixture compensation missing
            assertThat(identity.text()).containsPattern("channel match 2026-11-29T08:00:00Z \\(\\d+ days before the lot started\\)")
                    .contains("fixture short/open none");
        }
    }

    /**
     * A big lot's record stays a document: from 25 parts on, each part's |Z| is a small SVG tile on the
     * lot's common axes instead of a full chart image, so 50 parts (lot of 300: ISO 2859-1 letter H, n = 50)
     * add a few kilobytes each; every part's numbers stay in the tables.
     */
    @Test
    void aBigLotsPlotsAreSmallMultiples(@TempDir Path dir) throws Exception {
        List<SimulatedPart.Slot> tray = new java.util.ArrayList<>();
        for (int i = 1; i <= 50; i++) {
            tray.add(new SimulatedPart.Slot(String.format("BIG-%04d", i),
                    SimulatedPart.of(new org.lrbench.sim.PartModel(1e-3 * (1 + 0.002 * (i % 7 - 3)), 2.3, 15e-12))));
        }
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            LotRunner.run(LotRunTests.setup(store, dir, 300), new TrayFeeder(tray), r -> { });
            String html = LotReport.html(store, "LOT-1");
            Files.createDirectories(Path.of("target"));
            Files.writeString(Path.of("target", "big-lot-report.html"), html);
            Document d = Jsoup.parse(html);
            assertThat(d.select(".multiples figure")).hasSize(50);
            assertThat(d.select(".multiples figure svg circle")).hasSizeGreaterThan(50 * 5);
            assertThat(d.select(".multiples figcaption").eachText()).allSatisfy(t -> assertThat(t).matches("BIG-\\d{4} \\w+"));
            // 3 characteristics with a run chart and a histogram each, and the history: no image per part
            assertThat(d.select("img")).hasSize(7);
            assertThat(d.select("#parts tr")).hasSize(51);
            // the limits one row per part, a column per limit, every number kept
            var wide = d.select("#limits-wide tr");
            assertThat(wide).hasSize(51);
            assertThat(wide.get(0).select("th")).hasSize(4);
            assertThat(wide.get(1).select("td").get(1).text()).matches("[0-9.]+ ± [0-9.]+ [mu]H, \\w+, .*, (pass|fail)");
            assertThat(wide.get(1).select("td").get(1).attr("data-value")).isNotEmpty();
            int tiles = d.select(".multiples").outerHtml().length();
            assertThat(tiles / 50).as("bytes per part's tile").isLessThan(4000);
        }
    }

    /** The part number's history in a lot's record is its supplier's lots only: a trend mixing suppliers says nothing. */
    @Test
    void theHistoryIsTheLotsSuppliers(@TempDir Path dir) throws Exception {
        SimLot tray = SimLot.load(TestBench.home().resolve("simulator/demo-lot.yaml"));
        try (ResultStore store = ResultStore.open(dir.resolve("s.db"))) {
            for (String[] lot : new String[][] {{"LOT-A", "Alpha Coils"}, {"LOT-B", "Beta Magnetics"}, {"LOT-C", "Alpha Coils"}}) {
                LotRunner.Setup s = LotRunTests.setup(store, dir);
                var t = s.template();
                var named = new org.lrbench.run.PartRun.Request(t.plan(), t.planSha256(), t.bench(), lot[0], "-", true, "test");
                LotRunner.run(LotRunner.Setup.of(named, 40, s.drivers(), s.ledger()).withOperator("tester")
                        .withScheme(org.lrbench.lot.LotScheme.of(lot[1], dir.resolve("sampling"))),
                        new TrayFeeder(SimulatedPart.tray(tray.parts())), r -> { });
            }
            Document d = Jsoup.parse(LotReport.html(store, "LOT-C"));
            assertThat(d.select("h2:contains(over time)").text()).contains("supplier Alpha Coils");
            String history = d.select("h2:contains(over time) + table").text();
            assertThat(history).contains("LOT-A").contains("LOT-C").doesNotContain("LOT-B");
        }
    }
}
