package org.lrbench.rehearsal;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.lrbench.analysis.MultisineDesign;
import org.lrbench.bench.BenchConfig;
import org.lrbench.calibration.Calibration;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverKind;
import org.lrbench.driver.DriverLoader;
import org.lrbench.driver.PlanFit;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.SimTiming;
import org.lrbench.transport.Address;
import org.lrbench.yaml.ProblemsException;

/**
 * The excitation of a plan that leaves it open ({@code excitation: auto}, or none given), chosen for
 * a bench: the multisine where the bench can play it, it is as certain and it is faster; the stepped
 * sweep otherwise, with the reason. In order:
 * <ol>
 * <li>the multisine must be possible: the generator's driver gives arbitrary-waveform commands, the
 *     design fits its memory within the plan's tolerance, the digitizer takes its record
 *     ({@link PlanFit});</li>
 * <li>it must be as certain: the plan's nominal part is measured with each excitation on the bench's
 *     simulated twin, calibrated for each (fixed seeds, so every command that chooses gets the same
 *     answer), and every limit's U of the multisine must be within {@link PartTime#EQUAL_ENOUGH} of the
 *     stepped sweep's;</li>
 * <li>it must be faster: each measurement's {@link PhysicalTime} on the bench's link, from the records
 *     the twin really took (the multisine's record is sized from its probe). The link is the digitizer's:
 *     a simulated bench's timing profile ({@code lan} where it sets none), {@code lan} figures for a
 *     socket, {@code usb} for USBTMC, a serial link at its baud rate (ten bits a byte).</li>
 * </ol>
 * lrbench's own processing is left out of the time: it depends on the computer, not on the bench, and
 * a choice must not change with the load of the machine. {@code rehearse} times both with it.
 */
public final class ExcitationChoice {

    /** The plan with its excitation given, and what was chosen and why in one sentence (null: the plan's own). */
    public record Choice(Plan plan, String said) {
        /** What runs and why: the reason for the choice, or that the plan gave it. */
        public String described() {
            return ExcitationChoice.described(plan, said);
        }
    }

    /** What runs and why, for a plan as it runs and the reason it was chosen (null: the plan gave it). */
    public static String described(Plan plan, String said) {
        return said != null ? said : (plan.sweep().multisine() ? "multisine" : "stepped") + " (the plan's)";
    }

    /**
     * Choices made in this process, by plan, bench, driver folder and the instruments' driver files'
     * text: a lot's parts all get the same.
     */
    private static final Map<List<Object>, Choice> CHOSEN = new ConcurrentHashMap<>();

    /** The twin's two measurements, by plan, bench (its timing aside), driver folder and driver files' text. */
    private static final Map<List<Object>, Twin[]> TWINS = new ConcurrentHashMap<>();

    private ExcitationChoice() {
    }

    /** The plan as it will run on this bench: as it is when it gives its excitation, else with one chosen. */
    public static Choice of(Plan plan, BenchConfig bench, DriverLoader drivers) throws ProblemsException {
        if (!plan.sweep().excitationOpen()) {
            return new Choice(plan, null);
        }
        List<Object> key = List.of(plan, bench, drivers.directory(), driverTexts(bench, drivers));
        Choice known = CHOSEN.get(key);
        if (known != null) {
            return known;
        }
        Choice c = choose(plan, bench, drivers);
        if (CHOSEN.size() > 64) {
            CHOSEN.clear();
        }
        CHOSEN.put(key, c);
        return c;
    }

