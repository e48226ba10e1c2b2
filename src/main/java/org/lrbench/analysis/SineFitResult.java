package org.lrbench.analysis;

/**
 * A three-parameter sine fit: {@code y = A cos(w t) + B sin(w t) + C}, with the residual RMS and
 * the covariance of A and B from the least-squares normal matrix scaled by the residual variance.
 */
public record SineFitResult(double frequencyHz, double cosineCoefficient, double sineCoefficient, double offset,
                            double residualRms, double varianceCosine, double varianceSine,
                            double covarianceCosineSine, int samples) {

    /** Peak amplitude sqrt(A^2 + B^2). */
    public double amplitude() {
        return Math.hypot(cosineCoefficient, sineCoefficient);
    }

    /** Phase of the cosine form, {@code y = amplitude cos(w t + phase) + C}: atan2(-B, A). */
    public double phase() {
        return Math.atan2(-sineCoefficient, cosineCoefficient);
    }

    /** Mean variance of one phasor component, for propagation. */
    public double componentVariance() {
        return 0.5 * (varianceCosine + varianceSine);
    }
}
