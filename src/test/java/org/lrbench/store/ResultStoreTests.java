package org.lrbench.store;

import org.lrbench.sampling.LotDisposition;

import org.lrbench.judge.Verdict;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.stat.descriptive.DescriptiveStatistics;
import org.assertj.core.groups.Tuple;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;

public class ResultStoreTests {

    public static PartResult part(String lot, String serial, String verdict) {
        return part(lot, serial, verdict, 1e-3, 2.3);
    }

    static PartResult part(String lot, String serial, String verdict, double l, double r) {
        return new PartResult(PartResult.SCHEMA, "t", lot, serial, "P-1", "p.yaml", "ab".repeat(32), "b", true,
                "2026-12-01T00:00:00Z", "2026-12-01T00:00:01Z", Verdict.of(verdict), verdict.equals("error") ? "lost" : null,
                List.of(), List.of(), l, 1e-6, 2e-6, r, 0.01, 0.02, null, 1e6, Map.of(), null, null, null, null,
                List.of(), List.of(), Map.of(), Map.of(), null);
    }

    public static LotTerms terms(String lot, int lotSize) {
        return new LotTerms(lot, "P-1", "p.yaml", "ab".repeat(32), "b", lotSize, lotSize >= 26 ? 8 : 2,
                "level II; AQL major 1", "op");
    }

