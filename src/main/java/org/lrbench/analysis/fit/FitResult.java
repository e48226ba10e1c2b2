package org.lrbench.analysis.fit;

/**
 * A least-squares result: parameters, the covariance {@code (J' W J)^-1} that the weights imply,
 * the weighted residual sum of squares and its degrees of freedom. Two standard uncertainties follow
 * from it: {@link #weightUncertainty(int)} trusts the weights as the observations' variances
 * (GUM type A with known variances); {@link #scatterUncertainty(int)} scales them by the residual
 * variance chi^2 / dof, which is how NIST's StRD certifies its standard deviations.
 */
public record FitResult(double[] parameters, double[][] covariance, double chiSquare, int degreesOfFreedom,
                        int evaluations) {

    public double reducedChiSquare() {
        return degreesOfFreedom > 0 ? chiSquare / degreesOfFreedom : Double.NaN;
    }

    public double weightUncertainty(int i) {
        return Math.sqrt(covariance[i][i]);
    }

    public double scatterUncertainty(int i) {
        return Math.sqrt(covariance[i][i] * reducedChiSquare());
    }

    /** Correlation coefficient of parameters i and j. */
    public double correlation(int i, int j) {
        return covariance[i][j] / Math.sqrt(covariance[i][i] * covariance[j][j]);
    }
}
