package org.orthogon.gmm;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.longrun.LongRunEstimate;

/**
 * Everything one GMM estimation produced. Immutable: matrices are copied in and out.
 *
 * @param method            the estimator used
 * @param parameters        estimates with standard errors, in the model's parameter order
 * @param observations      T
 * @param momentCount       K
 * @param objective         T g' W g at the estimate with the weight used in the last step
 * @param overidentification the test of the overidentifying restrictions: Hansen's J for two-step,
 *                          the joint pricing-error test for one-step (whose J is not chi-square)
 * @param pricingErrors     one row per moment, with standard errors from Var(g_T)
 * @param pricingErrorsJoint g' Var(g)^+ g with K - P degrees of freedom
 * @param longRun           the S used for the reported standard errors (at the final estimate)
 * @param solverIterations  iterations of the last minimisation (0 for a closed form)
 * @param warnings          everything a reader must see beside the numbers
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
        List<String> warnings) {

    public GmmFit {
        parameters = List.copyOf(parameters);
        pricingErrors = List.copyOf(pricingErrors);
        warnings = List.copyOf(warnings);
        covariance = covariance.copy();
    }

    @Override
    public DMatrixRMaj covariance() {
        return covariance.copy();
    }

    /** The point estimate θ̂ in parameter order. */
    public double[] estimates() {
        return parameters.stream().mapToDouble(ParameterEstimate::estimate).toArray();
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
}