    /**
     * As {@link #of(Plan, BenchConfig, DriverLoader)}, held to the corrections in force: a multisine
     * chosen where the bench's fixture compensation has a reading at every stepped frequency and not at
     * every tone (corrections read before the choice, or for the plan stepped) would measure each part
     * and then end it in error; the stepped sweep runs instead, and the reason says how to get the
     * multisine. Anything else (no corrections, corrections for neither) is left to the run to judge.
     */
    public static Choice of(Plan plan, BenchConfig bench, DriverLoader drivers, Calibration corrections)
            throws ProblemsException {
        Choice c = of(plan, bench, drivers);
        if (!c.plan().sweep().multisine() || c.said() == null || corrections == null || corrections.fixture() == null) {
            return c;
        }
        var fixture = corrections.fixture();
        Integer memory = drivers.load(bench.generator().driver(), DriverKind.SOURCE).limits().maxArbitrarySamples();
        double[] tones = MultisineDesign.of(plan.sweep().frequenciesHz(), plan.sweep().multisineTolerance(),
                memory == null ? Integer.MAX_VALUE : memory).frequenciesHz();
        boolean forTones = java.util.Arrays.stream(tones).allMatch(fixture::covers);
        boolean forSteps = plan.sweep().frequenciesHz().stream().allMatch(fixture::covers);
        if (forTones || !forSteps) {
            return c;
        }
        return new Choice(plan.withSweep(plan.sweep().withMultisine(false)), "stepped (excitation auto): the"
                + " corrections in force (fixture of " + fixture.measuredAt() + ") were read at the stepped sweep's"
                + " frequencies, not at the multisine's tones; lrbench calibrate with this plan reads them for the"
                + " multisine, which this bench would run otherwise");
    }

    /**
     * The generator's and the digitizer's driver files as they are now: part of what a choice is
     * remembered by, so that a long-running service sees a driver file edited under it (an unreadable
     * file is left for the choice itself to report).
     */
    private static List<String> driverTexts(BenchConfig bench, DriverLoader drivers) {
        List<String> texts = new ArrayList<>();
        for (String name : List.of(bench.generator().driver(), bench.digitizer().driver())) {
            try {
                texts.add(java.nio.file.Files.readString(drivers.directory().resolve(name + ".yaml")));
            } catch (java.io.IOException | RuntimeException e) {
                texts.add("unreadable: " + e);
            }
        }
        return texts;
    }

    /** Forgets the choices made in this process (a test that makes one twice). */
    static void forget() {
        CHOSEN.clear();
        TWINS.clear();
    }

    private static Choice choose(Plan plan, BenchConfig bench, DriverLoader drivers) throws ProblemsException {
        Plan stepped = plan.withSweep(plan.sweep().withMultisine(false));
        Plan multi = plan.withSweep(plan.sweep().withMultisine(true));
        List<String> impossible = new ArrayList<>(PlanFit.problems(multi, drivers, bench.generator().driver(),
                bench.digitizer().driver()));
        impossible.removeAll(PlanFit.problems(stepped, drivers, bench.generator().driver(), bench.digitizer().driver()));
        if (!impossible.isEmpty()) {
            return new Choice(stepped, "stepped (excitation auto): the multisine is not possible here: " + impossible.get(0));
        }
        Twin s;
        Twin m;
        try {
            Twin[] pair = twins(plan, bench, drivers);
            s = pair[0];
            m = pair[1];
        } catch (ProblemsException e) {
            throw e;
        } catch (Exception e) {
            // not a fault of the bench or the parts: the comparison could not be made, so the sweep that
            // needs none is taken, and the reason said
            return new Choice(stepped, "stepped (excitation auto): the two excitations could not be compared on the"
                    + " bench's simulated twin: " + e.getMessage());
        }
        String worst = null;
        double ratio = 0;
        for (var e : s.expanded().entrySet()) {
            Double um = m.expanded().get(e.getKey());
            double r = um == null ? Double.POSITIVE_INFINITY : um / e.getValue();
            if (worst == null || !(r <= ratio)) {
                worst = e.getKey();
                ratio = r;
            }
        }
        if (worst != null && !(ratio <= PartTime.EQUAL_ENOUGH)) {
            return new Choice(stepped, String.format(Locale.ROOT, "stepped (excitation auto): on the bench's simulated"
                    + " twin the multisine's U(%s) is %.2fx the stepped sweep's (it counts only within %.1fx)", worst,
                    ratio, PartTime.EQUAL_ENOUGH));
        }
        SimTiming link = link(bench);
        DriverFile digitizer = drivers.load(bench.digitizer().driver(), DriverKind.DIGITIZER);
        DriverFile source = drivers.load(bench.generator().driver(), DriverKind.SOURCE);
        int bytes = digitizer.traceEncoding().bytesOnWire();
        double ts = PhysicalTime.of(stepped, s.points(), link, bytes, 0);
        double tm = PhysicalTime.of(multi, m.points(), link, bytes, PhysicalTime.waveformBytes(multi, source));
        String times = String.format(Locale.ROOT, "%.0f ms a part against %.0f ms stepped on a %s link (settles, records,"
                + " transfers; the multisine's record %d samples a channel)", 1e3 * tm, 1e3 * ts, link.name(),
                m.points().isEmpty() ? 0 : m.points().get(0).samples());
        if (!(tm < ts)) {
            return new Choice(stepped, "stepped (excitation auto): the multisine is not faster: " + times);
        }
        return new Choice(multi, String.format(Locale.ROOT, "multisine (excitation auto): %s, every U within %.1fx of the"
                + " stepped sweep's on the bench's simulated twin (worst %s, %.2fx)", times, PartTime.EQUAL_ENOUGH,
                worst, ratio));
    }

