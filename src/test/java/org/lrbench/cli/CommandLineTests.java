package org.lrbench.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.results.LotTerms;
import org.lrbench.store.Canonical;
import org.lrbench.store.ResultStore;

/** The commands end to end, as a user runs them, with their exit codes and files. */
class CommandLineTests {
    static final Path HOME = TestBench.home();
    static final String PLAN = HOME.resolve("plans/qfd-ind-1m0.yaml").toString();

    record Outcome(int code, String out, String err) {
    }

    static Outcome run(String... given) {
        String[] args = given;
        List<String> list = List.of(given);
        if (given.length > 0 && (given[0].equals("run") || given[0].equals("standard")) && !list.contains("--data")
                && !list.contains("--store")) {
            // a single part is kept in a results store: each such test its own, never the working folder's
            try {
                args = java.util.stream.Stream.concat(list.stream(), java.util.stream.Stream.of("--data",
                        Files.createTempDirectory("lrbench-test-data").toString())).toArray(String[]::new);
            } catch (IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        }
        PrintStream oldOut = System.out;
        PrintStream oldErr = System.err;
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        System.setOut(new PrintStream(out, true, StandardCharsets.UTF_8));
        System.setErr(new PrintStream(err, true, StandardCharsets.UTF_8));
        try {
            int code = Main.execute(args);
            return new Outcome(code, out.toString(StandardCharsets.UTF_8), err.toString(StandardCharsets.UTF_8));
        } finally {
            System.setOut(oldOut);
            System.setErr(oldErr);
        }
    }

    @Test
    void runOnANominalPartPassesAndWritesTheDocumentedJson(@TempDir Path dir) throws Exception {
        Path json = dir.resolve("out.json");
        Outcome o = run("run", PLAN, "--lot", "L-1", "--serial", "S-1", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--json", json.toString(),
                "--runs", dir.resolve("runs").toString(), "--calibration", dir.resolve("none").toString());
        assertThat(o.code()).as(o.out() + o.err()).isZero();
        assertThat(o.out()).contains("verdict: PASS");
        JsonNode r = new ObjectMapper().readTree(json.toFile());
        // the schema the README documents
        assertThat(r.get("schema").asText()).isEqualTo("lrbench.part-result.v3");
        assertThat(r.get("attempt").get("number").asInt()).isEqualTo(1);
        assertThat(r.get("attempt").get("reason").isNull()).isTrue();
        assertThat(r.get("verdict").asText()).isEqualTo("pass");
        assertThat(r.get("inductance_h").isNumber()).isTrue();
        assertThat(r.get("inductance_h").asDouble()).isBetween(0.99e-3, 1.01e-3);
        assertThat(r.get("series_resistance_ohm").asDouble()).isBetween(2.2, 2.4);
        assertThat(r.get("limits")).hasSize(3);
        for (JsonNode l : r.get("limits")) {
            assertThat(l.has("name") && l.has("value") && l.has("lower") && l.has("upper") && l.has("pass")).isTrue();
            assertThat(l.get("pass").isBoolean()).isTrue();
        }
        assertThat(r.get("points")).hasSize(7);
        for (JsonNode p : r.get("points")) {
            for (String field : new String[] {"frequency_hz", "resistance_ohm", "reactance_ohm", "inductance_h"}) {
                assertThat(p.get(field).isNumber()).as(field).isTrue();
            }
        }
        assertThat(r.get("plan_sha256").asText()).hasSize(64);
        // every reported quantity has a budget whose contributions add up (GUM 5.1.2) to its u
        JsonNode budget = r.get("budgets").get("inductance");
        double sum = 0;
        for (JsonNode c : budget.get("contributions")) {
            sum += Math.pow(c.get("contribution").asDouble(), 2);
        }
        assertThat(Math.sqrt(sum)).isCloseTo(budget.get("standard_uncertainty").asDouble(),
                Assertions.within(1e-12));
        // U = k u_c with the budget's own k, between a rectangle's p sqrt(3) and a normal's 2 (JCGM 100:2008 4.3.7, G.3)
        double k = budget.get("coverage_factor").asDouble();
        assertThat(k).isBetween(0.9545 * Math.sqrt(3), 2.0 + 1e-9);
        assertThat(budget.get("expanded_uncertainty").asDouble())
                .isCloseTo(k * budget.get("standard_uncertainty").asDouble(), Assertions.within(1e-15));
        assertThat(r.get("inductance_expanded_uncertainty_h").asDouble()).isPositive();
        assertThat(r.get("methods").get("inductance_h").asText()).contains("sweep fit");
        assertThat(r.get("model").get("parameters").has("inductance")).isTrue();
        // the multimeter step: 4-wire reading of the simulated part (2.3 ohm), corrected from the
        // entered 23 C to 20 C with copper's 0.00393 per K (IACS), and agreeing with the sweep
        JsonNode dc = r.get("dc_resistance");
        assertThat(dc.get("wiring").asText()).isEqualTo("four_wire");
        // the simulated meter reads with its own error, drawn within its accuracy (the bench file's meter_error)
        double meter = 1 + org.lrbench.bench.BenchLoader.load(HOME.resolve("simulator/bench.yaml")).simulation().meterError();
        assertThat(Math.abs(meter - 1)).isLessThanOrEqualTo(0.00015);
        assertThat(dc.get("measured_ohm").asDouble()).isCloseTo(2.3 * meter, Assertions.within(1e-9));
        assertThat(dc.get("at_reference_ohm").asDouble())
                .isCloseTo(2.3 * meter / (1 + 0.00393 * 3), Assertions.within(1e-9));
        assertThat(dc.get("agrees").asBoolean()).isTrue();
        // the kept record is the same result, and no half-written file is left behind
        assertThat(Files.readString(dir.resolve("runs/L-1/S-1.json"))).isEqualTo(Files.readString(json));
        try (Stream<Path> files = Files.walk(dir)) {
            assertThat(files.filter(f -> f.toString().endsWith(".partial"))).isEmpty();
        }
    }

    @Test
    void runOnAPartOverTheResistanceLimitFailsWithTheReason(@TempDir Path dir) {
        Outcome o = run("run", PLAN, "--lot", "L-1", "--serial", "S-2", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-high-r.yaml").toString(), "--runs", dir.toString(),
                "--calibration", dir.resolve("none").toString());
        assertThat(o.code()).isEqualTo(1);
        assertThat(o.out()).contains("FAIL winding resistance").contains("verdict: FAIL");
    }

    @Test
    void badPlanExitsTwoWithPositionedProblems(@TempDir Path dir) throws Exception {
        Path plan = dir.resolve("bad.yaml");
        Files.writeString(plan, Files.readString(Path.of(PLAN)).replace("sense_resistor: 100 ohm", "sense_resistor: 100 V"));
        Outcome check = run("check", plan.toString());
        assertThat(check.code()).isEqualTo(2);
        assertThat(check.err()).contains(plan + ":8:19: fixture.sense_resistor: '100 V' is voltage (V); expected resistance (ohm)");
        Outcome runIt = run("run", plan.toString(), "--lot", "L", "--serial", "S", "--runs", dir.toString());
        assertThat(runIt.code()).isEqualTo(2);
        assertThat(run("check", PLAN).code()).isZero();
    }

    @Test
    void badOptionsExitTwo(@TempDir Path dir) {
        assertThat(run("run", PLAN, "--serial", "S").code()).isEqualTo(2);
        Outcome traversal = run("run", PLAN, "--lot", "../../etc", "--serial", "S", "--runs", dir.toString());
        assertThat(traversal.code()).isEqualTo(2);
        assertThat(traversal.err()).contains("--lot '../../etc'");
        assertThat(run("run", PLAN, "--lot", "L", "--serial", "S", "--sim", "nope.yaml").code()).isEqualTo(2);
    }

    @Test
    void withoutTheSimulatorTheSimulatedAddressesGiveAnInstrumentError(@TempDir Path dir) {
        Outcome o = run("run", PLAN, "--lot", "L", "--serial", "S", "--runs", dir.toString());
        assertThat(o.code()).isEqualTo(3);
        assertThat(o.err()).contains("sim://generator").contains("--sim");
    }

    @Test
    void demoLotGivesTheVerdictsItsTrueValuesCall(@TempDir Path dir) throws Exception {
        Outcome o = run("demo", "--runs", dir.toString(), "--calibration", dir.resolve("cal").toString(),
                "--data", dir.resolve("data").toString());
        assertThat(o.code()).as(o.err()).isZero();
        // Expected by hand from simulator/demo-lot.yaml against plans/qfd-ind-1m0.yaml
        // (L 1 mH +/- 10 %, R <= 2.6 ohm, Q = 2 pi 10 kHz L / R >= 20); each part is far from a
        // limit compared with the measurement's uncertainty.
        Map<String, String> expected = new LinkedHashMap<>();
        expected.put("HC0417-0001", "pass");
        expected.put("HC0417-0002", "pass");
        expected.put("HC0417-0003", "pass");
        expected.put("HC0417-0004", "fail"); // 0.883 mH < 0.900 mH
        expected.put("HC0417-0005", "fail"); // 2.74 ohm > 2.6 ohm
        expected.put("HC0417-0006", "pass");
        expected.put("HC0417-0007", "fail"); // 3.35 ohm > 2.6 ohm, Q = 18.9 < 20
        expected.put("HC0417-0008", "pass"); // 1.095 mH, inside +10 %
        ObjectMapper json = new ObjectMapper();
        for (Map.Entry<String, String> e : expected.entrySet()) {
            JsonNode r = json.readTree(dir.resolve("HCC-2611-0417").resolve(e.getKey() + ".json").toFile());
            assertThat(r.get("verdict").asText()).as(e.getKey()).isEqualTo(e.getValue());
        }
        JsonNode summary = json.readTree(dir.resolve("HCC-2611-0417/lot-summary.json").toFile());
        assertThat(summary.get("passed").asInt()).isEqualTo(5);
        assertThat(summary.get("failed").asInt()).isEqualTo(3);
        assertThat(o.out()).contains("8 measured, 5 pass, 3 fail, 0 error");
        // ISO 2859-1, lot of 40 at level II is code letter D (n = 8); AQL 6.5 at D is Ac 1, Re 2:
        // three major nonconforming parts reject the lot
        assertThat(summary.get("sample_size").asInt()).isEqualTo(8);
        assertThat(summary.get("disposition").asText()).isEqualTo("reject");
        assertThat(o.out()).contains("disposition: REJECT");
        assertThat(Files.exists(dir.resolve("data/lrbench.db"))).isTrue();
        assertThat(o.out()).contains("HC0417-0007").contains("winding resistance").contains("Q at 10 kHz");
        // the demo calibrates the bench first and every result records the corrections it used
        assertThat(o.out()).contains("channel match:").contains("fixture: short");
        JsonNode first = json.readTree(dir.resolve("HCC-2611-0417/HC0417-0001.json").toFile());
        assertThat(first.get("corrections").get("channel_match_measured_at").asText()).isNotBlank();
        // the triangle check is corrected like the sweep (channel match, leads): on calibrated parts
        // with true values in the simulator, it agrees and raises no warning
        for (String serial : expected.keySet()) {
            JsonNode r = json.readTree(dir.resolve("HCC-2611-0417").resolve(serial + ".json").toFile());
            for (JsonNode w : r.get("warnings")) {
                assertThat(w.asText()).as(serial).doesNotContain("triangle-wave");
            }
        }
        assertThat(Files.exists(dir.resolve("cal/sim-bench-1/fixture.json"))).isTrue();
    }

    static final String LOT_FILE = HOME.resolve("simulator/demo-lot.yaml").toString();

    static Outcome lotRun(Path dir, String lot, String lotSize, String... more) {
        List<String> args = new ArrayList<>(List.of("run", PLAN, "--lot", lot, "--lot-size",
                lotSize, "--sim-lot", LOT_FILE, "--runs", dir.resolve("runs").toString(), "--data",
                dir.resolve("data").toString(), "--calibration", dir.resolve("none").toString(), "--operator", "Tam"));
        args.addAll(List.of(more));
        return run(args.toArray(String[]::new));
    }

    @Test
    void aRejectedLotCannotBeTurnedIntoAnAcceptedOne(@TempDir Path dir) throws Exception {
        Outcome first = lotRun(dir, "X1", "40");
        assertThat(first.code()).as(first.out() + first.err()).isEqualTo(1);
        assertThat(first.out()).contains("disposition: REJECT");
        // the same lot with a smaller lot size (n = 2, Ac 0 by ISO 2859-1) would accept: it is closed instead
        Outcome again = lotRun(dir, "X1", "5");
        assertThat(again.code()).isEqualTo(1);
        assertThat(again.out()).contains("lot X1 is closed").contains("REJECT").contains("Nothing was measured");
        Outcome lots = run("lots", "--data", dir.resolve("data").toString());
        assertThat(lots.out()).contains("reject").doesNotContain("accept");
        // a re-inspection is explicit and recorded; both inspections stay
        Outcome re = lotRun(dir, "X1", "40", "--reinspect", "supplier replaced the failed parts");
        assertThat(re.code()).isEqualTo(1);
        Outcome lot = run("lot", "X1", "--data", dir.resolve("data").toString());
        assertThat(lot.out().lines().filter(l -> l.startsWith("1 ")).count()).isEqualTo(8);
        assertThat(lot.out().lines().filter(l -> l.startsWith("2 ")).count()).isEqualTo(8);
        Outcome verify = run("verify", "--data", dir.resolve("data").toString(), "--runs", dir.resolve("runs").toString());
        assertThat(verify.code()).as(verify.out()).isZero();
        // report --csv: one row per attempt and limit, 16 attempts of 3 limits
        Path csv = dir.resolve("x1.csv");
        assertThat(run("report", "--lot", "X1", "--data", dir.resolve("data").toString(), "--out",
                dir.resolve("r.html").toString(), "--csv", csv.toString()).code()).isZero();
        List<String> rows = Files.readAllLines(csv);
        assertThat(rows.get(0)).startsWith("lot,inspection,position,serial,attempt,counts,verdict,limit,value");
        assertThat(rows).hasSize(1 + 16 * 3);
        // a single part measured into the sampled lot would take a record name the lot needs: refused
        Outcome single = run("run", PLAN, "--lot", "X1", "--serial", "HC0417-0009", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.resolve("runs").toString(),
                "--data", dir.resolve("data").toString(), "--calibration", dir.resolve("none").toString());
        assertThat(single.code()).isEqualTo(2);
        assertThat(single.err()).contains("lot X1 is inspected by sampling");
    }

    @Test
    void theSchemeCommandShowsTheSwitchAndRecordsOnlyDecisionsTheRulesAllow(@TempDir Path dir) throws Exception {
        // the demo tray's lot is rejected under normal inspection (ISO 2859-1 Table II-A: D, n 8, Ac 1);
        // two rejected lots within five tighten the supplier's scheme (ISO 2859-1:1999 9.3.1). These lots are
        // measured on the simulated bench: they move its scheme, kept apart, never the real supplier's
        String data = dir.resolve("data").toString();
        assertThat(lotRun(dir, "S1", "40", "--supplier", "Brackwater").code()).isEqualTo(1);
        assertThat(lotRun(dir, "S2", "40", "--supplier", "Brackwater").code()).isEqualTo(1);
        Outcome real = run("scheme", "QFD-IND-1M0", "--supplier", "Brackwater", "--data", data);
        assertThat(real.code()).isZero();
        assertThat(real.out()).contains("normal inspection").doesNotContain("S1");
        Outcome shown = run("scheme", "QFD-IND-1M0", "--supplier", "Brackwater", "--simulated", "--data", data);
        assertThat(shown.code()).isZero();
        assertThat(shown.out()).contains("simulated bench's scheme").contains("tightened inspection")
                .contains("lots S1 and S2 not accepted").contains("normal -> tightened");
        Outcome refused = run("scheme", "QFD-IND-1M0", "--supplier", "Brackwater", "--simulated", "--set", "reduced",
                "--reason", "asked for", "--data", data);
        assertThat(refused.code()).isEqualTo(2);
        assertThat(refused.err()).contains("not recorded").contains("--override");
        Outcome override = run("scheme", "QFD-IND-1M0", "--supplier", "Brackwater", "--simulated", "--set", "normal",
                "--reason", "supplier audit passed, QA decision 2026-12", "--override", "--operator", "Ines", "--data", data);
        assertThat(override.code()).isZero();
        assertThat(override.out()).contains("normal inspection").contains("override by Ines");
        assertThat(lotRun(dir, "S3", "40", "--supplier", "Brackwater").out()).contains("normal inspection");
        Outcome list = run("scheme", "--data", data);
        assertThat(list.out()).contains("simulated bench (apart").contains("Brackwater").contains("normal");
        // without --supplier: the part's one supplier in the store, not the no-supplier scheme
        Outcome inferred = run("scheme", "QFD-IND-1M0", "--simulated", "--data", data);
        assertThat(inferred.code()).isZero();
        assertThat(inferred.out()).contains("Brackwater").contains("normal inspection");
        assertThat(lotRun(dir, "S5", "40", "--supplier", "Other Coil Works").code()).isEqualTo(1);
        Outcome ambiguous = run("scheme", "QFD-IND-1M0", "--simulated", "--data", data);
        assertThat(ambiguous.code()).isEqualTo(2);
        assertThat(ambiguous.err()).contains("2 suppliers").contains("'Brackwater'").contains("--supplier");
        // lots lists say which lots are simulated; the real history has none of them
        assertThat(run("lots", "--data", data).out()).contains("simulated");
        Outcome history = run("history", "QFD-IND-1M0", "--data", data);
        assertThat(history.code()).isEqualTo(2);
        assertThat(history.err()).contains("no real lots");
        assertThat(run("history", "QFD-IND-1M0", "--simulated", "--data", data).out()).contains("S1");
        // tightened again after two more rejected lots: the next lot runs under the built-in Table 2-B
        // (ISO 2859-1:1999: lot 40, level II, D; AQL 6.5 an arrow down to E, n = 13, Ac 1, Re 2)
        assertThat(lotRun(dir, "S6", "40", "--supplier", "Brackwater").code()).isEqualTo(1);
        Outcome tightened = lotRun(dir, "S7", "40", "--supplier", "Brackwater");
        assertThat(tightened.out()).contains("tightened inspection").contains("n = 13");
        Outcome twoLines = lotRun(dir, "S4", "40", "--supplier", "Brack\nwater");
        assertThat(twoLines.code()).isEqualTo(2);
        assertThat(twoLines.err()).contains("--supplier: ").contains("U+000A at position 6")
                .contains("a supplier's name is one line");
    }

    @Test
    void aHalfMeasuredLotResumedWithOtherTermsIsRefusedNamingBoth(@TempDir Path dir) throws Exception {
        try (var store = ResultStore.open(dir.resolve("data/lrbench.db"))) {
            store.inspect(new LotTerms("X2", "QFD-IND-1M0", PLAN, Canonical.sha256(
                    Files.readAllBytes(Path.of(PLAN))), "sim-bench-1", 40, 8, "level II; AQL major 6.5", "Tam"), null, "t0");
        }
        Outcome o = lotRun(dir, "X2", "5");
        assertThat(o.code()).isEqualTo(2);
        assertThat(o.err()).contains("lot size: stored 40, given 5").contains("sample size: stored 8, given 2");
    }

    @Test
    void measuringAPartAgainNeedsAReasonAndKeepsTheFirstRecord(@TempDir Path dir) throws Exception {
        String runs = dir.resolve("runs").toString();
        Outcome fail = run("run", PLAN, "--lot", "T1", "--serial", "S4", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-high-r.yaml").toString(), "--runs", runs,
                "--calibration", dir.resolve("none").toString());
        assertThat(fail.code()).isEqualTo(1);
        String first = Files.readString(dir.resolve("runs/T1/S4.json"));
        Outcome noReason = run("run", PLAN, "--lot", "T1", "--serial", "S4", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", runs,
                "--calibration", dir.resolve("none").toString());
        assertThat(noReason.code()).isEqualTo(2);
        assertThat(noReason.err()).contains("S4.json exists").contains("--reason");
        Outcome again = run("run", PLAN, "--lot", "T1", "--serial", "S4", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", runs,
                "--calibration", dir.resolve("none").toString(), "--reason", "lead clip was loose");
        assertThat(again.code()).isZero();
        assertThat(Files.readString(dir.resolve("runs/T1/S4.json"))).isEqualTo(first);
        JsonNode second = new ObjectMapper().readTree(dir.resolve("runs/T1/S4~2.json").toFile());
        assertThat(second.get("attempt").get("number").asInt()).isEqualTo(2);
        assertThat(second.get("attempt").get("reason").asText()).isEqualTo("lead clip was loose");
    }

    @Test
    void badOptionValuesAreRefusedBeforeAnyPartIsMeasured(@TempDir Path dir) {
        Outcome o = run("run", PLAN, "--lot", "L", "--serial", "S", "--traces", "bogus", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.toString());
        assertThat(o.code()).isEqualTo(2);
        assertThat(o.err()).contains("--traces").contains("keep, none");
        assertThat(dir.resolve("L")).doesNotExist();
    }

    @Test
    void serialsInALotFileAreCheckedLikeTheCommandLinesOwn(@TempDir Path dir) throws Exception {
        Path lot = dir.resolve("evil-lot.yaml");
        Files.writeString(lot, Files.readString(Path.of(LOT_FILE)).replace("plan: ../plans/", "plan: " + HOME.resolve("plans") + "/")
                .replace("serial: HC0417-0002", "serial: ../../../x"));
        Outcome o = run("run", PLAN, "--lot", "X3", "--lot-size", "40", "--sim-lot", lot.toString(), "--runs",
                dir.resolve("runs").toString(), "--data", dir.resolve("data").toString());
        assertThat(o.code()).isEqualTo(2);
        assertThat(o.err()).contains(lot + ":").contains("serial '../../../x'");
        assertThat(dir.resolve("x")).doesNotExist();
        assertThat(dir.getParent().resolve("x")).doesNotExist();
    }

    @Test
    void verifyNamesAnEditedResultFile(@TempDir Path dir) throws Exception {
        assertThat(lotRun(dir, "X4", "40").code()).isEqualTo(1);
        Path json = dir.resolve("runs/X4/HC0417-0002.json");
        Files.writeString(json, Files.readString(json).replace("\"verdict\" : \"pass\"", "\"verdict\" : \"fail\""));
        Outcome v = run("verify", "--lot", "X4", "--data", dir.resolve("data").toString(), "--runs",
                dir.resolve("runs").toString());
        assertThat(v.code()).isEqualTo(1);
        assertThat(v.out()).contains("HC0417-0002.json: altered").contains("1 finding");
    }

    @Test
    void checkLoadsTheBenchAndItsDriversAndRefusesWhatARunWouldMeet(@TempDir Path dir) throws Exception {
        Outcome ok = run("check", PLAN);
        assertThat(ok.code()).as(ok.err()).isZero();
        assertThat(ok.out()).contains("drivers: generator generic-source").contains("digitizer generic-digitizer");
        // a driver folder with a zero timeout and an unknown placeholder, and a bench naming a missing driver
        Path drivers = copyOfDrivers(dir);
        Path digitizer = drivers.resolve("generic-digitizer.yaml");
        Files.writeString(digitizer, Files.readString(digitizer).replace("timeout: 10 s", "timeout: 0 s")
                .replace(":SENSe:SWEep:TINTerval {interval}", ":SENSe:SWEep:TINTerval {intervall}"));
        Outcome bad = run("check", PLAN, "--drivers", drivers.toString());
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains(digitizer + ":").contains("timeout: a reply timeout must be more than 0 s")
                .contains("{intervall}");
        Path bench = dir.resolve("bench.yaml");
        Files.writeString(bench, Files.readString(HOME.resolve("simulator/bench.yaml"))
                .replaceFirst("driver: generic-source", "driver: no-such-source"));
        Outcome missing = run("check", PLAN, "--bench", bench.toString());
        assertThat(missing.code()).isEqualTo(2);
        // reported where the mistake is: the bench file's driver line, with the drivers that are there
        int line = Files.readString(bench).lines().toList().indexOf(Files.readString(bench).lines()
                .filter(l -> l.contains("no-such-source")).findFirst().orElseThrow()) + 1;
        assertThat(missing.err()).contains(bench + ":" + line + ":").contains("generator.driver")
                .contains("no driver file no-such-source.yaml").contains("generic-source");
        Outcome list = run("drivers");
        assertThat(list.code()).isZero();
        assertThat(list.out()).containsPattern("generic-digitizer +digitizer ").containsPattern("generic-source +source ");
        assertThat(run("drivers", "--drivers", drivers.toString()).code()).isEqualTo(2);
    }

    @Test
    void theIoLogRecordsEveryMessageToAndFromEachInstrument(@TempDir Path dir) throws Exception {
        Path log = dir.resolve("io.log");
        Outcome o = run("run", PLAN, "--lot", "L-1", "--serial", "S-1", "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", dir.resolve("runs").toString(),
                "--calibration", dir.resolve("none").toString(), "--io-log", log.toString());
        assertThat(o.code()).as(o.err()).isZero();
        List<String> lines = Files.readAllLines(log);
        // IEEE 488.2 *IDN? to each instrument, and its four-field answer
        assertThat(lines).anyMatch(l -> l.matches("\\S+Z generator \\(generic-source at sim://generator\\) > \\*IDN\\?"));
        assertThat(lines).anyMatch(l -> l.contains("digitizer (generic-digitizer at sim://digitizer) < LRBENCH,SIM-DIGITIZER-2"));
        assertThat(lines).anyMatch(l -> l.matches(".*digitizer .* < block of [0-9]+ bytes: ([0-9a-f]{2} )+\\.\\.\\."));
        // the output goes off first, before anything else is said to any instrument
        assertThat(lines.get(0)).contains("generator").contains("> :OUTPut1:STATe OFF");
    }

    @Test
    void theDriverSelfTestExercisesEveryOperationAndNamesTheExchangeThatFailed(@TempDir Path dir) throws Exception {
        String part = HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString();
        Outcome ok = run("exercise", "--sim", part);
        assertThat(ok.code()).as(ok.out() + ok.err()).isZero();
        assertThat(ok.out()).contains("ok     digitizer fetch and decode, channel 2").contains("ok     signal").contains("21 of 21 operations worked");
        Path drivers = copyOfDrivers(dir);
        Path digitizer = drivers.resolve("generic-digitizer.yaml");
        Files.writeString(digitizer, Files.readString(digitizer).replace(":SENSe{channel}:VOLTage:RANGe {range}",
                ":SENSe{channel}:VOLTage:RANGe:BOGus {range}"));
        Outcome bad = run("exercise", "--sim", part, "--drivers", drivers.toString());
        assertThat(bad.code()).isEqualTo(3);
        // SCPI-1999: -113 is "Undefined header"; the failing command is named
        assertThat(bad.out()).containsPattern("FAILED digitizer range 1.0 V and read back, channel 1 .*RANGe:BOGus.*-113")
                .contains("ok     generator amplitude");
    }

    @Test
    void aPlanAskingMoreThanTheDriversDeclareIsRefusedBeforeAnyInstrumentIsTouched(@TempDir Path dir) throws Exception {
        Path drivers = copyOfDrivers(dir);
        Path source = drivers.resolve("generic-source.yaml");
        Files.writeString(source, Files.readString(source).replace("frequency: [1 mHz, 20 MHz]", "frequency: [1 mHz, 10 kHz]")
                .replace("amplitude: 10 V ", "amplitude: 2 V "));
        Path digitizer = drivers.resolve("generic-digitizer.yaml");
        Files.writeString(digitizer, Files.readString(digitizer).replace("interval: 1 ns", "interval: 10 us"));
        Outcome o = run("check", PLAN, "--drivers", drivers.toString());
        assertThat(o.code()).isEqualTo(2);
        // the demo plan sweeps 200 Hz to 20 kHz at 3 V with a triangle check (plans/qfd-ind-1m0.yaml)
        assertThat(o.err()).contains("20.00 kHz is above the 10.00 kHz that the generator driver generic-source")
                .contains("is above the 2.000 V that the generator driver generic-source")
                .contains("between samples; the digitizer driver generic-digitizer").contains("declares 10.00 us at the shortest");
        assertThat(run("check", PLAN).code()).isZero();
        // a problem in generated frequencies is said once, at the key they came from, in sensible units
        Path far = dir.resolve("far.yaml");
        String text = Files.readString(Path.of(PLAN)).replace("    stop: 20 kHz", "    stop: 10 GHz")
                .replace("    start: 200 Hz", "    start: 1e-30 Hz");
        Files.writeString(far, text);
        Outcome f = run("check", far.toString());
        assertThat(f.code()).isEqualTo(2);
        List<String> lines = f.err().lines().filter(l -> l.contains("generator driver")).toList();
        assertThat(lines).hasSize(2);
        int stopLine = text.lines().toList().indexOf(text.lines().filter(l -> l.contains("stop: 10 GHz")).findFirst()
                .orElseThrow()) + 1;
        assertThat(lines).anySatisfy(l -> assertThat(l).startsWith(far + ":" + stopLine + ":")
                .contains("sine_sweep.log_sweep.stop").contains("above the 20.00 MHz"));
        assertThat(lines).anySatisfy(l -> assertThat(l).contains("sine_sweep.log_sweep.start").contains("1.000e-30 Hz")
                .doesNotContain("0.000 pHz"));
    }

    @Test
    void aMultisinePlanIsRefusedWhereTheGeneratorCannotPlayIt(@TempDir Path dir) throws Exception {
        Path plan = dir.resolve("multisine.yaml");
        Files.writeString(plan, Files.readString(Path.of(PLAN)).replace("  settle: 20 ms", "  settle: 20 ms\n  excitation: multisine"));
        assertThat(run("check", plan.toString()).code()).as("the generic source plays arbitrary waveforms").isZero();
        // the peak-EMF generator's driver gives no arbitrary-waveform commands
        Outcome peak = run("check", plan.toString(), "--bench", HOME.resolve("simulator/bench-pm12.yaml").toString());
        assertThat(peak.code()).isEqualTo(2);
        assertThat(peak.err()).contains("excitation multisine needs arbitrary-waveform commands");
        // the demo plan leaves its excitation open: there it is not refused but stepped, and check says why
        Outcome open = run("check", PLAN, "--bench", HOME.resolve("simulator/bench-pm12.yaml").toString());
        assertThat(open.code()).isZero();
        assertThat(open.out()).contains("excitation: stepped (excitation auto): the multisine is not possible here")
                .contains("arbitrary-waveform commands");
        // a waveform memory too small for 200 Hz to 20 kHz on bins within 2 %
        Path drivers = copyOfDrivers(dir);
        Path source = drivers.resolve("generic-source.yaml");
        Files.writeString(source, Files.readString(source).replace("arbitrary_samples: 65536", "arbitrary_samples: 1024"));
        Outcome small = run("check", plan.toString(), "--drivers", drivers.toString());
        assertThat(small.code()).isEqualTo(2);
        assertThat(small.err()).contains("waveform samples; the generator takes 1024");
        // a tolerance belongs to a sweep that may be a multisine: not to one that says it is stepped
        Path stepped = dir.resolve("stepped.yaml");
        Files.writeString(stepped, Files.readString(Path.of(PLAN)).replace("  settle: 20 ms",
                "  settle: 20 ms\n  excitation: stepped\n  multisine_tolerance: 1 %"));
        Outcome tol = run("check", stepped.toString());
        assertThat(tol.code()).isEqualTo(2);
        assertThat(tol.err()).contains("multisine_tolerance").contains("excitation: stepped has no tones to place");
    }

    @Test
    void correctionsReadForTheSteppedSweepKeepAnOpenPlanStepped(@TempDir Path dir) throws Exception {
        // a bench calibrated before its plans' excitation was chosen (or with the plan stepped): the multisine
        // this bench would choose has tones the fixture compensation was not read at, so every part would be
        // measured and then end in error; the run is stepped instead, and says how to get the multisine
        Path stepped = dir.resolve("stepped.yaml");
        Files.writeString(stepped, Files.readString(Path.of(PLAN)).replace("  settle: 20 ms",
                "  settle: 20 ms\n  excitation: stepped"));
        String part = HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString();
        Outcome cal = run("calibrate", stepped.toString(), "--sim", part, "--calibration", dir.resolve("cal").toString());
        assertThat(cal.code()).as(cal.out() + cal.err()).isZero();
        Outcome r = run("run", PLAN, "--lot", "LS", "--serial", "S1", "--sim", part, "--runs",
                dir.resolve("runs").toString(), "--data", dir.resolve("data").toString(), "--calibration",
                dir.resolve("cal").toString());
        assertThat(r.code()).as(r.out() + r.err()).isZero();
        assertThat(r.out()).contains("excitation: stepped (excitation auto): the corrections in force")
                .contains("lrbench calibrate with this plan");
        // calibrated with the open plan itself, the multisine runs
        assertThat(run("calibrate", PLAN, "--sim", part, "--calibration", dir.resolve("cal").toString()).code()).isZero();
        Outcome again = run("run", PLAN, "--lot", "LS", "--serial", "S2", "--sim", part, "--runs",
                dir.resolve("runs").toString(), "--data", dir.resolve("data").toString(), "--calibration",
                dir.resolve("cal").toString());
        assertThat(again.code()).as(again.out() + again.err()).isZero();
        assertThat(again.out()).contains("excitation: multisine (excitation auto)");
    }

    @Test
    void aStudyOfTheDemoPlanShowsTheSimulatedBenchFitAndSaysWhy(@TempDir Path dir) throws Exception {
        // the figures' definitions are checked in study.GaugeStudyTests; here the command end to end
        Outcome o = run("study", PLAN, "--benches", HOME.resolve("simulator/bench.yaml") + "," + HOME.resolve("simulator/bench-div8.yaml"),
                "--trials", "2", "--repeats", "10", "--runs", dir.toString());
        assertThat(o.code()).as(o.out() + o.err()).isZero();
        assertThat(o.out()).contains("8 parts x 2 benches x 2 trials").contains("%GRR of the tolerance")
                .contains("distinct categories").contains("type-1 study").contains("Cgk").contains("the bench is fit");
        Path page;
        try (var files = Files.list(dir.resolve("studies"))) {
            page = files.findFirst().orElseThrow();
        }
        assertThat(Files.readString(page)).contains("Measured on the simulated bench").contains("appraiser").contains("repeatability")
                .doesNotContain("null").contains("data:image/png;base64,");
        Outcome one = run("study", PLAN, "--benches", HOME.resolve("simulator/bench.yaml").toString());
        assertThat(one.code()).isEqualTo(2);
        assertThat(one.err()).contains("at least 2 benches");
    }

    @Test
    void aLotRunOnABenchWithACheckStandardWaitsForAnInControlCheck(@TempDir Path dir) throws Exception {
        String bench = HOME.resolve("simulator/bench-checked.yaml").toString();
        String lotFile = HOME.resolve("simulator/demo-lot.yaml").toString();
        String runs = dir.resolve("runs").toString();
        String cal = dir.resolve("cal").toString();
        String data = dir.resolve("data").toString();
        String[] lotRun = {"run", PLAN, "--bench", bench, "--lot", "C1", "--lot-size", "40", "--sim-lot", lotFile,
            "--runs", runs, "--calibration", cal, "--data", data};
        // no check yet: refused before any instrument is touched, saying why and what to do
        Outcome first = run(lotRun);
        assertThat(first.code()).isEqualTo(2);
        assertThat(first.err()).contains("not started").contains("QFD-REF-0001 has not been measured").contains("lrbench standard");
        assertThat(run("calibrate", PLAN, "--bench", bench, "--sim", HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(),
                "--calibration", cal).code()).isZero();
        Outcome check = run("standard", "--bench", bench, "--runs", runs, "--calibration", cal, "--data", data);
        assertThat(check.code()).as(check.out() + check.err()).isZero();
        assertThat(check.out()).contains("in control").contains("En =");
        assertThat(dir.resolve("runs/check-standard/sim-bench-checked/chart.html")).exists();
        Outcome second = run(lotRun);
        assertThat(second.code()).as(second.out() + second.err()).isIn(0, 1);
        assertThat(second.out()).contains("disposition");
        // a bench whose certificate disagrees with what it measures: out of control, lot refused, override recorded
        Path off = dir.resolve("bench-off.yaml");
        Files.writeString(off, Files.readString(Path.of(bench)).replace("inductance: 1.0000 mH", "inductance: 1.0200 mH")
                .replace("plan: ../plans/", "plan: " + HOME.resolve("plans") + "/")
                .replace("part: parts/", "part: " + HOME.resolve("simulator/parts") + "/"));
        String[] offRun = lotRun.clone();
        offRun[3] = off.toString();
        offRun[5] = "C2";
        Outcome bad = run("standard", "--bench", off.toString(), "--runs", runs, "--calibration", cal, "--data", data);
        assertThat(bad.code()).isEqualTo(1);
        assertThat(bad.out()).contains("OUT OF CONTROL");
        Outcome refused = run(offRun);
        assertThat(refused.code()).isEqualTo(2);
        assertThat(refused.err()).contains("was out of control");
        String[] overridden = java.util.Arrays.copyOf(offRun, offRun.length + 2);
        overridden[offRun.length] = "--override-check";
        overridden[offRun.length + 1] = "reference part sent for recertification";
        Outcome anyway = run(overridden);
        assertThat(anyway.code()).as(anyway.out() + anyway.err()).isIn(0, 1);
        assertThat(anyway.out()).contains("override recorded");
        try (var files = Files.list(dir.resolve("runs/check-standard/sim-bench-checked/overrides"))) {
            assertThat(Files.readString(files.findFirst().orElseThrow())).contains("recertification").contains("C2");
        }
        assertThat(run("verify", "--data", data, "--runs", runs).code()).isZero();
    }

    /**
     * The check standard's readings and the overrides of its gate are links of the store's chain of check
     * files: a reading forged in control (a copy of the last, edited) is named by verify and does not open
     * the gate; an override removed is named by verify, and so is one cut from the store's chain.
     */
    @Test
    void checkReadingsAndOverridesAreKeptInTheStoresChain(@TempDir Path dir) throws Exception {
        String bench = HOME.resolve("simulator/bench-checked.yaml").toString();
        String runs = dir.resolve("runs").toString();
        String cal = dir.resolve("cal").toString();
        String data = dir.resolve("data").toString();
        Path off = dir.resolve("bench-off.yaml");
        Files.writeString(off, Files.readString(Path.of(bench)).replace("inductance: 1.0000 mH", "inductance: 1.0200 mH")
                .replace("plan: ../plans/", "plan: " + HOME.resolve("plans") + "/")
                .replace("part: parts/", "part: " + HOME.resolve("simulator/parts") + "/"));
        assertThat(run("calibrate", PLAN, "--bench", off.toString(), "--sim",
                HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--calibration", cal).code()).isZero();
        assertThat(run("standard", "--bench", off.toString(), "--runs", runs, "--calibration", cal, "--data", data)
                .code()).isEqualTo(1);
        String[] lotRun = {"run", PLAN, "--bench", off.toString(), "--lot", "C3", "--lot-size", "40", "--sim-lot",
            HOME.resolve("simulator/demo-lot.yaml").toString(), "--runs", runs, "--calibration", cal, "--data", data,
            "--override-check", "reference part sent for recertification"};
        assertThat(run(lotRun).code()).isIn(0, 1);
        Outcome whole = run("verify", "--data", data, "--runs", runs);
        assertThat(whole.code()).as(whole.out()).isZero();
        Path folder = dir.resolve("runs/check-standard/sim-bench-checked");
        Path reading;
        try (var files = Files.list(folder)) {
            reading = files.filter(f -> f.toString().endsWith(".json")).findFirst().orElseThrow();
        }
        // a forged reading, in control, later than the real one
        Path forged = folder.resolve("29991231T235959.000Z.json");
        Files.writeString(forged, Files.readString(reading).replaceFirst("\"in_control\"\\s*:\\s*false", "\"in_control\":true")
                .replaceFirst("\"taken_at\"\\s*:\\s*\"[^\"]+\"", "\"taken_at\":\"" + java.time.Instant.now() + "\""));
        assertThat(Files.readString(forged)).contains("\"in_control\":true");
        Outcome named = run("verify", "--data", data, "--runs", runs);
        assertThat(named.code()).isNotZero();
        assertThat(named.out()).contains(forged.getFileName().toString()).contains("no record");
        String[] next = java.util.Arrays.copyOf(lotRun, lotRun.length - 2);
        next[5] = "C4";
        Outcome refused = run(next);
        assertThat(refused.code()).as(refused.out() + refused.err()).isEqualTo(2);
        assertThat(refused.err()).contains("not one the store recorded");
        Files.delete(forged);
        // the override removed: named as missing
        Path override;
        try (var files = Files.list(folder.resolve("overrides"))) {
            override = files.findFirst().orElseThrow();
        }
        Files.delete(override);
        Outcome missing = run("verify", "--data", data, "--runs", runs);
        assertThat(missing.code()).isNotZero();
        assertThat(missing.out()).contains(override.getFileName().toString()).contains("missing");
        // and the override's link cut from the store with plain SQL: the chain's head names the cut
        try (var c = java.sql.DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("data/lrbench.db"));
             var st = c.createStatement()) {
            st.executeUpdate("DELETE FROM check_file WHERE kind = 'override'");
        }
        Outcome cut = run("verify", "--data", data, "--runs", runs);
        assertThat(cut.code()).isNotZero();
        assertThat(cut.out()).contains("check files").contains("head");
    }

    @Test
    void aLowSideFixtureIsCalibratedOnTheRawChannels(@TempDir Path dir) throws Exception {
        // low side: channel 2 sees the part and the sense resistor; the channel match must compare the
        // raw channels (not channel 2 less channel 1) and be taken out before the difference. Truth:
        // the simulated bench's channel 2 reads 0.4 % high and its leads are 25 mohm (simulator/bench.yaml)
        Path plan = dir.resolve("low-side.yaml");
        Files.writeString(plan, Files.readString(Path.of(PLAN)).replaceFirst("(?m)^(\\s+)sense_resistor: (.*)$",
                "$1sense_resistor: $2\n$1wiring: low_side\n$1probes: {channel1: {kind: single_ended, attenuation: 10},"
                        + " channel2: {kind: single_ended, attenuation: 10}}"));
        String part = HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString();
        Outcome cal = run("calibrate", plan.toString(), "--sim", part, "--calibration", dir.resolve("cal").toString());
        assertThat(cal.code()).as(cal.out() + cal.err()).isZero();
        java.util.regex.Matcher gain = java.util.regex.Pattern.compile("channel 2 gain ([0-9.]+)").matcher(cal.out());
        assertThat(gain.find()).as(cal.out()).isTrue();
        assertThat(Double.parseDouble(gain.group(1))).isCloseTo(1.004, within(0.001));
        java.util.regex.Matcher shortR = java.util.regex.Pattern.compile("short (-?[0-9.]+) mohm").matcher(cal.out());
        assertThat(shortR.find()).as(cal.out()).isTrue();
        // the short read through x10 probes is noisy (about 18 mohm per reading): judged against its own
        // stated uncertainty, the mean over the sweep's frequencies within 3 u / sqrt(n) of the 25 mohm
        // leads; a short taken from channel 2 less channel 1 before the match would be off by ohms
        JsonNode fixture = new com.fasterxml.jackson.databind.ObjectMapper().readTree(
                dir.resolve("cal/sim-bench-1/fixture.json").toFile());
        double sum = 0;
        double u = 0;
        int n = fixture.get("points").size();
        for (JsonNode p : fixture.get("points")) {
            sum += p.get("short_real").asDouble();
            u = Math.max(u, p.get("short_uncertainty_ohm").asDouble());
        }
        assertThat(u).as("the short's stated uncertainty").isLessThan(0.03);
        assertThat(sum / n).isCloseTo(0.025, within(3 * u / Math.sqrt(n)));
        Outcome r = run("run", plan.toString(), "--lot", "LS", "--serial", "S1", "--sim", part, "--runs",
                dir.resolve("runs").toString(), "--data", dir.resolve("data").toString(), "--calibration", dir.resolve("cal").toString(),
                "--json", dir.resolve("r.json").toString());
        assertThat(r.code()).as(r.out() + r.err()).isZero();
        JsonNode j = new com.fasterxml.jackson.databind.ObjectMapper().readTree(dir.resolve("r.json").toFile());
        // common practice, no source: within 0.5 % in L and 5 % in R of the simulated part (1 mH, 2.3 ohm)
        assertThat(j.get("inductance_h").asDouble()).isCloseTo(1e-3, within(0.005e-3));
        assertThat(j.get("series_resistance_ohm").asDouble()).isCloseTo(2.3, within(0.05 * 2.3));
    }

    @Test
    void aStudyFromRecordsArrangesPartsOperatorsAndTrials(@TempDir Path dir) throws Exception {
        // the real-bench path: each part measured by each operator twice with run --serial --operator
        String runs = dir.resolve("runs").toString();
        String[] parts = {"simulator/parts/qfd-ind-1m0-nominal.yaml", "simulator/parts/qfd-ref-1m0.yaml"};
        for (int i = 0; i < parts.length; i++) {
            for (String operator : new String[] {"Ada", "Ben"}) {
                for (int trial = 0; trial < 2; trial++) {
                    List<String> args = new java.util.ArrayList<>(List.of("run", PLAN, "--lot", "GRR-1", "--serial", "P" + i,
                            "--operator", operator, "--sim", HOME.resolve(parts[i]).toString(), "--runs", runs,
                            "--data", dir.resolve("data").toString(), "--calibration", dir.resolve("none").toString()));
                    if (operator.equals("Ben") || trial > 0) {
                        args.addAll(List.of("--reason", "study trial"));
                    }
                    assertThat(run(args.toArray(String[]::new)).code()).isIn(0, 1);
                }
            }
        }
        Outcome o = run("study", PLAN, "--records", "GRR-1", "--runs", runs);
        assertThat(o.code()).as(o.out() + o.err()).isIn(0, 1);
        assertThat(o.out()).contains("2 parts x 2 operators (Ada, Ben) x 2 trials").contains("%GRR of the tolerance")
                .contains("study page:");
        // an unbalanced study is refused, naming the cell
        assertThat(run("run", PLAN, "--lot", "GRR-1", "--serial", "P0", "--operator", "Ada", "--sim",
                HOME.resolve(parts[0]).toString(), "--runs", runs, "--data", dir.resolve("data").toString(), "--calibration",
                dir.resolve("none").toString(), "--reason", "one more").code()).isIn(0, 1);
        Outcome bad = run("study", PLAN, "--records", "GRR-1", "--runs", runs);
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("not balanced").contains("P0/Ada 3, P0/Ben 2, P1/Ada 2, P1/Ben 2");
    }

    @Test
    void theWindingResistanceLimitIsJudgedAtTheReferenceTemperature(@TempDir Path dir) throws Exception {
        // R at the plan's bench temperature of 23 C is R / (1 + 0.00393 x 3) at the specification's 20 C
        // (copper, IACS alpha at 20 C, NBS Handbook 100): 2.62 ohm there is 2.5898 ohm here
        Path part = dir.resolve("warm.yaml");
        Files.writeString(part, Files.readString(HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml"))
                .replace("series_resistance: 2.3 ohm", "series_resistance: 2.62 ohm"));
        Outcome o = run("run", PLAN, "--lot", "L-T", "--serial", "S-1", "--sim", part.toString(), "--runs",
                dir.resolve("runs").toString(), "--calibration", dir.resolve("none").toString());
        JsonNode r = new ObjectMapper().readTree(dir.resolve("runs/L-T/S-1.json").toFile());
        JsonNode winding = null;
        for (JsonNode l : r.get("limits")) {
            if (l.get("characteristic").asText().equals("series_resistance")) {
                winding = l;
            }
        }
        assertThat(winding).as(o.out()).isNotNull();
        // the limit reads the sweep's R_dc carried to 20 C; the reported R_dc stays as measured at 23 C
        assertThat(winding.get("value").asDouble()).isCloseTo(r.get("series_resistance_ohm").asDouble() / (1 + 0.00393 * 3),
                Assertions.within(1e-9));
        assertThat(winding.get("reason").asText()).contains("at 20.00 C (copper, from 23.00 C)");
        double meter = 1 + org.lrbench.bench.BenchLoader.load(HOME.resolve("simulator/bench.yaml")).simulation().meterError();
        assertThat(r.get("dc_resistance").get("at_reference_ohm").asDouble())
                .isCloseTo(2.62 * meter / (1 + 0.00393 * 3), Assertions.within(1e-9));
    }

    @Test
    void everyCommandAnswersHelpAndTheCompletionScriptKnowsThem() {
        for (String[] command : new String[][] {{"run"}, {"check"}, {"lots"}, {"lot"}, {"demo"}, {"serve"}, {"analyze"},
            {"benchmark"}, {"benchmark", "coverage"}, {"verify"}, {"exercise"}, {"drivers"}, {"report"}, {"calibrate"},
            {"rehearse"}, {"history"}, {"sim"}}) {
            String[] args = Arrays.copyOf(command, command.length + 1);
            args[command.length] = "--help";
            Outcome o = run(args);
            assertThat(o.code()).as(String.join(" ", args) + o.err()).isZero();
            assertThat(o.out()).as(String.join(" ", args)).contains("Usage: lrbench " + String.join(" ", command));
        }
        Outcome help = run("help", "run");
        assertThat(help.code()).isZero();
        assertThat(help.out()).contains("Usage: lrbench run").contains("--lot-size");
        Outcome completion = run("completion");
        assertThat(completion.code()).isZero();
        assertThat(completion.out()).contains("complete").contains("--reinspect").contains("verify");
    }

    /** The coverage benchmark refuses a bad option before it measures anything, naming the option and what is allowed. */
    @Test
    void theCoverageBenchmarkRefusesABadFirstSeedOrExcitation() {
        Outcome seed = run("benchmark", "coverage", "--first-seed", "-4", "--seeds", "5");
        assertThat(seed.code()).as(seed.err()).isEqualTo(2);
        assertThat(seed.err()).contains("--first-seed -4").contains("0 and above");
        Outcome excitation = run("benchmark", "coverage", "--excitation", "chirp", "--seeds", "5");
        assertThat(excitation.code()).as(excitation.err()).isEqualTo(2);
        assertThat(excitation.err()).contains("--excitation 'chirp'").contains("stepped, multisine");
    }

    /** A copy of the shipped driver files to edit in a test. */
    static Path copyOfDrivers(Path dir) throws IOException {
        Path drivers = dir.resolve("drivers");
        Files.createDirectories(drivers);
        try (var files = Files.list(HOME.resolve("drivers"))) {
            for (Path f : files.toList()) {
                Files.copy(f, drivers.resolve(f.getFileName()));
            }
        }
        return drivers;
    }

    @Test
    void verifyNamesFilesAndFoldersNoRecordAccountsForAndAnAlteredSummary(@TempDir Path dir) throws Exception {
        Outcome demo = run("demo", "--runs", dir.resolve("runs").toString(), "--calibration", dir.resolve("cal").toString(),
                "--data", dir.resolve("data").toString());
        assertThat(demo.code()).as(demo.err()).isZero();
        String[] verify = {"verify", "--runs", dir.resolve("runs").toString(), "--data", dir.resolve("data").toString()};
        assertThat(run(verify).code()).isZero();
        Path lot = dir.resolve("runs/HCC-2611-0417");
        // a forged second attempt, a folder of no lot, a summary whose disposition was changed to accept
        Files.copy(lot.resolve("HC0417-0004.json"), lot.resolve("HC0417-0004~2.json"));
        Files.createDirectories(dir.resolve("runs/GHOST"));
        Path summary = lot.resolve("lot-summary.json");
        Files.writeString(summary, Files.readString(summary).replace("\"reject\"", "\"accept\""));
        Outcome found = run(verify);
        assertThat(found.code()).isEqualTo(1);
        assertThat(found.out()).contains("HC0417-0004~2.json: a file no record").contains("GHOST/: a lot folder the store"
                + " has no lot for").contains("says disposition accept, the store's is reject");
    }

    /**
     * A chain cut back with plain SQL (its last links, the attempts and the decision they record removed,
     * the head re-pointed at an earlier link) is consistent in itself: only an anchor taken before, kept
     * outside the store, shows the cut. The anchor file is never replaced, and one edited after it was
     * taken, or not the one whose closing line was kept, is refused (hash chains and anchoring: common
     * practice, no source).
     */
    @Test
    void anAnchorKeptOutsideTheStoreShowsAChainCutBack(@TempDir Path dir) throws Exception {
        Outcome demo = run("demo", "--runs", dir.resolve("runs").toString(), "--calibration", dir.resolve("cal").toString(),
                "--data", dir.resolve("data").toString());
        assertThat(demo.code()).as(demo.err()).isZero();
        String data = dir.resolve("data").toString();
        Path file = dir.resolve("anchors/2026-12-03.txt");
        Outcome taken = run("anchor", file.toString(), "--data", data);
        assertThat(taken.code()).as(taken.err()).isZero();
        String kept = taken.out().replaceAll("(?s).*keep this line outside the store: sha256: ([0-9a-f]{64}).*", "$1");
        assertThat(kept).hasSize(64);
        assertThat(run("anchor", file.toString(), "--data", data).code()).isEqualTo(2);
        String[] verify = {"verify", "--data", data, "--runs", dir.resolve("runs").toString(), "--anchor", file.toString(),
            "--anchor-sha256", kept};
        Outcome whole = run(verify);
        assertThat(whole.code()).as(whole.out()).isZero();
        assertThat(whole.out()).contains("still holds every link it had then");
        try (var c = java.sql.DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("data/lrbench.db"));
             var st = c.createStatement()) {
            int length;
            try (var r = st.executeQuery("SELECT length FROM lot_chain")) {
                r.next();
                length = r.getInt(1);
            }
            int keep = length - 3;
            st.executeUpdate("DELETE FROM attempt WHERE (serial, attempt, round) IN (SELECT serial, attempt, round"
                    + " FROM chain_record WHERE kind = 'attempt' AND seq > " + keep + ")");
            st.executeUpdate("UPDATE inspection SET disposition = NULL, disposition_reason = NULL, finished_at = NULL");
            st.executeUpdate("DELETE FROM chain_record WHERE seq > " + keep);
            st.executeUpdate("UPDATE lot_chain SET length = " + keep + ", head_sha256 = (SELECT record_sha256 FROM"
                    + " chain_record WHERE seq = " + keep + ")");
        }
        Outcome cut = run("verify", "--data", data, "--anchor", file.toString(), "--anchor-sha256", kept, "--runs",
                dir.resolve("runs").toString());
        assertThat(cut.code()).isEqualTo(1);
        assertThat(cut.out()).contains("its tail was cut");
        // the anchor file edited to match the cut chain is refused by its own closing line
        Files.writeString(file, Files.readString(file).replaceAll("\t\\d+\t", "\t1\t"));
        Outcome edited = run(verify);
        assertThat(edited.code()).isEqualTo(2);
        assertThat(edited.err()).contains("the file was edited after it was taken");
    }

    /** The operator's name and a reason from the command line follow the same one-line rule as in the service. */
    @Test
    void anOperatorOrReasonWithAControlCharacterIsRefusedAtItsOption(@TempDir Path dir) throws Exception {
        Outcome op = run("run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "L1", "--serial", "S1",
                "--operator", "Ann\u001b[2J", "--runs", dir.resolve("runs").toString(), "--data", dir.resolve("data").toString());
        assertThat(op.code()).isEqualTo(2);
        assertThat(op.err()).contains("--operator: ").contains("U+001B at position 4").doesNotContain("\u001b");
        Outcome why = run("run", HOME.resolve("plans/qfd-ind-1m0.yaml").toString(), "--lot", "L1", "--serial", "S1",
                "--reason", "slipped\nagain", "--runs", dir.resolve("runs").toString(), "--data", dir.resolve("data").toString());
        assertThat(why.code()).isEqualTo(2);
        assertThat(why.err()).contains("--reason: ").contains("U+000A at position 8");
        assertThat(dir.resolve("runs")).doesNotExist();
    }

    /**
     * A part measured on its own (run --serial) is a link of the store's chain of single parts: verify
     * checks its files as it checks a lot's. A verdict changed from fail to pass in the file, a record
     * removed from the store, or a cut tail (against an anchor) is named, never "whole".
     */
    @Test
    void aSinglePartsRecordIsUnderTheChainAndItsFilesAreChecked(@TempDir Path dir) throws Exception {
        String data = dir.resolve("data").toString();
        String runs = dir.resolve("runs").toString();
        for (String serial : new String[] {"S1", "S2"}) {
            Outcome o = run("run", PLAN, "--lot", "SINGLES", "--serial", serial, "--sim",
                    HOME.resolve("simulator/parts/qfd-ind-1m0-nominal.yaml").toString(), "--runs", runs, "--data", data,
                    "--calibration", dir.resolve("none").toString());
            assertThat(o.code()).as(o.out() + o.err()).isZero();
        }
        Path anchor = dir.resolve("anchor.txt");
        assertThat(run("anchor", anchor.toString(), "--data", data).code()).isZero();
        assertThat(Files.readString(anchor)).contains("~single-parts\t2\t");
        Outcome whole = run("verify", "--data", data, "--runs", runs, "--anchor", anchor.toString());
        assertThat(whole.code()).as(whole.out()).isZero();
        Outcome one = run("verify", "--lot", "SINGLES", "--data", data, "--runs", runs);
        assertThat(one.code()).as(one.out() + one.err()).isZero();
        Path record = dir.resolve("runs/SINGLES/S1.json");
        Files.writeString(record, Files.readString(record).replace("\"pass\"", "\"fail\""));
        Outcome altered = run("verify", "--data", data, "--runs", runs);
        assertThat(altered.code()).isEqualTo(1);
        assertThat(altered.out()).contains("S1.json: altered");
        try (var c = java.sql.DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("data/lrbench.db"));
             var st = c.createStatement()) {
            st.executeUpdate("DELETE FROM single_part WHERE seq = 2");
            st.executeUpdate("UPDATE single_part_chain SET length = 1, head_sha256 = (SELECT record_sha256 FROM single_part"
                    + " WHERE seq = 1)");
        }
        Outcome cut = run("verify", "--data", data, "--runs", runs, "--anchor", anchor.toString());
        assertThat(cut.code()).isEqualTo(1);
        assertThat(cut.out()).contains("single parts: anchored with 2 link(s)").contains("S2.json: a file no record");
    }

    /**
     * A lot another run holds (its process alive) is refused before anything is measured, naming the holder,
     * with exit code 6; once that run has given it back, the lot runs, and gives its own hold back at the end.
     */
    @Test
    void aLotAnotherRunHoldsIsRefusedNamingItsHolder(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("data/lrbench.db");
        Files.createDirectories(db.getParent());
        java.time.Instant now = java.time.Instant.now();
        var other = new org.lrbench.store.LotHold("H1", "someone-else", "bench-east", "lab-pc-2",
                ProcessHandle.current().pid(), now, now);
        try (var s = org.lrbench.store.ResultStore.open(db)) {
            assertThat(s.holdLot(other, java.time.Duration.ofMinutes(5))).isNull();
        }
        Outcome held = lotRun(dir, "H1", "40");
        assertThat(held.code()).as(held.out() + held.err()).isEqualTo(6);
        assertThat(held.err()).contains("lot H1 is being measured by another run: bench bench-east")
                .contains("lab-pc-2").contains("Nothing was measured");
        assertThat(dir.resolve("runs/H1")).doesNotExist();
        try (var s = org.lrbench.store.ResultStore.open(db)) {
            s.releaseHold(other);
        }
        Outcome ran = lotRun(dir, "H1", "40");
        assertThat(ran.code()).as(ran.err()).isIn(0, 1);
        try (var s = org.lrbench.store.ResultStore.open(db)) {
            assertThat(s.heldBy("H1")).isNull();
        }
    }

    /**
     * Two benches, one store, each bench its own runs folder: verify of one folder with --files-of its bench
     * checks that bench's files and every lot's chain, and does not report the other bench's files as missing.
     */
    @Test
    void verifyChecksEachBenchsOwnRunsFolder(@TempDir Path dir) throws Exception {
        String data = dir.resolve("data").toString();
        Path east = dir.resolve("east");
        Path west = dir.resolve("west");
        Outcome a = run("run", PLAN, "--lot", "LE", "--lot-size", "40", "--sim-lot", LOT_FILE, "--runs", east.toString(),
                "--data", data, "--calibration", dir.resolve("none").toString(), "--operator", "Tam");
        assertThat(a.code()).as(a.err()).isIn(0, 1);
        Outcome b = run("run", PLAN, "--lot", "LW", "--lot-size", "40", "--sim-lot", LOT_FILE, "--runs", west.toString(),
                "--data", data, "--calibration", dir.resolve("none").toString(), "--operator", "Tam", "--bench",
                HOME.resolve("simulator/bench-pm12.yaml").toString());
        assertThat(b.code()).as(b.err()).isIn(0, 1);
        Outcome mixed = run("verify", "--data", data, "--runs", east.toString());
        assertThat(mixed.code()).isEqualTo(1);
        assertThat(mixed.out()).contains("LW").contains("missing");
        Outcome eastOnly = run("verify", "--data", data, "--runs", east.toString(), "--files-of", "sim-bench-1");
        assertThat(eastOnly.code()).as(eastOnly.out()).isZero();
        Outcome westOnly = run("verify", "--data", data, "--runs", west.toString(), "--files-of", "sim-bench-pm12");
        assertThat(westOnly.code()).as(westOnly.out()).isZero();
        // the other bench's chain is still checked from either folder
        try (var c = java.sql.DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("data/lrbench.db"));
             var st = c.createStatement()) {
            st.executeUpdate("UPDATE attempt SET operator = 'Someone' WHERE lot = 'LW'");
        }
        Outcome altered = run("verify", "--data", data, "--runs", east.toString(), "--files-of", "sim-bench-1");
        assertThat(altered.code()).isEqualTo(1);
        assertThat(altered.out()).contains("lot LW").contains("altered");
    }

