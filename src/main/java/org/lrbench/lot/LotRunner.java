package org.lrbench.lot;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import java.io.IOException;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.Consumer;
import java.util.stream.Collectors;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.judge.CharacteristicClass;
import org.lrbench.judge.Limit;
import org.lrbench.judge.Verdict;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.MeasurementStopped;
import org.lrbench.measure.SweepListener;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotLedger;
import org.lrbench.results.LotTerms;
import org.lrbench.results.Names;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.sampling.ClassPlan;
import org.lrbench.sampling.LotDisposition;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.sampling.Severity;
import org.lrbench.sampling.SeverityTable;
import org.lrbench.sampling.SeverityTableLoader;
import org.lrbench.sampling.SwitchingRules;
import org.lrbench.transport.inproc.PeerSet;
import org.lrbench.yaml.ProblemsException;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Runs a lot's sample: parts one after another from a {@link PartFeeder}, each measurement kept
 * through the {@link LotLedger} as an attempt of its own the moment it is complete, until the
 * sample is complete or the feeder stops. A lot is inspected under the terms it started with;
 * running it again continues after the parts already measured (a part whose last attempt ended in
 * error is measured again). A decided inspection is closed: running it again measures nothing,
 * unless a re-inspection is asked for with a reason. The attempt that counts for a part is its
 * latest one in the inspection.
 */
public final class LotRunner {
    private static final Logger LOG = LoggerFactory.getLogger(LotRunner.class);
    private static final ObjectMapper READ = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .configure(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES, false);

    /** Everything a lot run needs besides the feeder. */
    public record Setup(PartRun.Request template, int lotSize, String operator, String reinspectReason,
                        DriverLoader drivers, LotLedger ledger, BenchClock sleeper, SweepListener listener,
                        BenchInstruments shared, LotStop stop, LotScheme scheme) {

        public static Setup of(PartRun.Request template, int lotSize, DriverLoader drivers, LotLedger ledger) {
            return new Setup(template, lotSize, System.getProperty("user.name", "unknown"), null, drivers, ledger,
                    BenchClock.NONE, SweepListener.NONE, null, new LotStop(), LotScheme.of(template.plan().supplier(), null));
        }

        public Setup withOperator(String name) {
            return new Setup(template, lotSize, name, reinspectReason, drivers, ledger, sleeper, listener, shared, stop, scheme);
        }

        /** A re-inspection of a decided lot, with its reason. */
        public Setup reinspecting(String reason) {
            return new Setup(template, lotSize, operator, reason, drivers, ledger, sleeper, listener, shared, stop, scheme);
        }

        public Setup withSleeper(BenchClock s) {
            return new Setup(template, lotSize, operator, reinspectReason, drivers, ledger, s, listener, shared, stop, scheme);
        }

        public Setup withListener(SweepListener l) {
            return new Setup(template, lotSize, operator, reinspectReason, drivers, ledger, sleeper, l, shared, stop, scheme);
        }

        /** The bench's instruments, open for the whole lot (a switch unit changes parts). */
        public Setup withShared(BenchInstruments instruments) {
            return new Setup(template, lotSize, operator, reinspectReason, drivers, ledger, sleeper, listener,
                    instruments, stop, scheme);
        }

        /** The supplier's scheme (supplier and the lab's table folder); resolved by {@link LotRunner#resolved}. */
        public Setup withScheme(LotScheme x) {
            return new Setup(template, lotSize, operator, reinspectReason, drivers, ledger, sleeper, listener, shared, stop, x);
        }

        /** The plan's sampling under the scheme's severity. */
        public SamplingScheme sampling() {
            return scheme.sampling(template.plan().sampling());
        }

        public Setup withStop(LotStop s) {
            return new Setup(template, lotSize, operator, reinspectReason, drivers, ledger, sleeper, listener, shared, s, scheme);
        }

        /** The terms this run holds the lot to. */
        public LotTerms terms() {
            var plan = template.plan();
            return new LotTerms(template.lot(), plan.partNumber(), plan.source(), template.planSha256(),
                    template.bench().name(), lotSize, sampleSize(), sampling().describe(), operator, scheme.supplier(),
                    scheme.severity() == null ? null : scheme.severity().word(), scheme.why(),
                    ClassPlan.of(lotSize, sampling())).simulatedBench(template.simulated());
        }

        public int sampleSize() {
            return LotDisposition.judge(lotSize, sampling(), List.of()).sampleSize();
        }
    }

