package org.orthogon.gmm;

import java.util.Arrays;
import java.util.stream.Collectors;

/** How the weighting matrix is chosen (DESIGN.md section 3). */
public enum EstimationMethod {
    /** A fixed weight (identity): consistent but not efficient; sandwich covariance. */
    ONE_STEP("one-step"),
    /** Hansen (1982): first step with the identity, second with W = S(θ1)^{-1}. */
    TWO_STEP("two-step");

    private final String id;

    EstimationMethod(String id) {
        this.id = id;
    }

    /** The spelling used in model files, on the command line and in JSON. */
    public String id() {
        return id;
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