    /**
     * A prompted lot on the in-process simulated bench: serials typed at the prompts pick the tray's parts,
     * a serial not on the tray is refused and asked again, and the lot ends as the same parts unattended do.
     */
    @Test
    void aPromptedLotRunsOnTheSimulatedBench(@TempDir Path dir) throws Exception {
        StringBuilder typed = new StringBuilder("NOT-ON-TRAY\n");
        for (int i = 1; i <= 8; i++) {
            typed.append("HC0417-000").append(i).append("\n\n");
        }
        java.io.InputStream before = System.in;
        Outcome o;
        try {
            System.setIn(new java.io.ByteArrayInputStream(typed.toString().getBytes(StandardCharsets.UTF_8)));
            o = lotRun(dir, "P1", "40", "--at-prompts");
        } finally {
            System.setIn(before);
        }
        assertThat(o.code()).as(o.out() + o.err()).isIn(0, 1);
        assertThat(o.out()).contains("NOT-ON-TRAY is not on the simulated tray").contains("HC0417-0001");
        Outcome unattended = lotRun(dir, "P2", "40");
        assertThat(o.code()).isEqualTo(unattended.code());
        Outcome noTray = run("run", PLAN, "--lot", "P4", "--lot-size", "40", "--at-prompts", "--data",
                dir.resolve("data").toString());
        assertThat(noTray.code()).isEqualTo(2);
        assertThat(noTray.err()).contains("--at-prompts is for a simulated tray");
    }

