package org.lrbench.run;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.calibration.Calibration;
import org.lrbench.calibration.ChannelMatch;
import org.lrbench.calibration.FixtureCompensation;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.Sleeper;
import org.lrbench.measure.SweepListener;
import org.lrbench.measure.SweepRunner;
import org.lrbench.plan.Plan;
import org.lrbench.sim.FixturePosition;

/**
 * Measures a bench's corrections at a plan's sweep frequencies: the channel match (both channels
 * on the sense resistor), then the fixture's short and open. The generator output is guarded as
 * in every measurement and is off whenever the operator changes the wiring.
 */
public final class CalibrationRun {

    private CalibrationRun() {
    }

    public static ChannelMatch channels(Plan plan, BenchInstruments inst, FixtureChange change, Sleeper sleeper) {
        List<PointResult> points = sweep(plan, inst, change, FixturePosition.CHANNEL_MATCH, sleeper, false);
        double[] f = new double[points.size()];
        List<Complex> ratio = new ArrayList<>();
        for (int i = 0; i < points.size(); i++) {
            ImpedancePoint z = points.get(i).impedance();
            f[i] = z.frequencyHz();
            ratio.add(z.impedanceOhm().divide(plan.senseResistanceOhm()));
        }
        return ChannelMatch.fit(now(), f, ratio);
    }

    /** Short and open of the fixture, each corrected by the channel match when there is one. */
    public static FixtureCompensation fixture(Plan plan, BenchInstruments inst, FixtureChange change, Sleeper sleeper,
                                              ChannelMatch channels) {
        Calibration match = new Calibration(channels, null);
        List<PointResult> shorts = sweep(plan, inst, change, FixturePosition.SHORT, sleeper, false);
        List<PointResult> opens = sweep(plan, inst, change, FixturePosition.OPEN, sleeper, true);
        List<FixtureCompensation.Point> out = new ArrayList<>();
        for (int i = 0; i < shorts.size(); i++) {
            ImpedancePoint s = match.apply(shorts.get(i).impedance());
            ImpedancePoint o = opens.get(i).impedance();
            Complex open = Double.isNaN(o.impedanceOhm().getReal()) ? new Complex(Double.NaN, Double.NaN)
                    : match.apply(o).impedanceOhm();
            out.add(new FixtureCompensation.Point(s.frequencyHz(), s.resistanceOhm(), s.reactanceOhm(),
                    open.getReal(), open.getImaginary(), s.componentUncertaintyOhm()));
        }
        change.moveTo(FixturePosition.PART);
        return new FixtureCompensation(now(), List.copyOf(out));
    }

    private static List<PointResult> sweep(Plan plan, BenchInstruments inst, FixtureChange change,
                                           FixturePosition position, Sleeper sleeper, boolean open) {
        OutputGuard guard = new OutputGuard(inst.generator());
        try {
            guard.switchOff();
            change.moveTo(position);
            Plan sweepOnly = new Plan(plan.source(), plan.partNumber(), plan.description(), plan.senseResistanceOhm(),
                    plan.sweep(), null, plan.limits(), plan.sampling(), plan.wiring(), null);
            return new SweepRunner(inst.generator(), inst.digitizer(), sleeper, open).run(sweepOnly, SweepListener.NONE)
                    .points();
        } finally {
            guard.close();
            if (guard.failure() != null) {
                throw new org.lrbench.instrument.InstrumentException(guard.failure());
            }
        }
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }
}
