package org.lrbench.analysis.fit;

import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresProblem;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.DiagonalMatrix;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.SingularMatrixException;
import org.apache.commons.math3.util.Pair;

/**
 * Weighted nonlinear least squares with Apache Commons Math's Levenberg-Marquardt optimizer, and the
 * parameter covariance from the Jacobian at the optimum. The same covariance serves the uncertainty
 * budget.
 */
public final class LeastSquares {
    static final int MAX_EVALUATIONS = 20_000;

    private LeastSquares() {
    }

    /**
     * @param observed the measured values
     * @param weights  one per observation, normally 1 / u^2
     * @throws FitException when the optimizer does not converge or the covariance is singular
     */
    public static FitResult fit(FitModel model, double[] observed, double[] weights, double[] start) {
        LeastSquaresProblem problem = new LeastSquaresBuilder()
                .start(start)
                .model(point -> {
                    double[] p = point.toArray();
                    return new Pair<>(new ArrayRealVector(model.values(p), false),
                            new Array2DRowRealMatrix(model.jacobian(p), false));
                })
                .target(observed)
                .weight(new DiagonalMatrix(weights))
                .maxEvaluations(MAX_EVALUATIONS)
                .maxIterations(MAX_EVALUATIONS)
                .lazyEvaluation(false)
                .build();
        LeastSquaresOptimizer.Optimum optimum;
        try {
            optimum = new LevenbergMarquardtOptimizer()
                    .withCostRelativeTolerance(1e-14)
                    .withParameterRelativeTolerance(1e-14)
                    .withOrthoTolerance(1e-14)
                    .optimize(problem);
        } catch (RuntimeException e) {
            throw new FitException("least squares did not converge: " + e.getMessage(), e);
        }
        RealMatrix cov;
        try {
            cov = optimum.getCovariances(1e-14);
        } catch (SingularMatrixException e) {
            throw new FitException("the parameters cannot all be identified from these data (singular covariance)", e);
        }
        double cost = optimum.getCost();
        return new FitResult(optimum.getPoint().toArray(), cov.getData(), cost * cost,
                observed.length - start.length, optimum.getEvaluations());
    }
}
