package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.apache.commons.math3.stat.regression.OLSMultipleLinearRegression;
import org.junit.jupiter.api.Test;

/**
 * The multi-harmonic fit against ordinary least squares in Apache Commons Math on the same design
 * (cosine and sine of each harmonic, and an offset), on a record that is not a whole number of
 * cycles so no sum vanishes.
 */
class HarmonicFitTests {

    @Test
    void theFitEqualsOrdinaryLeastSquaresOnTheSameDesign() {
        Random random = new Random(7);
        double f = 517.3;
        double dt = 1 / (f * 97.31);
        int n = 1543;
        int k = 12;
        double[] y = new double[n];
        double[][] x = new double[n][2 * k];
        for (int i = 0; i < n; i++) {
            double t = i * dt;
            double v = 0.013;
            for (int h = 1; h <= k; h++) {
                double c = Math.cos(2 * Math.PI * h * f * t);
                double s = Math.sin(2 * Math.PI * h * f * t);
                x[i][2 * h - 2] = c;
                x[i][2 * h - 1] = s;
                v += (1.0 / (h * h)) * (0.8 * c - 0.3 * s);
            }
            y[i] = v + 0.01 * random.nextGaussian();
        }
        OLSMultipleLinearRegression ols = new OLSMultipleLinearRegression();
        ols.newSampleData(y, x);
        double[] beta = ols.estimateRegressionParameters(); // offset first, then the design's columns
        HarmonicFit.Result r = HarmonicFit.fit(y, dt, f, k);
        assertThat(r.offset()).isCloseTo(beta[0], within(1e-10));
        for (int h = 1; h <= k; h++) {
            assertThat(r.cosine()[h]).as("cosine %d", h).isCloseTo(beta[2 * h - 1], within(1e-10));
            assertThat(r.sine()[h]).as("sine %d", h).isCloseTo(beta[2 * h], within(1e-10));
        }
    }
}
