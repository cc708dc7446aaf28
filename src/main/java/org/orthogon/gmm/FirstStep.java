package org.orthogon.gmm;

import java.util.Objects;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.longrun.LongRunEstimate;

/**
 * What the first step of a two-step fit leaves for Windmeijer's (2005) finite-sample correction
 * ({@link WindmeijerCorrection}): the first-step estimate θ̂1, the long-run covariance S(θ̂1) with the
 * bandwidth selected there, and the weight W2 = S(θ̂1)^{-1} that the second step minimised with, exactly
 * as the estimator formed them (before any small-sample factor). Keeping them spares the correction a
 * second first step, a second S and a second K x K inversion. Immutable: arrays are copied in and out.
 *
 * @param estimate θ̂1
 * @param longRun  S(θ̂1)
 * @param weight   W2 = S(θ̂1)^{-1}
 */
public record FirstStep(double[] estimate, LongRunEstimate longRun, DMatrixRMaj weight) {
    public FirstStep {
        estimate = estimate.clone();
        Objects.requireNonNull(longRun, "longRun");
        weight = weight.copy();
    }

    @Override
    public double[] estimate() {
        return estimate.clone();
    }

    @Override
    public DMatrixRMaj weight() {
        return weight.copy();
    }
}
