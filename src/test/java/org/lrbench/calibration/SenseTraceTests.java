package org.lrbench.calibration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;
import org.lrbench.TestBench;
import org.lrbench.bench.BenchConfig;
import org.lrbench.bench.BenchLoader;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.plan.PlanLoader;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.CalibrationRun;
import org.lrbench.run.PartRun;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;

/**
 * The sense resistor traced by the bench's meter: Z = R_s V2 / V1, so a sense resistor 0.08 % above
 * its nominal (inside its 0.1 % tolerance) reads every impedance 0.08 % low until its value is
 * measured; traced 4-wire, the error goes and U shrinks to what the meter's specification leaves.
 */
class SenseTraceTests {
    private static final double ERROR = 0.0008;

    private static BenchConfig bench() throws Exception {
        BenchConfig b = BenchLoader.load(TestBench.home().resolve("simulator/bench.yaml"));
        return b.withSimulation(b.simulation().withSenseError(ERROR));
    }

    private static Plan plan(BenchConfig b) throws Exception {
        return PlanLoader.load(TestBench.home().resolve("plans/qfd-ind-1m0.yaml"), b.maxAmplitudeVolt());
    }

    @Test
    void aTracedSenseResistorRemovesItsErrorAndItsToleranceFromU() throws Exception {
        BenchConfig b = bench();
        Plan plan = plan(b);
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 0));
        DriverLoader drivers = new DriverLoader(TestBench.home().resolve("drivers"));
        try (BenchInstruments inst = BenchInstruments.open(b, drivers, sim)) {
            // the bench's corrections without the trace (calibrate traces it too where there is a meter)
            Calibration match = CalibrationRun.calibrate(plan, inst, sim::setPosition, BenchClock.NONE).withSense(null);
            SenseTrace trace = CalibrationRun.senseResistor(plan, inst, sim::setPosition, b.accuracy());
            assertThat(trace.valueOhm()).isCloseTo(plan.senseResistanceOhm() * (1 + ERROR),
                    org.assertj.core.api.Assertions.within(3 * trace.standardUncertaintyOhm()));
            PartResult nominal = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "N", true, "t", match), inst,
                    BenchClock.NONE, SweepListener.NONE);
            PartResult traced = PartRun.measure(new PartRun.Request(plan, "0", b, "L", "T", true, "t",
                    match.withSense(trace)), inst, BenchClock.NONE, SweepListener.NONE);
            double errNominal = nominal.inductanceH() / 1e-3 - 1;
            double errTraced = traced.inductanceH() / 1e-3 - 1;
            // the nominal's reading is low by about the resistor's error (circuit theory: Z scales with R_s)
            assertThat(errNominal).isLessThan(-0.5 * ERROR);
            assertThat(Math.abs(errTraced)).isLessThan(Math.abs(errNominal) / 3)
                    .isLessThanOrEqualTo(traced.inductanceExpandedUncertaintyH() / 1e-3);
            assertThat(traced.inductanceExpandedUncertaintyH()).isLessThan(nominal.inductanceExpandedUncertaintyH());
            assertThat(traced.budgets().get("inductance").contributions())
                    .anySatisfy(c -> assertThat(c.source()).contains("traced by the bench's meter"))
                    .anySatisfy(c -> assertThat(c.source()).contains("AC/DC difference"))
                    .noneSatisfy(c -> assertThat(c.source()).contains("tolerance"));
            assertThat(nominal.budgets().get("inductance").contributions())
                    .anySatisfy(c -> assertThat(c.source()).contains("not traced"));
        }
    }

    @Test
    void aSimulatedSenseResistorCanBeDrawnWithinItsToleranceFromTheSeed(@org.junit.jupiter.api.io.TempDir
                                                                        java.nio.file.Path dir) throws Exception {
        String text = java.nio.file.Files.readString(TestBench.home().resolve("simulator/bench.yaml"));
        // the demo's bench file draws its sense resistor's error (and declares so)
        assertThat(text).containsPattern("(?m)^\\s+sense_resistor_error: drawn");
        String drawn = text;
        java.nio.file.Path a = dir.resolve("a.yaml");
        java.nio.file.Files.writeString(a, drawn);
        java.nio.file.Path b = dir.resolve("b.yaml");
        java.nio.file.Files.writeString(b, drawn.replaceFirst("(?m)^(\\s+)seed: .*$", "$1seed: 99"));
        BenchConfig one = BenchLoader.load(a);
        BenchConfig two = BenchLoader.load(b);
        double tolerance = one.accuracy().senseTolerance();
        assertThat(one.simulation().senseError()).isNotZero().isBetween(-tolerance, tolerance);
        assertThat(two.simulation().senseError()).isBetween(-tolerance, tolerance)
                .isNotEqualTo(one.simulation().senseError());
        // the same seed, the same resistor; it stays as measurements draw their own noise
        assertThat(BenchLoader.load(a).simulation().senseError()).isEqualTo(one.simulation().senseError());
        assertThat(one.withSeedOffset(5).simulation().senseError()).isEqualTo(one.simulation().senseError());
    }

    @Test
    void aReadingThatIsNotTheSenseResistorIsRefused() throws Exception {
        BenchConfig b = bench();
        Plan plan = plan(b);
        SimBench sim = new SimBench(b.simulation(), plan.wiring(), new PartModel(1e-3, 2.3, 0));
        try (BenchInstruments inst = BenchInstruments.open(b, new DriverLoader(TestBench.home().resolve("drivers")), sim)) {
            // the leads stay on the part: the meter reads its 2.3 ohm winding
            assertThatThrownBy(() -> CalibrationRun.senseResistor(plan, inst, position -> { }, b.accuracy()))
                    .isInstanceOf(CalibrationRefused.class).hasMessageContaining("the meter reads 2.3")
                    .hasMessageContaining("nothing stored");
        }
    }
}