    /**
     * The plan's nominal part measured stepped and as a multisine on the bench's simulated twin, each
     * calibrated for it; remembered, since the twin's instruments answer at once whatever the bench's
     * link: one pair of measurements serves every link and every caller (the choice, rehearse's table).
     */
    static Twin[] twins(Plan plan, BenchConfig bench, DriverLoader drivers) throws Exception {
        Plan open = plan.withSweep(plan.sweep().withExcitationOpen());
        List<Object> key = List.of(open, bench.withSimulation(bench.simulation().withTiming(SimTiming.NONE)),
                drivers.directory(), driverTexts(bench, drivers));
        Twin[] pair = TWINS.get(key);
        if (pair == null) {
            PartModel part = Rehearsal.nominal(plan);
            pair = new Twin[] {Twin.measure(plan.withSweep(plan.sweep().withMultisine(false)), bench, drivers, part),
                Twin.measure(plan.withSweep(plan.sweep().withMultisine(true)), bench, drivers, part)};
            if (TWINS.size() > 16) {
                TWINS.clear();
            }
            TWINS.put(key, pair);
        }
        return pair;
    }

    /**
     * The link the traces come over, as figures: the digitizer's address decides.
     */
    static SimTiming link(BenchConfig bench) {
        Address a = bench.digitizer().address();
        switch (a.scheme()) {
            case "sim" -> {
                SimTiming t = bench.simulation().timing();
                return t.none() ? SimTiming.LAN : t;
            }
            case "usbtmc" -> {
                return SimTiming.USB;
            }
            case "serial" -> {
                int baud = a.intOption("baud", 9600, 50, 4_000_000);
                SimTiming s = SimTiming.SERIAL;
                return new SimTiming("serial " + baud + " baud", s.messageSecond(), baud / 10.0, s.frequencyChangeSecond(),
                        s.armSecond());
            }
            default -> {
                return SimTiming.LAN;
            }
        }
    }

    /**
     * One measurement of the nominal part on the bench's simulated twin, calibrated for the plan first:
     * U (95 %) per limit and the points it took.
     */
    record Twin(Map<String, Double> expanded, List<PointResult> points) {

        static Twin measure(Plan plan, BenchConfig twin, DriverLoader drivers, PartModel part) throws Exception {
            // instruments that answer at once: what is measured here is U and the records taken, not time
            BenchConfig bench = twin.withSimulation(twin.simulation().withTiming(SimTiming.NONE));
            SimBench calBench = new SimBench(bench.simulation(), plan.wiring(), part);
            Calibration corrections;
            try (BenchInstruments inst = BenchInstruments.open(bench, drivers, calBench)) {
                corrections = CalibrationRun.calibrate(plan, inst, calBench::setPosition, BenchClock.NONE,
                        bench.accuracy());
            }
            BenchConfig b = bench.withSimulation(bench.simulation().withSeed(bench.simulation().seed() + 1));
            SimBench sim = new SimBench(b.simulation(), plan.wiring(), part);
            Map<String, Double> out = new LinkedHashMap<>();
            List<PointResult> points = new ArrayList<>();
            SweepListener listener = new SweepListener() {
                @Override
                public void pointMeasured(int index, int count, PointResult point) {
                    points.add(point);
                }
            };
            try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
                var r = PartRun.measure(new PartRun.Request(plan, "rehearsal", b, "REHEARSAL", "U", true, "rehearsal",
                        corrections), inst, BenchClock.NONE, listener);
                for (var l : plan.limits()) {
                    var u = r.budgets().get(l.name());
                    if (u != null) {
                        out.put(l.name(), u.expandedUncertainty());
                    }
                }
            }
            return new Twin(out, List.copyOf(points));
        }
    }
}
