package org.lrbench.analysis.fit;

/** A model for least squares: predicted values of all observations and their Jacobian. */
public interface FitModel {

    /** Predicted value of each observation at parameters {@code p}. */
    double[] values(double[] p);

    /** d value_i / d p_j at {@code p}; rows are observations. */
    double[][] jacobian(double[] p);
}
