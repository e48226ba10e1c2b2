package org.lrbench.study;

import java.util.List;
import org.apache.commons.math3.distribution.FDistribution;

/**
 * The crossed gauge repeatability-and-reproducibility study by two-way analysis of variance with
 * interaction, parts and appraisers (operators or benches) both random: every appraiser measures
 * every part the same number of times. Sums of squares of the balanced two-way layout; variance
 * components from the expected mean squares of the random model (D. C. Montgomery, Design and
 * Analysis of Experiments, the two-factor random effects model, from memory): repeatability
 * MS_E; interaction (MS_PA - MS_E) / r; appraiser (MS_A - MS_PA) / (p r); part
 * (MS_P - MS_PA) / (a r); a negative estimate is taken as zero. When the interaction is not
 * significant (p-value above 0.25, the usual rule for pooling in gauge studies, from memory) it is
 * pooled into the error and the additive model's components used instead. GRR is repeatability
 * plus reproducibility (appraiser and interaction); %GRR is 100 sigma_GRR / sigma_total of the
 * study and, against a tolerance T, 100 x 6 sigma_GRR / T; the number of distinct categories is
 * the whole part of 1.41 sigma_part / sigma_GRR (AIAG MSA, from memory).
 */
public final class GaugeStudy {
    /** Interaction p-value above which it is pooled into the error. */
    public static final double POOL_ABOVE = 0.25;

    private GaugeStudy() {
    }

    /** One row of the ANOVA table. */
    public record Row(String source, int df, double sumOfSquares, double meanSquare, double f, double p) {
    }

    /** The study's result: the table, the variance components (as variances) and the figures. */
    public record Result(List<Row> table, boolean interactionPooled, double repeatability, double appraiser,
                         double interaction, double part, double tolerance) {

        public double reproducibility() {
            return appraiser + interaction;
        }

        public double grr() {
            return repeatability + reproducibility();
        }

        public double total() {
            return grr() + part;
        }

        /** 100 sigma_GRR / sigma_total. */
        public double percentOfTotalVariation() {
            return 100 * Math.sqrt(grr() / total());
        }

        /** 100 x 6 sigma_GRR / tolerance (NaN without a tolerance). */
        public double percentOfTolerance() {
            return tolerance > 0 ? 100 * 6 * Math.sqrt(grr()) / tolerance : Double.NaN;
        }

        /** The usual acceptance (AIAG MSA, from memory): %GRR of the tolerance at most 10 % and ndc at least 5. */
        public boolean acceptable() {
            return percentOfTolerance() <= 10 && distinctCategories() >= 5;
        }

        /** The number of distinct categories: whole part of 1.41 sigma_part / sigma_GRR, at least 1. */
        public int distinctCategories() {
            return grr() > 0 ? Math.max(1, (int) Math.floor(1.41 * Math.sqrt(part / grr()))) : Integer.MAX_VALUE;
        }
    }

    /**
     * @param y         y[part][appraiser][trial], balanced: at least 2 parts, 2 appraisers, 2 trials
     * @param tolerance the characteristic's tolerance width (upper minus lower limit), or 0
     */
    public static Result analyse(double[][][] y, double tolerance) {
        int p = y.length;
        int a = p > 0 ? y[0].length : 0;
        int r = a > 0 ? y[0][0].length : 0;
        if (p < 2 || a < 2 || r < 2) {
            throw new IllegalArgumentException("a crossed study needs at least 2 parts, 2 appraisers and 2 trials; got "
                    + p + ", " + a + ", " + r);
        }
        double grand = 0;
        double[] partMean = new double[p];
        double[] apprMean = new double[a];
        double[][] cellMean = new double[p][a];
        for (int i = 0; i < p; i++) {
            if (y[i].length != a) {
                throw new IllegalArgumentException("part " + (i + 1) + " has " + y[i].length + " appraisers, not " + a);
            }
            for (int j = 0; j < a; j++) {
                if (y[i][j].length != r) {
                    throw new IllegalArgumentException("part " + (i + 1) + ", appraiser " + (j + 1) + " has "
                            + y[i][j].length + " trials, not " + r);
                }
                for (int k = 0; k < r; k++) {
                    if (!Double.isFinite(y[i][j][k])) {
                        throw new IllegalArgumentException("part " + (i + 1) + ", appraiser " + (j + 1) + ", trial "
                                + (k + 1) + " is not a number");
                    }
                    cellMean[i][j] += y[i][j][k] / r;
                }
                partMean[i] += cellMean[i][j] / a;
                apprMean[j] += cellMean[i][j] / p;
                grand += cellMean[i][j] / (p * a);
            }
        }
        double ssP = 0;
        double ssA = 0;
        double ssPA = 0;
        double ssE = 0;
        for (int i = 0; i < p; i++) {
            ssP += a * r * sq(partMean[i] - grand);
        }
        for (int j = 0; j < a; j++) {
            ssA += p * r * sq(apprMean[j] - grand);
        }
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < a; j++) {
                ssPA += r * sq(cellMean[i][j] - partMean[i] - apprMean[j] + grand);
                for (int k = 0; k < r; k++) {
                    ssE += sq(y[i][j][k] - cellMean[i][j]);
                }
            }
        }
        int dfP = p - 1;
        int dfA = a - 1;
        int dfPA = dfP * dfA;
        int dfE = p * a * (r - 1);
        double msP = ssP / dfP;
        double msA = ssA / dfA;
        double msPA = ssPA / dfPA;
        double msE = ssE / dfE;
        double fPA = msPA / msE;
        double pPA = upperTail(fPA, dfPA, dfE);
        if (pPA > POOL_ABOVE) {
            // additive model: interaction and error pooled
            int dfPool = dfPA + dfE;
            double msPool = (ssPA + ssE) / dfPool;
            List<Row> table = List.of(
                    row("part", dfP, ssP, msPool, dfPool),
                    row("appraiser", dfA, ssA, msPool, dfPool),
                    new Row("repeatability (interaction pooled)", dfPool, ssPA + ssE, msPool, Double.NaN, Double.NaN),
                    new Row("total", p * a * r - 1, ssP + ssA + ssPA + ssE, Double.NaN, Double.NaN, Double.NaN));
            return new Result(table, true, msPool, Math.max(0, (msA - msPool) / (p * r)), 0,
                    Math.max(0, (msP - msPool) / (a * r)), tolerance);
        }
        List<Row> table = List.of(
                row("part", dfP, ssP, msPA, dfPA),
                row("appraiser", dfA, ssA, msPA, dfPA),
                new Row("part x appraiser", dfPA, ssPA, msPA, fPA, pPA),
                new Row("repeatability", dfE, ssE, msE, Double.NaN, Double.NaN),
                new Row("total", p * a * r - 1, ssP + ssA + ssPA + ssE, Double.NaN, Double.NaN, Double.NaN));
        return new Result(table, false, msE, Math.max(0, (msA - msPA) / (p * r)), Math.max(0, (msPA - msE) / r),
                Math.max(0, (msP - msPA) / (a * r)), tolerance);
    }

    /** A factor's row, tested against the mean square {@code against} with its degrees of freedom. */
    private static Row row(String source, int df, double ss, double against, int dfAgainst) {
        double ms = ss / df;
        double f = ms / against;
        return new Row(source, df, ss, ms, f, upperTail(f, df, dfAgainst));
    }

    private static double upperTail(double f, int df1, int df2) {
        if (!Double.isFinite(f)) {
            return f > 0 ? 0 : Double.NaN;
        }
        return 1 - new FDistribution(null, df1, df2).cumulativeProbability(f);
    }

    private static double sq(double x) {
        return x * x;
    }
}
