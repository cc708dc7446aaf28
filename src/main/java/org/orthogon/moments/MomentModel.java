package org.orthogon.moments;

import java.util.List;
import org.ejml.data.DMatrixRMaj;

/**
 * A set of moment conditions E[f_t(θ)] = 0 evaluated on one aligned sample.
 *
 * <p>Conventions (Hansen 1982; docs/methods.md): the contributions form a T x K matrix F whose row t is
 * f_t(θ)'; the sample mean is g_T(θ) = (1/T) Σ_t f_t(θ); the Jacobian is D = ∂g_T/∂θ', a K x P
 * matrix. Implementations are pure: they never read files or print, and they never mutate the data
 * they were built from.
 */
public interface MomentModel {

    /** Names of the P parameters, in the order of θ. */
    List<String> parameterNames();

    /** Names of the K moments, in the order of the columns of F (for scaled moments "asset*instrument"). */
    List<String> momentNames();

    /** Number of observations T in the aligned sample. */
    int observations();

    /** The T x K matrix of contributions f_t(θ)'. A new matrix on every call. */
    DMatrixRMaj contributions(double[] theta);

    /** The K x P Jacobian D = ∂g_T/∂θ' of the sample mean, analytic. */
    DMatrixRMaj meanJacobian(double[] theta);

    /**
     * True when g_T(θ) is affine in θ, g_T(θ) = g_T(0) + D θ with D constant, so that the GMM
     * estimator has the closed form θ = -(D'WD)^{-1} D'W g_T(0) for every weight W.
     */
    boolean isLinear();

    /**
     * The T x K payoffs x_t priced by the moments (gross or excess returns, times the instruments for
     * scaled moments), so that f_t = m_t x_t - p; G = (1/T) Σ x_t x_t' is the second-moment matrix of
     * the Hansen-Jagannathan distance.
     */
    DMatrixRMaj payoffs();

    /**
     * The same moment conditions on observations [from, to) only (subsample and rolling-window fits),
     * at a cost proportional to the window. Every model built from a family supports it; a hand-made
     * model that cannot be cut says so.
     */
    default MomentModel rows(int from, int to) {
        throw new UnsupportedOperationException(getClass().getSimpleName() + " cannot be cut to a window of rows");
    }

    /**
     * The same moment conditions on the observations {@code rows}, in the given order, repeats allowed
     * (block-bootstrap resamples): row r of the result's contributions is row rows[r] of this model's.
     * Every model built from a family supports it; a hand-made model that cannot be resampled says so.
     */
    default MomentModel select(int[] rows) {
        throw new UnsupportedOperationException(getClass().getSimpleName() + " cannot select rows");
    }

    /**
     * The sample mean of the stochastic discount factor, (1/T) Σ_t m_t(θ). Moments that come from no SDF
     * (a regression written as GMM, say) have none and say so.
     */
    default double meanDiscountFactor(double[] theta) {
        throw new UnsupportedOperationException(getClass().getSimpleName() + " has no stochastic discount factor");
    }

    /**
     * The stochastic discount factor m_t(θ) in each period (T values), for volatility bounds; moments that
     * come from no SDF have none and say so.
     */
    default double[] discountFactors(double[] theta) {
        throw new UnsupportedOperationException(getClass().getSimpleName() + " has no stochastic discount factor");
    }

    /**
     * The moments over which the Hansen-Jagannathan distance is taken, whose parameters are a subset of
     * these by name: these moments by default; the N priced assets alone for the demeaned linear SDF
     * (μ = f̄); empty for moments that price no payoff with an SDF.
     */
    default java.util.Optional<MomentModel> distanceMoments() {
        return java.util.Optional.of(this);
    }

    /** The 1 x K sample mean g_T(θ), as a K x 1 column. */
    default DMatrixRMaj meanMoments(double[] theta) {
        return MomentAlgebra.columnMeans(contributions(theta));
    }

    /** How many of the moments, counted from the first, price test assets (the rest are auxiliary). */
    default int pricingMomentCount() {
        return momentCount();
    }

    /** Number of moments K. */
    default int momentCount() {
        return momentNames().size();
    }

    /** Number of parameters P. */
    default int parameterCount() {
        return parameterNames().size();
    }

    // Repeated fits (subsample windows, bootstrap draws): evaluation without allocation, per-row Jacobians.

    /**
     * The T x K contributions f_t(θ)' written into {@code out}, reshaped to T x K, for inner loops that
     * evaluate many θ. The default copies {@link #contributions(double[])}; models override it to
     * write in place.
     */
    default void contributions(double[] theta, DMatrixRMaj out) {
        DMatrixRMaj f = contributions(theta);
        out.reshape(f.numRows, f.numCols);
        System.arraycopy(f.data, 0, out.data, 0, f.getNumElements());
    }

    /**
     * The Jacobian of every row, ∂f_t(θ)/∂θ': a T x (K·P) matrix whose row t holds the K x P matrix
     * of observation t row-major, so that the mean Jacobian D is the mean of the rows. For a model linear
     * in θ it does not depend on θ and f_t(θ) = f_t(0) + J_t θ, so window means of f_t(0) and J_t, and
     * with them every subsample's closed-form estimate, come from running sums. Finite-sample corrections
     * of the two-step covariance (Windmeijer 2005) and the K statistic (Kleibergen 2005) need these
     * per-observation derivatives too.
     */
    default DMatrixRMaj rowJacobians(double[] theta) {
        throw new UnsupportedOperationException(getClass().getSimpleName() + " has no per-row Jacobians");
    }
}
