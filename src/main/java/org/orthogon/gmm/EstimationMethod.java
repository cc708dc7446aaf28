package org.orthogon.gmm;

import java.util.Arrays;
import java.util.stream.Collectors;

/** How the weighting matrix is chosen (Hansen 1982; Hansen, Heaton and Yaron 1996). */
public enum EstimationMethod {
    /** A fixed weight (identity, second-moment or a user diagonal): consistent, not efficient; sandwich covariance. */
    ONE_STEP("one-step"),
    /** Hansen (1982): first step with the initial weight, second with W = S(θ1)^{-1}. */
    TWO_STEP("two-step"),
    /**
     * Hansen, Heaton and Yaron (1996, Journal of Business and Economic Statistics 14): W = S(θ_i)^{-1},
     * θ_{i+1} = argmin T g' W g, repeated until max|Δθ| is below the tolerance or the cap is reached.
     */
    ITERATED("iterated"),
    /** Hansen, Heaton and Yaron (1996): θ̂ = argmin T g(θ)' S(θ)^{-1} g(θ), S re-estimated at every θ. */
    CONTINUOUSLY_UPDATED("continuously-updated");

    private final String id;

    EstimationMethod(String id) {
        this.id = id;
    }

    /** The spelling used in model files, on the command line and in JSON. */
    public String id() {
        return id;
    }

    /** True for the estimators whose final weight is S^{-1}, so that J is chi-square and V = (D'S^{-1}D)^{-1}/T. */
    public boolean isEfficient() {
        return this != ONE_STEP;
    }

    /** Looks a method up by its {@link #id()}; the message lists the valid spellings. */
    public static EstimationMethod fromId(String id) {
        for (EstimationMethod method : values()) {
            if (method.id.equals(id)) {
                return method;
            }
        }
        throw new IllegalArgumentException("unknown estimation method \"" + id + "\"; use one of "
                + Arrays.stream(values()).map(EstimationMethod::id).collect(Collectors.joining(", ")));
    }
}