    /**
     * Separate processes started at one instant on one lot (each a JVM of its own, as benches are): every one
     * ends in a clear outcome: the run that holds the lot measures it, the others are refused naming it (exit 6)
     * or, started after it ended, find the lot closed; none meets a database error and no part is measured twice.
     */
    @Test
    void processesStartingOneLotAtOnceMeetOutcomesNotErrors(@TempDir Path dir) throws Exception {
        String javaBin = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        int refused = 0;
        for (int round = 0; round < 2; round++) {
            String lot = "RACE-" + round;
            List<Process> runs = new ArrayList<>();
            for (int k = 0; k < 3; k++) {
                runs.add(new ProcessBuilder(javaBin, "-cp", System.getProperty("java.class.path"), "-Dlrbench.home=" + HOME,
                        "org.lrbench.cli.Main", "run", PLAN, "--lot", lot, "--lot-size", "40", "--sim-lot", LOT_FILE,
                        "--data", dir.resolve("data").toString(), "--runs", dir.resolve("runs").toString(),
                        "--calibration", dir.resolve("none").toString(), "--operator", "bench" + k)
                        .redirectErrorStream(true).redirectOutput(dir.resolve(lot + "-" + k + ".out").toFile()).start());
            }
            List<Integer> codes = new ArrayList<>();
            for (int k = 0; k < runs.size(); k++) {
                assertThat(runs.get(k).waitFor(180, java.util.concurrent.TimeUnit.SECONDS)).isTrue();
                codes.add(runs.get(k).exitValue());
                String out = Files.readString(dir.resolve(lot + "-" + k + ".out"));
                assertThat(out).as("run %d: %s", k, out).doesNotContainIgnoringCase("SQL").doesNotContain("constraint")
                        .doesNotContain("internal error");
                if (runs.get(k).exitValue() == 6) {
                    assertThat(out).contains("is being measured by another run: bench sim-bench-1");
                }
            }
            assertThat(codes).as("round %d", round).allSatisfy(c -> assertThat(c).isIn(0, 1, 6));
            refused += (int) codes.stream().filter(c -> c == 6).count();
            try (var store = org.lrbench.store.ResultStore.open(dir.resolve("data/lrbench.db"))) {
                var counting = org.lrbench.results.Attempt.counting(store.attempts(lot));
                assertThat(counting).hasSize(8);
                assertThat(store.attempts(lot)).hasSize(8); // each part measured once
                assertThat(store.heldBy(lot)).isNull();
            }
        }
        // started together, a run takes seconds: the others meet its hold (a JVM's start-up is far shorter)
        assertThat(refused).isPositive();
    }
}