    /**
     * The inspection's state after this run: the attempts kept now, the attempts that count, the
     * disposition; {@code closed} when the inspection was decided before this run (nothing was
     * measured), {@code stopped} when a stop request ended it.
     */
    public record Outcome(Inspection inspection, List<Attempt> keptNow, List<Attempt> counting,
                          LotDisposition.Result disposition, boolean closed, boolean stopped) {
    }

    /**
     * Seed offsets of simulated measurements are spread over this many values (a prime, so that
     * serials and attempt numbers do not fold onto each other): each measurement its own noise.
     */
    private static final long SEED_SPREAD = 1_000_003L;

    private LotRunner() {
    }

    /**
     * What a lot run would do, checked before any instrument is touched: returns the decided
     * inspection when the lot is closed (the run measures nothing), or null when the run may go on.
     * Throws {@link LotRefused} for an open inspection under other terms (naming each stored and given
     * term) or a re-inspection asked for while the inspection is open.
     */
    static Inspection preflight(Setup setup) throws ProblemsException {
        Setup s = resolved(setup);
        var latest = s.ledger().latest(s.template().lot());
        if (latest.isEmpty()) {
            return null;
        }
        Inspection i = latest.get();
        if (!i.decided()) {
            if (s.reinspectReason() != null) {
                throw new LotRefused(LotRefused.Kind.CONFLICT, "lot " + i.lot() + ": inspection " + i.round() + " is still open; finish it before"
                        + " re-inspecting");
            }
            List<String> diff = i.terms().differences(s.terms());
            if (!diff.isEmpty()) {
                throw new LotRefused(LotRefused.Kind.CONFLICT, "lot " + i.lot() + " was started on " + i.createdAt() + " under other terms: "
                        + String.join("; ", diff) + ". Continue it with its own terms, or use another lot number");
            }
            return null;
        }
        return s.reinspectReason() != null ? null : i;
    }

