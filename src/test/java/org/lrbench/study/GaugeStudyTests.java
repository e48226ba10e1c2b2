package org.lrbench.study;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.apache.commons.math3.stat.regression.OLSMultipleLinearRegression;
import org.junit.jupiter.api.Test;

class GaugeStudyTests {

    /** Parts x appraisers x trials with part, appraiser and interaction effects and noise. */
    private static double[][][] data(long seed, double appraiserSd, double interactionSd) {
        Random rnd = new Random(seed);
        int p = 10;
        int a = 3;
        int r = 3;
        double[] part = new double[p];
        double[] appr = new double[a];
        for (int i = 0; i < p; i++) {
            part[i] = 1.0 + 0.05 * rnd.nextGaussian();
        }
        for (int j = 0; j < a; j++) {
            appr[j] = appraiserSd * rnd.nextGaussian();
        }
        double[][][] y = new double[p][a][r];
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < a; j++) {
                double cell = part[i] + appr[j] + interactionSd * rnd.nextGaussian();
                for (int k = 0; k < r; k++) {
                    y[i][j][k] = cell + 0.004 * rnd.nextGaussian();
                }
            }
        }
        return y;
    }

    /** The residual sum of squares of an OLS fit with dummy columns for the named effects (Commons Math). */
    private static double rss(double[][][] y, boolean parts, boolean appraisers, boolean cells) {
        int p = y.length;
        int a = y[0].length;
        int r = y[0][0].length;
        List<double[]> rows = new ArrayList<>();
        List<Double> obs = new ArrayList<>();
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < a; j++) {
                for (int k = 0; k < r; k++) {
                    List<Double> x = new ArrayList<>();
                    if (parts) {
                        for (int q = 1; q < p; q++) {
                            x.add(i == q ? 1.0 : 0.0);
                        }
                    }
                    if (appraisers) {
                        for (int q = 1; q < a; q++) {
                            x.add(j == q ? 1.0 : 0.0);
                        }
                    }
                    if (cells) {
                        for (int q = 1; q < p; q++) {
                            for (int s = 1; s < a; s++) {
                                x.add(i == q && j == s ? 1.0 : 0.0);
                            }
                        }
                    }
                    rows.add(x.stream().mapToDouble(Double::doubleValue).toArray());
                    obs.add(y[i][j][k]);
                }
            }
        }
        double[] yy = obs.stream().mapToDouble(Double::doubleValue).toArray();
        if (rows.get(0).length == 0) {
            double mean = java.util.Arrays.stream(yy).average().orElseThrow();
            return java.util.Arrays.stream(yy).map(v -> (v - mean) * (v - mean)).sum();
        }
        OLSMultipleLinearRegression ols = new OLSMultipleLinearRegression();
        ols.newSampleData(yy, rows.toArray(double[][]::new));
        return ols.calculateResidualSumOfSquares();
    }

    @Test
    void sumsOfSquaresAgreeWithNestedRegressionsInCommonsMath() {
        // Reference: Apache Commons Math OLSMultipleLinearRegression. In a balanced layout each
        // effect's sum of squares is the fall in the residual sum of squares when its dummy columns
        // join the model (sequential and adjusted sums coincide; common practice, no source)
        double[][][] y = data(3, 0.003, 0.004);
        GaugeStudy.Result g = GaugeStudy.analyse(y, 0.2);
        assertThat(g.interactionPooled()).isFalse();
        double total = rss(y, false, false, false);
        double afterParts = rss(y, true, false, false);
        double additive = rss(y, true, true, false);
        double full = rss(y, true, true, true);
        var t = g.table();
        assertThat(t.get(0).sumOfSquares()).isCloseTo(total - afterParts, within(1e-12));
        assertThat(t.get(1).sumOfSquares()).isCloseTo(afterParts - additive, within(1e-12));
        assertThat(t.get(2).sumOfSquares()).isCloseTo(additive - full, within(1e-12));
        assertThat(t.get(3).sumOfSquares()).isCloseTo(full, within(1e-12));
        assertThat(t.get(4).sumOfSquares()).isCloseTo(total, within(1e-12));
        // degrees of freedom 9, 2, 18, 60, 89
        assertThat(t.stream().mapToInt(GaugeStudy.Row::df).toArray()).containsExactly(9, 2, 18, 60, 89);
    }

    @Test
    void theComponentsRecoverWhatTheDataWereMadeOf() {
        // repeatability 0.004, appraiser 0.003 (three of them: a rough estimate), interaction 0.004, parts 0.05
        double[] grr = new double[40];
        double[] rep = new double[40];
        for (int s = 0; s < 40; s++) {
            GaugeStudy.Result g = GaugeStudy.analyse(data(100 + s, 0.003, 0.004), 0.2);
            rep[s] = Math.sqrt(g.repeatability());
            grr[s] = g.grr();
        }
        assertThat(java.util.Arrays.stream(rep).average().orElseThrow()).isCloseTo(0.004, within(0.0003));
        // expected GRR variance 0.004^2 + 0.003^2 + 0.004^2 = 4.1e-5, within the scatter of 40 studies
        assertThat(java.util.Arrays.stream(grr).average().orElseThrow()).isCloseTo(4.1e-5, within(1.2e-5));
    }

    @Test
    void aSmallInteractionIsPooledAndTheFiguresFollowTheirDefinitions() {
        GaugeStudy.Result g = GaugeStudy.analyse(data(7, 0.002, 0.0), 0.2);
        assertThat(g.interactionPooled()).isTrue();
        assertThat(g.interaction()).isZero();
        // pooled: the error row carries 18 + 60 degrees of freedom
        assertThat(g.table().get(2).df()).isEqualTo(78);
        assertThat(g.percentOfTotalVariation()).isCloseTo(100 * Math.sqrt(g.grr() / (g.grr() + g.part())), within(1e-9));
        assertThat(g.percentOfTolerance()).isCloseTo(100 * 6 * Math.sqrt(g.grr()) / 0.2, within(1e-9));
        assertThat(g.distinctCategories()).isEqualTo((int) Math.floor(1.41 * Math.sqrt(g.part() / g.grr())));
    }

    @Test
    void anUnbalancedOrTooSmallStudyIsRefused() {
        assertThatThrownBy(() -> GaugeStudy.analyse(new double[][][] {{{1, 2}, {1, 2}}}, 1))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("at least 2 parts");
        assertThatThrownBy(() -> GaugeStudy.analyse(new double[][][] {{{1, 2}, {1, 2}}, {{1, 2}, {1}}}, 1))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("part 2, appraiser 2 has 1 trials");
    }

    @Test
    void typeOneIndicesByTheirDefinitions() {
        // Cg = 0.2 T / (6 s), Cgk = (0.1 T - |bias|) / (3 s) (from memory); readings 1.000 +/- 0.001
        // alternating: mean 1.0005, s of 0,1,0,1,... x 0.001
        double[] v = new double[20];
        for (int i = 0; i < v.length; i++) {
            v[i] = 1.000 + (i % 2) * 0.001;
        }
        TypeOneStudy.Result r = TypeOneStudy.analyse(v, 1.0, 0.1);
        double s = Math.sqrt(20 * 0.25e-6 / 19);
        assertThat(r.standardDeviation()).isCloseTo(s, within(1e-15));
        assertThat(r.cg()).isCloseTo(0.02 / (6 * s), within(1e-9));
        assertThat(r.cgk()).isCloseTo((0.01 - 0.0005) / (3 * s), within(1e-9));
        assertThat(r.capable()).isTrue();
        assertThatThrownBy(() -> TypeOneStudy.analyse(new double[5], 1, 1)).hasMessageContaining("at least 10");
    }
}
