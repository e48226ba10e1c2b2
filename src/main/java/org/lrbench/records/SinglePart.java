package org.lrbench.records;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.SimulatedPart;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.StopToken;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.Attempt;
import org.lrbench.results.PartResult;
import org.lrbench.results.ResultFiles;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.store.Canonical;
import org.lrbench.store.ResultStore;
import org.lrbench.store.SingleRecord;
import org.lrbench.traces.TraceArchive;
import org.lrbench.yaml.ProblemsException;

/**
 * One part measured outside a lot's sample: its attempt number from the records already in its
 * lot's folder (a part measured before is measured again only with a reason, and its earlier
 * records stay), the measurement, and its record and trace archive written whole under names never
 * reused.
 */
public final class SinglePart {

    /** What one part's measurement needs; {@code simulated} null measures on the bench's instruments. */
    public record Request(PartRun.Request part, DriverLoader drivers, SimulatedPart simulated, String operator,
                          String reason, boolean keepTraces, Path runs) {
    }

    /**
     * The result as recorded, its attempt number, the record and (kept traces) the archive with its size,
     * and what the store keeps of them (see {@link #keep}).
     */
    public record Outcome(PartResult result, int attempt, Path record, Path archive, long archiveBytes,
                          SingleRecord stored) {
    }

    /** A part that may not be measured under this name now (measured before without a reason, or a reason for nothing). */
    public static final class Refused extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Refused(String message) {
            super(message);
        }
    }

    private SinglePart() {
    }

    /**
     * The attempt number the serial's next record in its lot folder gets: 1 for a part never
     * measured there; the next free number for one measured before, and only with a reason.
     */
    public static int nextAttempt(Path runs, String lot, String serial, String reason) {
        Path dir = runs.resolve(lot);
        int number = 1;
        while (Files.exists(dir.resolve(Attempt.fileName(serial, number, "json")))) {
            number++;
        }
        if (number > 1 && (reason == null || reason.isBlank())) {
            throw new Refused(dir.resolve(Attempt.fileName(serial, 1, "json")) + " exists: " + serial
                    + " was measured before in lot " + lot + " (" + (number - 1) + " record(s)). To measure it again"
                    + " give --reason TEXT; every earlier record is kept");
        }
        if (number == 1 && reason != null) {
            throw new Refused("--reason is for a part measured again; " + serial + " has no record in " + dir);
        }
        return number;
    }

    /** Measures the part and keeps its record (and traces): written whole, never over an earlier one. */
    public static Outcome measure(Request q) throws ProblemsException, IOException {
        PartRun.Request p = q.part();
        int number = nextAttempt(q.runs(), p.lot(), p.serial(), q.reason());
        BenchConfig b = p.bench();
        Plan plan = p.plan();
        PartRun.Measured m;
        try (BenchInstruments instruments = BenchInstruments.open(b, q.drivers(),
                q.simulated() == null ? null : q.simulated().open(b, plan.wiring()))) {
            m = PartRun.measure(p, instruments, q.simulated() != null ? BenchClock.NONE : BenchClock.REAL,
                    SweepListener.NONE, StopToken.NEVER);
        }
        PartResult result = m.result().withAttempt(new PartResult.AttemptRecord(1, number, q.operator(), q.reason()));
        Path dir = q.runs().resolve(p.lot());
        Path archive = null;
        long bytes = 0;
        String tracesSha = null;
        if (q.keepTraces()) {
            byte[] traces = TraceArchive.encode(p.lot(), p.serial(), plan.partNumber(), plan.senseResistanceOhm(),
                    plan.wiring(), ResultFiles.JSON.valueToTree(result.instruments()), m.points());
            archive = dir.resolve(Attempt.fileName(p.serial(), number, "lrtraces"));
            ResultFiles.writeNew(archive, traces);
            bytes = traces.length;
            tracesSha = Canonical.sha256(traces);
        }
        Path record = dir.resolve(Attempt.fileName(p.serial(), number, "json"));
        byte[] json = ResultFiles.JSON.writeValueAsBytes(result);
        ResultFiles.writeNew(record, json);
        SingleRecord stored = new SingleRecord(p.lot(), p.serial(), number, b.name(), record.getFileName().toString(),
                json.length,
                Canonical.sha256(json), archive == null ? null : archive.getFileName().toString(),
                archive == null ? null : bytes, tracesSha, q.simulated() != null, Instant.now().toString());
        return new Outcome(result, number, record, archive, bytes, stored);
    }

    /**
     * Keeps the outcome's record in the store, as the next link of the single parts' hash chain, so that
     * {@code verify} checks its files as it checks a lot's. The files are written first: a failure here
     * leaves them whole and named by {@code verify} as files no record names.
     */
    public static void keep(ResultStore store, Outcome o) {
        store.recordSinglePart(o.stored());
    }
}