    public static Outcome run(Setup setup, PartFeeder feeder, Consumer<PartResult> onPart) throws IOException, ProblemsException {
        PartRun.Request t = setup.template();
        if (t.plan().sampling() == null) {
            throw new IllegalArgumentException(t.plan().source() + ": the plan has no sampling section; a lot run needs"
                    + " one (level and AQL per class)");
        }
        Setup s = resolved(setup);
        String lot = t.lot();
        Inspection inspection = s.ledger().open(s.terms(), s.reinspectReason());
        if (inspection.decided()) {
            List<Attempt> counting = Attempt.counting(s.ledger().attempts(lot, inspection.round()));
            return new Outcome(inspection, List.of(), counting, disposition(s, inspection.terms().lotSize(), counting),
                    true, false);
        }
        int n = s.sampleSize();
        int round = inspection.round();
        List<Attempt> kept = new ArrayList<>();
        boolean stopped = false;
        LotStop stop = s.stop();
        while (!stopped) {
            List<Attempt> counting = Attempt.counting(s.ledger().attempts(lot, round));
            Map<String, Attempt> bySerial = counting.stream()
                    .collect(Collectors.toMap(Attempt::serial, a -> a, (a, b) -> b, LinkedHashMap::new));
            int judged = (int) counting.stream().filter(Attempt::judged).count();
            if (judged >= n) {
                break;
            }
            Set<String> measured = counting.stream().filter(Attempt::judged).map(Attempt::serial).collect(Collectors.toSet());
            stop.waiting(judged, n);
            int skips = (int) counting.stream().filter(a -> a.verdict() == Verdict.SKIPPED).count();
            PartFeeder.Next next = feeder.next(new PartFeeder.Prompt(judged + 1, n, Set.copyOf(measured), skips));
            stop.working();
            if (next.action() == PartFeeder.Action.STOP || stop.requested()) {
                stopped = stop.requested();
                break;
            }
            String problem = Names.problem("serial", next.serial());
            if (problem != null) {
                throw new IllegalArgumentException(problem);
            }
            Attempt before = bySerial.get(next.serial());
            if (before != null && before.judged() && next.reason() == null) {
                feeder.refused(next.serial() + " is already measured in this lot (" + before.verdict() + ", attempt "
                        + before.number() + "); measure it again only with a reason");
                continue;
            }
            int position = before != null ? before.position() : bySerial.size() + 1;
            if (next.action() == PartFeeder.Action.SKIP) {
                PartResult r = skipped(t, next.serial()).withAttempt(new PartResult.AttemptRecord(round,
                        s.ledger().nextAttempt(lot, next.serial()), s.operator(), next.reason()));
                Attempt a = stop.unlessStopped(() -> s.ledger().keep(r, position, List.of(), t.plan().senseResistanceOhm()));
                if (a == null) {
                    stopped = true;
                    break;
                }
                kept.add(a);
                tell(onPart, r);
                continue;
            }
            String reason = next.reason();
            if (reason == null && before != null && before.verdict() == Verdict.ERROR) {
                reason = "measured again: attempt " + before.number() + " ended in error";
            }
            while (true) {
                int number = s.ledger().nextAttempt(lot, next.serial());
                PartRun.Measured m;
                try {
                    m = measure(s, next, number);
                } catch (MeasurementStopped dropped) {
                    stopped = true;
                    break;
                }
                if (stop.stopRequested()) {
                    // asked while the part's last steps ran: the part in progress is dropped, never half kept
                    stopped = true;
                    break;
                }
                PartResult r = m.result().withAttempt(new PartResult.AttemptRecord(round, number, s.operator(), reason));
                Attempt a = stop.unlessStopped(() -> s.ledger().keep(r, position, m.points(), t.plan().senseResistanceOhm(),
                        t.plan().wiring()));
                if (a == null) {
                    stopped = true;
                    break;
                }
                kept.add(a);
                tell(onPart, r);
                stop.waiting((int) Attempt.counting(s.ledger().attempts(lot, round)).stream().filter(Attempt::judged).count(), n);
                reason = feeder.again(r.serial(), r.verdict());
                stop.working();
                if (stop.requested()) {
                    stopped = true;
                    break;
                }
                if (reason == null) {
                    break;
                }
            }
        }
        List<Attempt> counting = Attempt.counting(s.ledger().attempts(lot, round));
        LotDisposition.Result d = disposition(s, s.lotSize(), counting);
        if (stopped) {
            // a stop request leaves the inspection open whatever the parts so far say: it is resumed, not decided
            d = new LotDisposition.Result(LotDisposition.State.OPEN, d.sampleSize(), d.classes(),
                    "stopped before the sample was complete; so far " + d.reason());
        }
        if (d.state() != LotDisposition.State.OPEN) {
            Severity sev = s.scheme().severity();
            // what an original inspection means for the switching rules (re-inspections do not count)
            Integer step = round == 1 && sev == Severity.NORMAL ? SwitchingRules.scoreStep(d) : null;
            Boolean reinstates = round == 1 && sev == Severity.REDUCED ? SwitchingRules.reinstatesNormal(d) : null;
            s.ledger().decide(lot, round, d.state(), d.reason(), step, reinstates,
                    Instant.now().truncatedTo(ChronoUnit.MILLIS).toString());
        }
        return new Outcome(inspection, List.copyOf(kept), counting, d, false, stopped);
    }

    /** One part measured; the stop token ends it between sweep points ({@link MeasurementStopped}). */
    private static PartRun.Measured measure(Setup s, PartFeeder.Next next, int attempt) throws ProblemsException {
        PartRun.Request t = s.template();
        BenchConfig bench = t.bench();
        PeerSet sim = null;
        if (next.simulated() != null) {
            // each simulated measurement gets its own noise, the same however often the lot is resumed
            long offset = Math.floorMod(31L * next.serial().hashCode() + attempt, SEED_SPREAD);
            bench = bench.withSeedOffset(offset);
            sim = next.simulated().open(bench, t.plan().wiring());
        }
        PartRun.Request request = new PartRun.Request(t.plan(), t.planSha256(), bench, t.lot(), next.serial(),
                t.simulated(), t.programVersion(), t.calibration());
        if (sim == null && s.shared() != null) {
            return PartRun.measure(request, s.shared(), s.sleeper(), s.listener(), s.stop());
        }
        try (BenchInstruments instruments = BenchInstruments.open(bench, s.drivers(), sim)) {
            return PartRun.measure(request, instruments, s.sleeper(), s.listener(), s.stop());
        }
    }