    /** Stores attempt {@code number} of a serial at a position, its JSON made from {@link #part}. */
    public static Attempt store(ResultStore s, int round, int position, int number, PartResult p, String reason) {
        PartResult withAttempt = p.withAttempt(new PartResult.AttemptRecord(round, number, "op", reason));
        String json;
        try {
            json = ResultFiles.JSON.writeValueAsString(withAttempt);
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
        Attempt a = new Attempt(p.lot(), p.serial(), number, round, position, p.verdict(), p.inductanceH(),
                p.seriesResistanceOhm(), p.finishedAt(), "op", reason, json, Attempt.fileName(p.serial(), number, "json"),
                null, null);
        s.record(a, "t", null);
        return a;
    }

    @Test
    void everyMeasurementIsKeptAndTheLatestAttemptCounts(@TempDir Path dir) {
        Path db = dir.resolve("store.db");
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.version()).isEqualTo(Migrations.STEPS.size());
            s.inspect(terms("L1", 40), null, "2026-12-01T00:00:00Z");
            store(s, 1, 1, 1, part("L1", "S1", "pass"), null);
            store(s, 1, 2, 1, part("L1", "S2", "fail"), null);
        }
        try (ResultStore s = ResultStore.open(db)) {
            // "test until it passes" leaves its trace: the failing attempt stays, the re-measure has its reason
            store(s, 1, 2, 2, part("L1", "S2", "pass"), "bad contact seen");
            assertThat(s.attempts("L1")).extracting(Attempt::serial, Attempt::number, Attempt::verdict)
                    .containsExactly(Tuple.tuple("S1", 1, Verdict.PASS),
                            Tuple.tuple("S2", 1, Verdict.FAIL),
                            Tuple.tuple("S2", 2, Verdict.PASS));
            assertThat(s.parts("L1")).extracting(Attempt::serial, Attempt::number)
                    .containsExactly(Tuple.tuple("S1", 1), Tuple.tuple("S2", 2));
            // an attempt number is taken once: a second writer of attempt 2 is refused, nothing replaced
            assertThatThrownBy(() -> store(s, 1, 2, 2, part("L1", "S2", "fail"), "again"))
                    .hasMessageContaining("already has attempt 2");
            LotRecord l = s.lots().get(0);
            assertThat(l.measured()).isEqualTo(2);
            assertThat(l.passed()).isEqualTo(2);
            assertThat(l.attempts()).isEqualTo(3);
            assertThat(s.chainFindings("L1")).isEmpty();
        }
    }

    @Test
    void skippedPositionsAreNeverCountedAsMeasured(@TempDir Path dir) {
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            s.inspect(terms("L1", 40), null, "now");
            store(s, 1, 1, 1, part("L1", "S1", "pass"), null);
            store(s, 1, 2, 1, part("L1", "skipped-2", "skipped"), null);
            store(s, 1, 3, 1, part("L1", "S3", "fail"), null);
            LotRecord l = s.lots().get(0);
            assertThat(l.measured()).isEqualTo(l.passed() + l.failed() + l.errors()).isEqualTo(2);
            assertThat(l.skipped()).isEqualTo(1);
        }
    }

    @Test
    void historyGivesYieldMeanAndSpreadPerLot(@TempDir Path dir) {
        double[] ls = {1.01e-3, 0.99e-3, 1.03e-3, 0.95e-3};
        double[] rs = {2.31, 2.28, 2.42, 2.90};
        try (ResultStore s = ResultStore.open(dir.resolve("s.db"))) {
            s.inspect(terms("L1", 40), null, "2026-12-01T00:00:00Z");
            for (int i = 0; i < ls.length; i++) {
                store(s, 1, i + 1, 1, part("L1", "S" + i, i == 3 ? "fail" : "pass", ls[i], rs[i]), null);
            }
            store(s, 1, 5, 1, part("L1", "S9", "error"), null);
            LotStatistics st = s.history("P-1").get(0);
            // reference: Apache Commons Math DescriptiveStatistics (sample standard deviation)
            var dl = new DescriptiveStatistics(ls);
            var dr = new DescriptiveStatistics(rs);
            assertThat(st.measured()).isEqualTo(4);
            assertThat(st.yield()).isEqualTo(0.75);
            assertThat(st.meanInductanceH()).isCloseTo(dl.getMean(), within(1e-15));
            assertThat(st.sdInductanceH()).isCloseTo(dl.getStandardDeviation(), within(1e-15));
            assertThat(st.meanResistanceOhm()).isCloseTo(dr.getMean(), within(1e-12));
            assertThat(st.sdResistanceOhm()).isCloseTo(dr.getStandardDeviation(), within(1e-12));
        }
    }

    @Test
    void aLotKeepsTheTermsItStartedWithAndADecidedLotIsClosed(@TempDir Path dir) {
        try (ResultStore s = ResultStore.open(dir.resolve("store.db"))) {
            s.inspect(terms("L1", 40), null, "t0");
            assertThatThrownBy(() -> s.inspect(terms("L1", 5), null, "t1"))
                    .isInstanceOf(LotTermsException.class)
                    .hasMessageContaining("lot size: stored 40, given 5")
                    .hasMessageContaining("sample size: stored 8, given 2");
            LotTerms otherPlan = new LotTerms("L1", "P-1", "p.yaml", "cd".repeat(32), "b", 40, 8, "level II; AQL major 1", "op");
            assertThatThrownBy(() -> s.inspect(otherPlan, null, "t1")).hasMessageContaining("plan content");
            assertThatThrownBy(() -> s.inspect(terms("L1", 40), "supplier screened the lot", "t1"))
                    .hasMessageContaining("still open");
            assertThat(s.decide("L1", 1, LotDisposition.State.REJECT, "2 major nonconforming >= Re 2", "t2")).isTrue();
            // a decision is taken once: a later one changes nothing
            assertThat(s.decide("L1", 1, LotDisposition.State.ACCEPT, "0 major", "t3")).isFalse();
            Inspection closed = s.inspect(terms("L1", 5), null, "t4");
            assertThat(closed.decided()).isTrue();
            assertThat(closed.disposition()).isEqualTo(LotDisposition.State.REJECT);
            assertThat(closed.terms().lotSize()).isEqualTo(40);
            // a re-inspection is explicit, with its reason, and keeps the first inspection
            Inspection second = s.inspect(terms("L1", 38), "supplier screened the lot", "t5");
            assertThat(second.round()).isEqualTo(2);
            assertThat(s.lots()).extracting(LotRecord::round, LotRecord::disposition, LotRecord::reason)
                    .containsExactly(Tuple.tuple(1, LotDisposition.State.REJECT, null),
                            Tuple.tuple(2, null, "supplier screened the lot"));
            // parts of the closed inspection cannot be added any more
            assertThatThrownBy(() -> store(s, 1, 1, 1, part("L1", "S1", "pass"), null)).hasMessageContaining("closed");
            assertThat(s.chainFindings("L1")).isEmpty();
        }
    }

    @Test
    void theHashChainNamesRowsAlteredDeletedOrAddedBehindItsBack(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("store.db");
        try (ResultStore s = ResultStore.open(db)) {
            s.inspect(terms("L1", 40), null, "t0");
            for (int i = 1; i <= 4; i++) {
                store(s, 1, i, 1, part("L1", "S" + i, i == 2 ? "fail" : "pass"), null);
            }
            s.decide("L1", 1, LotDisposition.State.ACCEPT, "1 major nonconforming <= Ac 1", "t1");
            assertThat(s.chainFindings("L1")).isEmpty();
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            st.executeUpdate("UPDATE attempt SET verdict = 'pass' WHERE serial = 'S2'");
            st.executeUpdate("DELETE FROM attempt WHERE serial = 'S3'");
            st.executeUpdate("INSERT INTO attempt (lot, serial, attempt, round, position, verdict, measured_at,"
                    + " program_version, result_json) VALUES ('L1', 'S9', 1, 1, 9, 'pass', 't', 't', '{}')");
        }
        try (ResultStore s = ResultStore.open(db)) {
            List<String> f = s.chainFindings("L1");
            assertThat(f).anySatisfy(x -> assertThat(x).contains("attempt 1 of S2").contains("altered"));
            assertThat(f).anySatisfy(x -> assertThat(x).contains("attempt 1 of S3").contains("missing"));
            assertThat(f).anySatisfy(x -> assertThat(x).contains("attempt 1 of S9").contains("outside lrbench"));
            assertThat(f).hasSize(3);
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            // removing the decision's link too: the chain head no longer matches the links
            st.executeUpdate("DELETE FROM chain_record WHERE kind = 'decision'");
        }
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.chainFindings("L1")).anySatisfy(x -> assertThat(x).contains("links were removed or added"));
        }
    }

    @Test
    void recordsWrittenBeforeTheSwitchingRulesKeepTheirCanonicalContent() {
        // a chain sealed by schema 3 must verify after schema 4: terms and decisions without a supplier,
        // severity or switching step have exactly the content they had (common practice, no source)
        LotTerms old = new LotTerms("L1", "P-1", "p.yaml", "ab".repeat(32), "b", 40, 8, "level II; AQL major 1", "op");
        Inspection i = new Inspection(old, 1, null, "t0", LotDisposition.State.ACCEPT, "0 major", "t1");
        assertThat(Canonical.terms(i)).isEqualTo("[\"terms\",\"L1\",1,\"P-1\",\"p.yaml\",\"" + "ab".repeat(32)
                + "\",\"b\",40,8,\"level II; AQL major 1\",\"op\",null,\"t0\"]");
        assertThat(Canonical.decision(i)).isEqualTo("[\"decision\",\"L1\",1,\"accept\",\"0 major\",\"t1\"]");
        LotTerms now = new LotTerms("L1", "P-1", "p.yaml", "ab".repeat(32), "b", 40, 8, "level II; AQL major 1", "op",
                "Halvern", "tightened", "lots A and B not accepted");
        assertThat(Canonical.terms(new Inspection(now, 1, null, "t0", null, null, null)))
                .endsWith(",\"Halvern\",\"tightened\",\"lots A and B not accepted\"]");
    }

    @Test
    void aStoreOfAnEarlierSchemaIsMigratedAndSealed(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("old.db");
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            st.execute("CREATE TABLE schema_version (version INTEGER NOT NULL)");
            for (int step = 0; step < 2; step++) {
                for (String sql : Migrations.STEPS.get(step)) {
                    st.execute(sql);
                }
            }
            st.execute("INSERT INTO schema_version VALUES (2)");
            st.execute("INSERT INTO lot (lot, part_number, plan_path, plan_sha256, bench, lot_size, sample_size,"
                    + " created_at, disposition, disposition_reason, finished_at) VALUES ('OLD', 'P-1', 'p.yaml', '"
                    + "ab".repeat(32) + "', 'b', 40, 8, 't0', 'accept', '0 major', 't1')");
            st.execute("INSERT INTO part_result (lot, serial, position, verdict, inductance_h, series_resistance_ohm,"
                    + " measured_at, program_version, result_json, traces_file, traces_bytes) VALUES ('OLD', 'S1', 1,"
                    + " 'pass', 0.001, 2.3, 't', 'old', '{}', 'runs/OLD/S1.lrtraces', 1234)");
        }
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.version()).isEqualTo(ResultStore.latestVersion());
            Attempt a = s.attempts("OLD").get(0);
            assertThat(a.number()).isEqualTo(1);
            assertThat(a.jsonFile()).isEqualTo("S1.json");
            assertThat(a.tracesFile()).isEqualTo("S1.lrtraces");
            assertThat(s.lots().get(0).disposition()).isEqualTo(LotDisposition.State.ACCEPT);
            assertThat(s.chainFindings("OLD")).isEmpty();
        }
    }

    @Test
    void aStoreFromANewerLrbenchIsRefusedAndNotWritten(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("new.db");
        try (ResultStore s = ResultStore.open(db)) {
            s.inspect(terms("L1", 40), null, "t0");
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            st.executeUpdate("UPDATE schema_version SET version = " + (ResultStore.latestVersion() + 5));
            st.execute("PRAGMA wal_checkpoint(TRUNCATE)");
        }
        byte[] before = Files.readAllBytes(db);
        assertThatThrownBy(() -> ResultStore.open(db)).isInstanceOf(StoreException.class)
                .hasMessageContaining("newer than this lrbench knows").hasMessageContaining("nothing was changed");
        assertThatThrownBy(() -> ResultStore.openForReading(db)).hasMessageContaining("newer");
        assertThat(Files.readAllBytes(db)).isEqualTo(before);
    }

    @Test
    void aStoreOpenedForReadingIsReadAndNeverWritten(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("s.db");
        try (ResultStore s = ResultStore.open(db)) {
            s.inspect(terms("L1", 40), null, "t0");
            store(s, 1, 1, 1, part("L1", "S1", "pass"), null);
        }
        try (ResultStore s = ResultStore.openForReading(db)) {
            assertThat(s.lots()).hasSize(1);
            assertThat(s.parts("L1")).hasSize(1);
            assertThatThrownBy(() -> s.inspect(terms("L2", 40), null, "t1")).hasMessageContaining("reading only");
        }
    }

    @Test
    void aNewStoreOpenedByManyBenchesAtOnceIsMigratedOnce(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("fresh.db");
        SharedStoreTests.openAtOnce(() -> ResultStore.open(db), 8);
    }

    @Test
    void databaseFailuresAreNamedByTheirCause() {
        // the causes of xerial sqlite-jdbc's result codes (sqlite.org/rescode.html) and PostgreSQL SQLSTATEs
        // (postgresql.org/docs/current/errcodes-appendix.html: 53100 disk_full, 25006 read_only_sql_transaction)
        assertThat(StoreErrors.describe(new SQLException("[SQLITE_FULL] Insertion failed because database is full")))
                .startsWith("the disk is full");
        assertThat(StoreErrors.describe(new SQLException("could not extend file", "53100"))).startsWith("the disk is full");
        assertThat(StoreErrors.describe(new SQLException("[SQLITE_READONLY] attempt to write a readonly database")))
                .startsWith("the store is read-only");
        assertThat(StoreErrors.describe(new SQLException("[SQLITE_BUSY] The database file is locked")))
                .startsWith("another program holds the store locked");
        assertThat(StoreErrors.describe(new SQLException("[SQLITE_NOTADB] file is not a database")))
                .startsWith("the store file is corrupt");
    }

    @Test
    void aFileThatIsNotAStoreIsNamedAsSuch(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("junk.db");
        Files.writeString(db, "this is not a database, it is a shopping list ".repeat(100));
        assertThatThrownBy(() -> ResultStore.open(db)).isInstanceOf(StoreException.class)
                .hasMessageContaining("corrupt or not an lrbench store");
    }

    /**
     * Decisions on a supplier's scheme are links of a chain of their own: a reason edited behind lrbench's
     * back, or the last decision removed with the head re-pointed (then only an anchor shows it), is found
     * (hash chains: common practice, no source).
     */
    @Test
    void schemeDecisionsAreLinksOfAChain(@TempDir Path dir) throws Exception {
        Path db = dir.resolve("s.db");
        List<ChainAnchor> anchor;
        try (ResultStore s = ResultStore.open(db)) {
            s.decideScheme("P-1", "S", org.lrbench.sampling.Severity.TIGHTENED, "three rejects", "qa", true,
                    "2026-01-01T00:00:00Z");
            s.decideScheme("P-1", "S", org.lrbench.sampling.Severity.NORMAL, "process fixed", "qa", true,
                    "2026-01-02T00:00:00Z");
            assertThat(s.decisionFindings()).isEmpty();
            anchor = s.chainAnchors();
            assertThat(anchor).anySatisfy(a -> assertThat(a.lot()).isEqualTo("~scheme-decisions"));
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            st.executeUpdate("UPDATE scheme_decision SET reason = 'asked by purchasing' WHERE seq = 1");
        }
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.decisionFindings()).anySatisfy(f -> assertThat(f).contains("decision 1 on P-1 / S")
                    .contains("altered"));
        }
        try (var c = DriverManager.getConnection("jdbc:sqlite:" + db); var st = c.createStatement()) {
            st.executeUpdate("UPDATE scheme_decision SET reason = 'three rejects' WHERE seq = 1");
            st.executeUpdate("DELETE FROM scheme_decision WHERE seq = 2");
            st.executeUpdate("UPDATE decision_chain SET length = 1, head_sha256 = (SELECT record_sha256 FROM"
                    + " scheme_decision WHERE seq = 1)");
        }
        try (ResultStore s = ResultStore.open(db)) {
            assertThat(s.decisionFindings()).isEmpty(); // consistent in itself
            assertThat(s.anchorFindings(anchor)).anySatisfy(f -> assertThat(f).contains("scheme decisions")
                    .contains("tail was cut"));
        }
    }
}
