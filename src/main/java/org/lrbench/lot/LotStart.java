package org.lrbench.lot;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.CalibrationStore;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.measure.BenchClock;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanIdentity;
import org.lrbench.plan.PlanLoader;
import org.lrbench.records.CheckStandardLog;
import org.lrbench.records.StoreLedger;
import org.lrbench.rehearsal.ExcitationChoice;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.Names;
import org.lrbench.run.PartRun;
import org.lrbench.store.CheckFile;
import org.lrbench.store.ResultStore;
import org.lrbench.yaml.ProblemsException;

/**
 * The one way a lot run starts, for the command line, the demo and the bench service alike: the
 * request is validated, the plan loaded against the bench and its drivers, the bench's corrections
 * loaded once, the check standard's gate passed (or overridden with a recorded reason), the plan's
 * identity fixed, the supplier's scheme resolved and the lot checked against the store, all before
 * any instrument is touched. What comes out is a {@link Ready} lot: either closed (decided before,
 * nothing to measure) or a {@link LotRunner.Setup} to run.
 */
public final class LotStart {

    /**
     * What starting a lot needs. {@code supplier} null takes the plan's; {@code reinspectReason} non-null
     * opens a new inspection of a decided lot; {@code overrideCheckReason} non-null starts although the
     * check standard refuses; {@code simulated} parts are measured without real settling time.
     */
    public record Request(Path planFile, BenchConfig bench, DriverLoader drivers, String lot, int lotSize, String operator,
                          String supplier, String reinspectReason, String overrideCheckReason, boolean simulated,
                          boolean keepTraces, Folders folders, String programVersion) {
    }

    /** Where the bench's corrections, the records and the lab's sampling tables are. */
    public record Folders(Path calibration, Path runs, Path samplingTables) {
    }

    /**
     * A lot ready to run. {@code closed} is the decided inspection when the lot is closed (nothing
     * is to be measured); {@code alreadyMeasured} the parts judged before this run; {@code override}
     * the check standard's refusal that was overridden (recorded), or null; {@code excitation} the
     * excitation chosen for the bench and why, where the plan left it open (else null).
     */
    public record Ready(LotRunner.Setup setup, StoreLedger ledger, Inspection closed, int alreadyMeasured,
                        String override, Path overrideRecord, String excitation) {

        public Plan plan() {
            return setup.template().plan();
        }

        public boolean isClosed() {
            return closed != null;
        }
    }

    private LotStart() {
    }

    /**
     * Prepares a lot run on this store. Throws {@link LotRefused} for a request that may not start
     * (its kind tells a wrong request from a lot or bench that forbids it) and {@link ProblemsException}
     * for a plan or sampling table with problems at their positions.
     */
    public static Ready prepare(Request q, ResultStore store) throws ProblemsException, IOException {
        validate(q);
        // loaded once: the check gate, the excitation and every part's corrections are the same ones
        Calibration corrections = new CalibrationStore(q.folders().calibration(), q.bench().name()).load();
        ExcitationChoice.Choice chosen = loadPlan(q, corrections);
        Plan plan = chosen.plan();
        String refusal = checkRefusal(q, corrections, store);
        PartRun.Request template = new PartRun.Request(plan, PlanIdentity.sha256(q.planFile()), q.bench(), q.lot(), "-",
                q.simulated(), q.programVersion(), corrections);
        StoreLedger ledger = new StoreLedger(store, q.folders().runs(), q.keepTraces());
        LotRunner.Setup setup = LotRunner.Setup.of(template, q.lotSize(), q.drivers(), ledger).withOperator(q.operator())
                .withSleeper(q.simulated() ? BenchClock.NONE : BenchClock.REAL)
                .withScheme(LotScheme.of(q.supplier() != null ? q.supplier() : plan.supplier(), q.folders().samplingTables()));
        if (q.reinspectReason() != null) {
            setup = setup.reinspecting(q.reinspectReason());
        }
        setup = LotRunner.resolved(setup);
        Inspection closed = LotRunner.preflight(setup);
        int measured = (int) store.parts(q.lot()).stream().filter(Attempt::judged).count();
        Path overrideRecord = null;
        if (refusal != null && closed == null) {
            // recorded only for a run that goes on to measure
            overrideRecord = new CheckStandardLog(q.folders().runs(), q.bench().name())
                    .override(Instant.now(), q.lot(), q.operator(), q.overrideCheckReason(), refusal);
            CheckStandardLog.keep(store, q.folders().runs(), q.bench().name(), CheckFile.OVERRIDE, overrideRecord);
        }
        return new Ready(setup, ledger, closed, closed != null ? 0 : measured, closed == null ? refusal : null,
                overrideRecord, chosen.said());
    }

