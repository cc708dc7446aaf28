package org.orthogon.moments;

import org.ejml.data.DMatrixRMaj;

/**
 * Moments estimated by setting fixed linear combinations of them to zero, a_T g_T(θ̂) = 0, with a_T a
 * P x K selection matrix the family chooses rather than the D'W of a minimised quadratic form (Hansen
 * 1982, "Large sample properties of generalized method of moments estimators", Econometrica 50,
 * section 3; Cochrane 2005, "Asset Pricing", revised edition, section 11.2). The estimate's covariance
 * is (a D)^{-1} a S a' (a D)^{-1}' / T and that of the sample moments
 * (I - D (a D)^{-1} a) S (I - D (a D)^{-1} a)' / T, with D = ∂g_T/∂θ' and S the long-run covariance of
 * the moments; S enters, its inverse never does, so the selection stands where S is singular.
 *
 * <p>a_T may depend on the estimate (a GLS cross section weights by the estimated residual covariance);
 * it is evaluated at θ̂, which is first-order harmless when the model holds because g(θ_0) = 0 there
 * (Cochrane 2005, section 11.2, on estimated a_T).
 */
public interface FixedSelection {

    /** The selection's name in reports, e.g. "ols" or "gls". */
    String id();

    /** The P x K matrix a_T evaluated at θ. */
    DMatrixRMaj matrix(double[] theta);

    /**
     * The θ̂ with a_T(θ̂) g_T(θ̂) = 0, from the family's closed form.
     *
     * @throws Unsolvable when a matrix the solution inverts is singular on this sample
     */
    double[] solve();

    /**
     * How many of the parameters, counted from the first, carry the model's pricing restriction (the risk
     * premia of the beta-pricing system); the rest are first-pass estimates (time-series intercepts and
     * betas). Tests of parameter stability compare these only.
     */
    int focalParameters();

    /** A sample on which the selected moments have no unique solution (collinear factors or betas). */
    final class Unsolvable extends RuntimeException {
        private static final long serialVersionUID = 1L;
        private final String fix;

        public Unsolvable(String message, String fix) {
            super(message);
            this.fix = fix;
        }

        /** What the user can change. */
        public String fix() {
            return fix;
        }
    }
}
