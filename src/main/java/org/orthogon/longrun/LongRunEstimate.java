package org.orthogon.longrun;

import java.util.List;
import java.util.Objects;
import org.ejml.data.DMatrixRMaj;

/**
 * A long-run covariance estimate and the choices that produced it. Immutable: the matrix is
 * copied on the way in and on every read.
 *
 * @param covariance S, K x K, symmetric
 * @param kernel the kernel used
 * @param bandwidth the bandwidth b actually used (0 for {@link Kernel#NONE})
 * @param centered whether column means were removed
 * @param prewhitened whether VAR(1) prewhitening was applied
 * @param warnings conditions a user should know about (empty when none)
 */
public record LongRunEstimate(DMatrixRMaj covariance, Kernel kernel, double bandwidth, boolean centered,
        boolean prewhitened, List<String> warnings) {

    public LongRunEstimate {
        covariance = Objects.requireNonNull(covariance, "covariance").copy();
        Objects.requireNonNull(kernel, "kernel");
        warnings = List.copyOf(warnings);
    }

    /** A copy of S, so callers cannot change this estimate. */
    @Override
    public DMatrixRMaj covariance() {
        return covariance.copy();
    }
}
