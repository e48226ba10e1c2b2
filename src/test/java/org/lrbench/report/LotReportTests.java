package org.lrbench.report;

import org.lrbench.bench.SimulatedPart;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Path;
import java.util.Base64;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.run.LotRunTests;
import org.lrbench.run.LotRunner;
import org.lrbench.run.TrayFeeder;
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
            assertThat(d.title()).isEqualTo("Lot LOT-1");
            assertThat(d.text()).contains("REJECT");
            // 3 characteristics + 8 parts + the history: 12 plots, each a real PNG
            assertThat(d.select("img")).hasSize(12);
            for (Element img : d.select("img")) {
                String src = img.attr("src");
                assertThat(src).startsWith("data:image/png;base64,");
                byte[] png = Base64.getDecoder().decode(src.substring(src.indexOf(',') + 1));
                assertThat(png.length).isGreaterThan(1000);
                assertThat(png[1]).isEqualTo((byte) 'P');
                assertThat(png[2]).isEqualTo((byte) 'N');
            }
            // every attempt is listed, each with the one that counts marked
            assertThat(d.select("h2:contains(Attempts) + table tr")).hasSize(store.attempts("LOT-1").size() + 1);
            // the parts table matches the store row by row
            var rows = d.select("h2:contains(Parts) + table tr");
            var stored = store.parts("LOT-1");
            assertThat(rows).hasSize(stored.size() + 1);
            for (int i = 0; i < stored.size(); i++) {
                Attempt p = stored.get(i);
                var cells = rows.get(i + 1).select("td");
                assertThat(cells.get(1).text()).isEqualTo(p.serial());
                assertThat(cells.get(2).text()).isEqualTo(p.verdict());
                assertThat(Double.parseDouble(cells.get(3).attr("data-value"))).isCloseTo(p.inductanceH(), within(1e-12 * p.inductanceH()));
                // shown with its prefix, unit and expanded uncertainty
                assertThat(cells.get(3).text()).matches("[0-9.]+ [mu]H ± [0-9.]+ [mun]H");
            }
        }
    }
}
