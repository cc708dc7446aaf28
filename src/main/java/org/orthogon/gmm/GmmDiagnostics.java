package org.orthogon.gmm;

import java.util.List;

/**
 * How trustworthy the numbers of one fit are.
 *
 * @param conditionS           condition number of S at the estimate, after scaling S to a unit diagonal so
 *                             that the units of the moments do not enter
 * @param conditionDWD         condition number of D'WD (of D itself when K = P), scaled the same way;
 *                             very large means the parameters are close to unidentified
 * @param moments              K
 * @param observations         T
 * @param parameters           P
 * @param solverIterations     solver iterations of the last minimisation (0 for a closed form)
 * @param weightUpdates        how many times W was re-estimated: 0 one-step, 1 two-step, the count for
 *                             iterated GMM, 0 for the continuously-updated estimator (S moves with θ)
 * @param converged            the last minimisation met its first-order condition and, for iterated GMM,
 *                             the iterations met their tolerance
 * @param parametersAtBounds   parameters that ended on a bound, described
 */
public record GmmDiagnostics(double conditionS, double conditionDWD, int moments, int observations, int parameters,
        int solverIterations, int weightUpdates, boolean converged, List<String> parametersAtBounds) {
    public GmmDiagnostics {
        parametersAtBounds = List.copyOf(parametersAtBounds);
    }

    /** True when nothing disqualifies the estimate as an interior, converged optimum. */
    public boolean clean() {
        return converged && parametersAtBounds.isEmpty();
    }
}
