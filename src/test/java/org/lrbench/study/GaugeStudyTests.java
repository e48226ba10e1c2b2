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

    /**
     * The published worked example of the ANOVA method: AIAG, Measurement Systems Analysis reference
     * manual, 4th ed. (2010), the gauge study of 10 parts, appraisers A, B and C, 3 trials, and its
     * ANOVA table (data and table from memory; that the sums of squares come out to every printed
     * digit corroborates both). Rows: appraiser, trial; columns: parts 1 to 10.
     */
    private static final double[][][] MSA_EXAMPLE = {
        {{0.29, -0.56, 1.34, 0.47, -0.80, 0.02, 0.59, -0.31, 2.26, -1.36},
            {0.41, -0.68, 1.17, 0.50, -0.92, -0.11, 0.75, -0.20, 1.99, -1.25},
            {0.64, -0.58, 1.27, 0.64, -0.84, -0.21, 0.66, -0.17, 2.01, -1.31}},
        {{0.08, -0.47, 1.19, 0.01, -0.56, -0.20, 0.47, -0.63, 1.80, -1.68},
            {0.25, -1.22, 0.94, 1.03, -1.20, 0.22, 0.55, 0.08, 2.12, -1.62},
            {0.07, -0.68, 1.34, 0.20, -1.28, 0.06, 0.83, -0.34, 2.19, -1.50}},
        {{0.04, -1.38, 0.88, 0.14, -1.46, -0.29, 0.02, -0.46, 1.77, -1.49},
            {-0.11, -1.13, 1.09, 0.20, -1.07, -0.67, 0.01, -0.56, 1.45, -1.77},
            {-0.15, -0.96, 0.67, 0.11, -1.45, -0.49, 0.21, -0.49, 1.87, -2.16}}};

    @Test
    void thePublishedWorkedExampleGivesItsAnovaTable() {
        double[][][] y = new double[10][3][3];
        for (int a = 0; a < 3; a++) {
            for (int r = 0; r < 3; r++) {
                for (int p = 0; p < 10; p++) {
                    y[p][a][r] = MSA_EXAMPLE[a][r][p];
                }
            }
        }
        GaugeStudy.Result res = GaugeStudy.analyse(y, 0);
        // the manual's table: appraiser 2 df, SS 3.1673, MS 1.58363; parts 9 df, SS 88.3619, MS 9.81799;
        // appraiser by part 18 df, SS 0.3590; equipment 60 df, SS 2.7589; total 89 df, SS 94.6471
        GaugeStudy.Row part = row(res, "part");
        GaugeStudy.Row appraiser = row(res, "appraiser");
        assertThat(part.df()).isEqualTo(9);
        assertThat(part.sumOfSquares()).isCloseTo(88.3619, within(5e-5));
        assertThat(part.meanSquare()).isCloseTo(9.81799, within(5e-6));
        assertThat(appraiser.df()).isEqualTo(2);
        assertThat(appraiser.sumOfSquares()).isCloseTo(3.1673, within(5e-5));
        assertThat(appraiser.meanSquare()).isCloseTo(1.58363, within(5e-6));
        assertThat(row(res, "total").sumOfSquares()).isCloseTo(94.6471, within(5e-5));
        // the interaction (F = 0.434 in the manual) is not significant: pooled with the equipment's
        // variation, 0.3590 + 2.7589 over 18 + 60 degrees of freedom
        assertThat(res.interactionPooled()).isTrue();
        GaugeStudy.Row pooled = res.table().stream().filter(r -> r.source().startsWith("repeatability")).findFirst()
                .orElseThrow();
        assertThat(pooled.df()).isEqualTo(78);
        assertThat(pooled.sumOfSquares()).isCloseTo(0.3590 + 2.7589, within(1e-4));
    }

    private static GaugeStudy.Row row(GaugeStudy.Result r, String source) {
        return r.table().stream().filter(x -> x.source().equals(source)).findFirst().orElseThrow();
    }

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
