package org.orthogon.moments;

import java.util.List;

/**
 * The unscaled pricing errors of one model family, observation by observation: e_t(θ), one column per
 * test asset, and their derivatives ∂e_t/∂θ_p. {@link ScaledMoments} turns them into GMM moments,
 * multiplying by instruments when there are any, so each family writes its economics once. Families
 * whose errors come from a stochastic discount factor extend {@link SdfErrors}, which derives all of
 * this from m_t(θ) and its gradient.
 */
public interface ObservationErrors {

    List<String> parameterNames();

    /** Names of the N assets whose errors this family produces. */
    List<String> assetNames();

    int observations();

    /** Fills {@code out} (T x N, row-major, length T*N) with e_t(θ). */
    void errors(double[] theta, double[] out);

    /**
     * Fills {@code out[p]} (each T x N, row-major) with ∂e_t/∂θ_p. Called only for non-linear work and
     * for standard errors, so clarity wins over speed here.
     */
    void errorDerivatives(double[] theta, double[][] out);

    /**
     * Fills {@code out} (T x N, row-major) with the payoff x_{t,i} that error i prices: the errors have
     * the form e_t = m_t(θ) x_t - p, with p = 1 for gross returns and p = 0 for excess returns. The
     * Hansen-Jagannathan distance weights errors by the inverse of E[x x'] (Hansen and Jagannathan
     * 1997, Journal of Finance 52).
     */
    void payoffs(double[] out);

    /**
     * Fills {@code out} (length T) with the stochastic discount factor m_t(θ); errors that come from no
     * SDF (the beta-pricing system) throw {@link UnsupportedOperationException}, as they do for
     * {@link #payoffs}, and say so with an empty {@link #distanceErrors()}.
     */
    void discountFactor(double[] theta, double[] out);

    /**
     * How many of the {@link #assetNames()} are pricing errors of test assets; they come first. Families
     * that stack auxiliary moments after them (the factor means of the demeaned linear SDF) report fewer
     * than all, so cross-sectional fit statistics use only the assets.
     */
    default int pricedAssets() {
        return assetNames().size();
    }

    /** True when e_t(θ) is affine in θ. */
    boolean isLinear();

    /**
     * The same errors on the observations {@code rows}, in the given order, repeats allowed (a
     * subsample, a window, or a bootstrap resample). Only the selected rows are copied, so the cost is
     * proportional to {@code rows.length}, not to the full sample.
     *
     * @throws IllegalArgumentException if a row is outside 0..T-1 or no row is given
     */
    ObservationErrors select(int[] rows);

    /**
     * The errors over which the Hansen-Jagannathan distance is taken: these errors (the default), a
     * family's own choice (the demeaned linear SDF prices its N assets with μ = f̄, leaving out the
     * factor-mean moments), or none for moments that price no payoff with an SDF. Their parameters are
     * a subset of {@link #parameterNames()}, by name.
     */
    default java.util.Optional<ObservationErrors> distanceErrors() {
        return java.util.Optional.of(this);
    }

    /**
     * The selection a_T when these errors are estimated by setting fixed combinations of their means to
     * zero ({@link FixedSelection}) rather than by minimising a quadratic form; empty for every SDF family.
     */
    default java.util.Optional<FixedSelection> fixedSelection() {
        return java.util.Optional.empty();
    }
}
