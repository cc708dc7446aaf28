package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.longrun.LongRunEstimate;

/**
 * Everything one GMM estimation produced. Immutable: matrices are copied in and out.
 *
 * @param method            the estimator used
 * @param parameters        estimates with standard errors, in the model's parameter order
 * @param covariance        the P x P covariance of θ̂ (already divided by T)
 * @param observations      T
 * @param momentCount       K
 * @param objective         T g' W g at the estimate with the weight used in the last step (for the
 *                          continuously-updated estimator, T g' S(θ̂)^{-1} g)
 * @param overidentification the test of the overidentifying restrictions: Hansen's J for the efficient
 *                          estimators, the joint pricing-error test for one-step (whose J is not chi-square)
 * @param pricingErrors     one row per moment, with standard errors from Var(g_T)
 * @param pricingErrorsJoint g' Var(g)^+ g with K - P degrees of freedom
 * @param longRun           the S used for the reported standard errors (at the final estimate)
 * @param solverIterations  iterations of the last minimisation (0 for a closed form)
 * @param warnings          everything a reader must see beside the numbers; those that disqualify the
 *                          estimate start with {@link GmmEstimator#NOT_CLEAN}
 * @param weight            the K x K weight of the last step (S^{-1} at the estimate for the
 *                          continuously-updated estimator; a'a for a fixed selection a, whose T g'a'a g is
 *                          zero at the estimate)
 * @param diagnostics       condition numbers, sizes, iterations, convergence, bounds hit
 * @param hjDistance        the Hansen-Jagannathan distance, or null when it could not be computed
 *                          (the reason is in the warnings)
 * @param confidenceLevel   the level of {@link #confidenceIntervals()}
 * @param firstStep         for a two-step fit with everything computed, its first step (what Windmeijer's
 *                          correction needs); null otherwise
 */
public record GmmFit(
        EstimationMethod method,
        List<ParameterEstimate> parameters,
        DMatrixRMaj covariance,
        int observations,
        int momentCount,
        double objective,
        ChiSquareTest overidentification,
        List<PricingError> pricingErrors,
        ChiSquareTest pricingErrorsJoint,
        LongRunEstimate longRun,
        int solverIterations,
        List<String> warnings,
        DMatrixRMaj weight,
        GmmDiagnostics diagnostics,
        HjDistance hjDistance,
        double confidenceLevel,
        FirstStep firstStep) {

    public GmmFit {
        parameters = List.copyOf(parameters);
        pricingErrors = List.copyOf(pricingErrors);
        warnings = List.copyOf(warnings);
        covariance = covariance.copy();
        weight = weight.copy();
    }

    @Override
    public DMatrixRMaj covariance() {
        return covariance.copy();
    }

    @Override
    public DMatrixRMaj weight() {
        return weight.copy();
    }

    /** The first step of a two-step fit, when the estimator kept it ({@link GmmEstimator.Detail#FULL}). */
    public Optional<FirstStep> firstStepKept() {
        return Optional.ofNullable(firstStep);
    }

    /** The Hansen-Jagannathan distance when it was computed. */
    public Optional<HjDistance> hj() {
        return Optional.ofNullable(hjDistance);
    }

    /** The point estimate θ̂ in parameter order. */
    public double[] estimates() {
        return parameters.stream().mapToDouble(ParameterEstimate::estimate).toArray();
    }

    /** Parameter names in order. */
    public List<String> parameterNames() {
        return parameters.stream().map(ParameterEstimate::name).toList();
    }

    /** The estimate of the named parameter; IllegalArgumentException naming the known ones. */
    public ParameterEstimate parameter(String name) {
        return parameters.stream().filter(p -> p.name().equals(name)).findFirst()
                .orElseThrow(() -> new IllegalArgumentException("no parameter \"" + name + "\"; the fit has "
                        + parameters.stream().map(ParameterEstimate::name).toList()));
    }

    /** Degrees of freedom K - P of the overidentifying restrictions. */
    public int overidentifyingRestrictions() {
        return momentCount - parameters.size();
    }

    /** Intervals θ̂_p ± z se_p at {@link #confidenceLevel()}. */
    public List<ConfidenceInterval> confidenceIntervals() {
        return confidenceIntervals(confidenceLevel);
    }

    /**
     * Intervals θ̂_p ± z_{(1+level)/2} se_p (Hansen 1982, Theorem 3.1: θ̂ is asymptotically normal).
     *
     * @param level in (0, 1), e.g. 0.95
     */
    public List<ConfidenceInterval> confidenceIntervals(double level) {
        if (!(level > 0.0 && level < 1.0)) {
            throw new IllegalArgumentException("confidence level must lie strictly between 0 and 1, got " + level);
        }
        double z = GmmEstimator.normalQuantile(0.5 + 0.5 * level);
        List<ConfidenceInterval> out = new ArrayList<>(parameters.size());
        for (ParameterEstimate p : parameters) {
            out.add(new ConfidenceInterval(p.name(), p.estimate(), p.estimate() - z * p.stdError(),
                    p.estimate() + z * p.stdError(), level));
        }
        return out;
    }

    /**
     * The Wald test of linear restrictions written as text, e.g. "b_SIZE = 0, b_TIDE = 0" or
     * "b_MKT - b_SIZE = 0" (syntax: {@link LinearRestrictions#parse(String, List)}).
     *
     * @throws IllegalArgumentException for text that does not parse, with the position
     */
    public ChiSquareTest waldTest(String restrictions) {
        return LinearRestrictions.parse(restrictions, parameterNames()).waldTest(estimates(), covariance);
    }
}