    private static void validate(Request q) {
        String lotProblem = Names.problem("lot", q.lot());
        if (lotProblem != null) {
            throw bad(lotProblem);
        }
        if (q.lotSize() < 2) {
            throw bad("lot size " + q.lotSize() + ": ISO 2859-1 lots have at least 2 parts");
        }
        if (q.reinspectReason() != null && q.reinspectReason().isBlank()) {
            throw bad("a re-inspection needs a reason, in words");
        }
        if (q.overrideCheckReason() != null && q.overrideCheckReason().isBlank()) {
            throw bad("overriding the check standard needs a reason, in words");
        }
        for (String p : new String[] {Names.reasonProblem("reinspect reason", q.reinspectReason()),
            Names.reasonProblem("override reason", q.overrideCheckReason()), Names.operatorProblem(q.operator())}) {
            if (p != null) {
                throw bad(p);
            }
        }
        String supplierProblem = Names.supplierProblem(q.supplier());
        if (supplierProblem != null) {
            throw bad(supplierProblem);
        }
        if (q.operator() == null || q.operator().isBlank()) {
            throw bad("operator: who measures is recorded with every attempt; give a name");
        }
        if (q.bench().checkStandard() == null && q.overrideCheckReason() != null) {
            throw bad("bench " + q.bench().name() + " has no check standard to override");
        }
    }

    /** The plan, checked against the bench's ceiling and against what its drivers declare. */
    private static ExcitationChoice.Choice loadPlan(Request q, Calibration corrections) throws ProblemsException {
        if (!Files.isRegularFile(q.planFile())) {
            throw bad("plan " + q.planFile() + ": no such file");
        }
        Plan plan = PlanLoader.load(q.planFile(), q.bench().maxAmplitudeVolt());
        if (plan.sampling() == null) {
            throw bad(q.planFile() + ": a lot run needs the plan's sampling section (level, AQL per class)");
        }
        List<String> problems = PlanFit.problems(plan, q.drivers(), q.bench().generator().driver(),
                q.bench().digitizer().driver());
        if (!problems.isEmpty()) {
            throw bad(String.join("\n", problems));
        }
        // an excitation left open: the one chosen for this bench, as calibrate chose it
        return ExcitationChoice.of(plan, q.bench(), q.drivers(), corrections);
    }

    /**
     * On a bench with a check standard a lot starts only while the last check is in control and
     * within its interval and the corrections within theirs: the refusal, or null. Without an
     * override the refusal ends the start here.
     */
    private static String checkRefusal(Request q, Calibration corrections, ResultStore store) throws IOException {
        if (q.bench().checkStandard() == null) {
            return null;
        }
        String refusal = CheckStandardLog.gate(q.bench(), q.folders().runs(), corrections, Instant.now());
        if (refusal == null) {
            refusal = new CheckStandardLog(q.folders().runs(), q.bench().name()).unrecordedLast(store, q.folders().runs(),
                    q.bench().name());
        }
        if (refusal != null && q.overrideCheckReason() == null) {
            throw new LotRefused(LotRefused.Kind.CHECK_REFUSED, "lot " + q.lot() + " not started: " + refusal);
        }
        return refusal;
    }

    private static LotRefused bad(String message) {
        return new LotRefused(LotRefused.Kind.BAD_INPUT, message);
    }
}
