package org.lrbench.analysis.fit;

/** Thrown when a least-squares fit cannot give an answer with a meaningful covariance. */
public class FitException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public FitException(String message, Throwable cause) {
        super(message, cause);
    }
}
