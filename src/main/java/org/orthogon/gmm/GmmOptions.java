package org.orthogon.gmm;

import java.util.Objects;
import org.orthogon.longrun.LongRunOptions;

/**
 * Estimation choices of one GMM run.
 *
 * @param method   one-step (identity weight) or two-step
 * @param longRun  how S, the long-run covariance of the moments, is estimated
 */
public record GmmOptions(EstimationMethod method, LongRunOptions longRun) {
    public GmmOptions {
        Objects.requireNonNull(method, "method");
        Objects.requireNonNull(longRun, "longRun");
    }
}
