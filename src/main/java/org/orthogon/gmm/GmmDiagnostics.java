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
 * @param smallestSingularValue the smallest singular value of Ŝ^{-1/2}D with its columns scaled to unit length
 *                             (in [0, 1]; NaN until {@link IdentificationDiagnostics} has assessed the fit)
 * @param identificationProblems what disqualifies the estimate as identified: parameters outside their
 *                             economic range, a Jacobian of nearly deficient rank
 */
public record GmmDiagnostics(double conditionS, double conditionDWD, int moments, int observations, int parameters,
        int solverIterations, int weightUpdates, boolean converged, List<String> parametersAtBounds,
        double smallestSingularValue, List<String> identificationProblems) {
    public GmmDiagnostics {
        parametersAtBounds = List.copyOf(parametersAtBounds);
        identificationProblems = List.copyOf(identificationProblems);
    }

    /** Diagnostics before the identification assessment. */
    public GmmDiagnostics(double conditionS, double conditionDWD, int moments, int observations, int parameters,
            int solverIterations, int weightUpdates, boolean converged, List<String> parametersAtBounds) {
        this(conditionS, conditionDWD, moments, observations, parameters, solverIterations, weightUpdates, converged,
                parametersAtBounds, Double.NaN, List.of());
    }

    /** True when nothing disqualifies the estimate as an interior, converged, identified optimum. */
    public boolean clean() {
        return converged && parametersAtBounds.isEmpty() && identificationProblems.isEmpty();
    }

    /** The same diagnostics with the identification assessment. */
    public GmmDiagnostics withIdentification(double singularValue, List<String> problems) {
        return new GmmDiagnostics(conditionS, conditionDWD, moments, observations, parameters, solverIterations,
                weightUpdates, converged, parametersAtBounds, singularValue, problems);
    }
}
