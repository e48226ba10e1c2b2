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

    /** The same fit with its sine multiplied by {@code k} (a gain correction): variances by k^2. */
    public SineFitResult scaled(double k) {
        return new SineFitResult(frequencyHz, k * cosineCoefficient, k * sineCoefficient, offset, residualRms,
                k * k * varianceCosine, k * k * varianceSine, k * k * covarianceCosineSine, samples);
    }

    /** This fit's sine plus {@code k} times another's (same frequency), with this fit's variances. */
    public SineFitResult plus(SineFitResult other, double k) {
        return new SineFitResult(frequencyHz, cosineCoefficient + k * other.cosineCoefficient,
                sineCoefficient + k * other.sineCoefficient, offset + k * other.offset, residualRms,
                varianceCosine, varianceSine, covarianceCosineSine, samples);
    }
}
