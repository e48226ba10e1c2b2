package org.lrbench.run;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.calibration.FixtureCompensation;

/** The fixture's stray admittance, read where it shows, applied where its open reading was lost in noise. */
class StrayModelTests {

    @Test
    void aStrayReadAtHighFrequencyIsRemovedAtTheLowOnesToo() {
        // fixture model (series leads, shunt stray, circuit theory): Z_m = Z_s + 1 / (Y_o + 1 / Z_dut),
        // with Y_o = j w 3 pF; the open is readable at 100 kHz only
        double c = 3e-12;
        Complex zs = new Complex(0.025, 0);
        double[] f = {1e3, 1e4, 1e5};
        List<FixtureCompensation.Point> measured = List.of(
                new FixtureCompensation.Point(f[0], 0.025, 0, Double.NaN, Double.NaN, 1e-4),
                new FixtureCompensation.Point(f[1], 0.025, 0, Double.NaN, Double.NaN, 1e-4),
                new FixtureCompensation.Point(f[2], 0.025, 0, zs.add(new Complex(0, 2 * Math.PI * f[2] * c).reciprocal())
                        .getReal(), zs.add(new Complex(0, 2 * Math.PI * f[2] * c).reciprocal()).getImaginary(), 1e-4));
        FixtureCompensation comp = new FixtureCompensation("t", CalibrationRun.strayEverywhere(measured));
        assertThat(comp.points().get(0).modelled()).isTrue();
        assertThat(comp.points().get(2).modelled()).isFalse();
        for (double freq : f) {
            double w = 2 * Math.PI * freq;
            Complex dut = new Complex(5, w * 10e-3);
            Complex zm = zs.add(new Complex(0, w * c).add(dut.reciprocal()).reciprocal());
            Complex back = comp.correct(freq, zm);
            assertThat(back.getReal()).as("R at " + freq).isCloseTo(5, within(1e-6));
            assertThat(back.getImaginary() / w).as("L at " + freq).isCloseTo(10e-3, within(1e-12));
        }
    }
}