    /**
     * The setup with its scheme resolved: a lot already started keeps the severity it was started
     * under (older records: normal); a new lot takes the supplier's scheme as the rules leave it.
     * Refused when inspection is discontinued, or the severity's table is not in the lab's folder.
     */
    static Setup resolved(Setup s) throws ProblemsException {
        LotScheme sc = s.scheme();
        if (sc.resolved()) {
            return s;
        }
        var plan = s.template().plan();
        var latest = s.ledger().latest(s.template().lot());
        Severity sev;
        String why;
        if (latest.isPresent()) {
            LotTerms stored = latest.get().terms();
            sev = stored.severity() == null ? Severity.NORMAL : Severity.of(stored.severity());
            why = stored.severity() == null ? "started before the switching rules were recorded (normal inspection)"
                    : stored.severityReason();
        } else {
            // a lot on the simulated bench follows the simulated lots' scheme, never the real supplier's
            SwitchingRules.State st = s.template().simulated()
                    ? s.ledger().scheme(plan.partNumber(), sc.supplier(), true)
                    : s.ledger().scheme(plan.partNumber(), sc.supplier());
            if (st.severity() == Severity.DISCONTINUED) {
                throw new LotRefused(LotRefused.Kind.CONFLICT, "inspection of " + plan.partNumber() + schemeName(sc) + " is discontinued: " + st.why()
                        + ". A new lot starts only after a recorded decision restarts inspection (lrbench scheme "
                        + plan.partNumber() + " --set tightened --reason ...)");
            }
            sev = st.severity();
            why = st.why();
        }
        SeverityTable table = null;
        if (sev != Severity.NORMAL) {
            // the lab's own transcription where its sampling folder has one, else the standard's table as lrbench
            // ships it (ISO 2859-1:1999 Table 2-B or 2-C)
            table = (sc.tables() == null ? Optional.<SeverityTable>empty() : SeverityTableLoader.find(sc.tables(), sev))
                    .orElseGet(() -> SeverityTableLoader.builtIn(sev));
        }
        return s.withScheme(sc.at(sev, why, table));
    }

    private static String schemeName(LotScheme sc) {
        return sc.supplier().isEmpty() ? "" : " from " + sc.supplier();
    }

    /** The disposition from the attempts that count, in measuring order. */
    public static LotDisposition.Result disposition(Setup s, int lotSize, List<Attempt> counting) {
        Map<String, Limit> byName = new HashMap<>();
        s.template().plan().limits().forEach(l -> byName.put(l.name(), l));
        List<Set<CharacteristicClass>> failed = new ArrayList<>();
        for (Attempt a : counting) {
            if (!a.judged()) {
                continue;
            }
            Set<CharacteristicClass> classes = EnumSet.noneOf(CharacteristicClass.class);
            try {
                PartResult r = READ.readValue(a.resultJson(), PartResult.class);
                for (PartResult.LimitRecord l : r.limits()) {
                    Limit limit = byName.get(l.name());
                    if (!l.pass() && limit != null) {
                        classes.add(limit.characteristicClass());
                    }
                }
            } catch (IOException e) {
                throw new IllegalStateException("stored result of " + a.serial() + " is unreadable: " + e.getMessage(), e);
            }
            failed.add(classes);
        }
        return LotDisposition.judge(lotSize, s.sampling(), failed);
    }

    /**
     * Tells the caller of a part once it is kept: an observer, so whatever it throws is logged with
     * its name and the lot goes on (the part is committed whatever the display does).
     */
    private static void tell(Consumer<PartResult> onPart, PartResult r) {
        try {
            onPart.accept(r);
        } catch (RuntimeException e) {
            LOG.warn("lot observer {} failed on {} ({}); the lot goes on without it", onPart.getClass().getName(),
                    r.serial(), e.toString());
            LOG.debug("the observer's failure", e);
        }
    }

    private static PartResult skipped(PartRun.Request t, String serial) {
        String now = Instant.now().truncatedTo(ChronoUnit.MILLIS).toString();
        return new PartResult(PartResult.SCHEMA, t.programVersion(), t.lot(), serial, t.plan().partNumber(),
                t.plan().source(), t.planSha256(), t.bench().name(), t.simulated(), now, now, Verdict.SKIPPED,
                "skipped by the operator: not measured", List.of(), List.of(), null, null, null, null, null, null,
                null, null, Map.of(), null, null, null, null, List.of(), List.of(), Map.of(), Map.of(), null);
    }
}
