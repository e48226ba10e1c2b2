package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.apache.commons.math3.stat.regression.OLSMultipleLinearRegression;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

class SineFitTests {

    /**
     * IEEE Std 1057-2017, 4.1.3.1 (three-parameter fit): for an exact sine the least-squares
     * solution is the sine itself, whatever the (non-integer) number of cycles in the record.
     */
    @ParameterizedTest(name = "A={0} phase={1} offset={2} f={3} n={4}")
    @CsvSource({
        "1.0, 0.0, 0.0, 1000, 1000",
        "2.5, 1.0, 0.2, 1000, 1037",
        "0.013, -2.9, -0.004, 12345.678, 4999",
        "7.0, 3.1, 1.5, 50, 333",
        "1.0, 0.5, 0.0, 997.3, 1000000"})
    void recoversExactSinesIncludingNonIntegerCycles(double a, double phase, double offset, double f, int n) {
        double dt = 1e-5;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = a * Math.cos(2 * Math.PI * f * i * dt + phase) + offset;
        }
        SineFitResult r = SineFit.fit(y, dt, f);
        assertThat(r.amplitude()).isCloseTo(a, within(1e-9 * Math.max(1, a)));
        assertThat(r.phase()).isCloseTo(phase, within(1e-9));
        assertThat(r.offset()).isCloseTo(offset, within(1e-9));
        // the one-pass residual, sum(y^2) - p.(X'y), has a rounding floor near 1e-7 of the amplitude
        assertThat(r.residualRms()).isLessThan(1e-6 * Math.max(1, a));
    }

    @ParameterizedTest(name = "f = {0} Hz at 48 kHz, {1} samples")
    @CsvSource({"1234.5, 2345", "3.7, 20003", "23987.0, 4099", "12000.0, 1027", "16000.3, 513"})
    void agreesWithCommonsMathOrdinaryLeastSquaresOnNoisyData(double f, int n) {
        // Reference: Apache Commons Math OLSMultipleLinearRegression (QR-based) solving the same
        // design matrix [cos, sin, 1]; our fit (closed-form design sums, Goertzel data sums) must
        // give the same estimates: near DC (the design sums' direct path), near Nyquist, at a
        // quarter of the sample rate, and with records whose length leaves a tail after the lanes.
        Random rnd = new Random(42);
        double dt = 1.0 / 48000;
        double[] y = new double[n];
        double[][] x = new double[n][2];
        for (int i = 0; i < n; i++) {
            double t = i * dt;
            x[i][0] = Math.cos(2 * Math.PI * f * t);
            x[i][1] = Math.sin(2 * Math.PI * f * t);
            y[i] = 0.8 * x[i][0] - 0.3 * x[i][1] + 0.05 + 0.01 * rnd.nextGaussian();
        }
        OLSMultipleLinearRegression ols = new OLSMultipleLinearRegression();
        ols.newSampleData(y, x);
        double[] beta = ols.estimateRegressionParameters(); // intercept, cos, sin
        double[] se = ols.estimateRegressionParametersStandardErrors();
        SineFitResult r = SineFit.fit(y, dt, f);
        assertThat(r.offset()).isCloseTo(beta[0], within(1e-10));
        assertThat(r.cosineCoefficient()).isCloseTo(beta[1], within(1e-10));
        assertThat(r.sineCoefficient()).isCloseTo(beta[2], within(1e-10));
        assertThat(Math.sqrt(r.varianceCosine())).isCloseTo(se[1], within(1e-3 * se[1]));
        assertThat(Math.sqrt(r.varianceSine())).isCloseTo(se[2], within(1e-3 * se[2]));
    }

    @Test
    void refusesRecordsThatCannotSeparateSineFromOffset() {
        double[] flat = new double[10];
        assertThatThrownBy(() -> SineFit.fit(flat, 1e-9, 1.0)).hasMessageContaining("singular");
        assertThatThrownBy(() -> SineFit.fit(new double[3], 1e-3, 1.0)).hasMessageContaining("at least 4");
    }
}
