/**
 * GMM estimation and inference for asset-pricing moment conditions (Hansen 1982; docs/methods.md).
 *
 * <p>{@link org.orthogon.gmm.GmmEstimator#estimate} runs one-step (fixed weight: identity, inverse
 * second-moment matrix, user diagonal), two-step, iterated or continuously-updated GMM on a
 * {@link org.orthogon.moments.MomentModel} and returns a {@link org.orthogon.gmm.GmmFit}: estimates with
 * standard errors and confidence intervals, the J test, pricing errors, the Hansen-Jagannathan distance,
 * diagnostics and warnings. {@link org.orthogon.gmm.LinearRestrictions} (Wald tests written as text),
 * {@link org.orthogon.gmm.DeltaMethod} and {@link org.orthogon.gmm.RiskPremia} work on a fit.
 *
 * <p>An estimate is never silently unclean: a failed solver, a singular S, G or D'WD raise
 * {@link org.orthogon.gmm.EstimationException}; a parameter on its bound or iterated GMM at its cap leave
 * a warning starting with {@link org.orthogon.gmm.GmmEstimator#NOT_CLEAN} and
 * {@link org.orthogon.gmm.GmmDiagnostics#clean()} false. Pure numerics: no files, no printing.
 */
package org.orthogon.gmm;
