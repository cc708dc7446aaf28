package org.orthogon.twopass;

import java.util.List;
import org.ejml.data.DMatrixRMaj;

/**
 * The second pass: mean excess returns regressed across assets on the full-sample betas.
 *
 * @param weighting          OLS or GLS
 * @param intercept          true when a zero-beta excess return γ_0 is estimated beside the premia
 * @param names              "intercept" (when estimated) then the factor names, in the order of the estimates
 * @param estimates          γ̂ = (X'WX)^{-1} X'W R̄, X = [1_N, β] (or β), equal to the mean of the
 *                           period-by-period estimates γ̂_t = (X'WX)^{-1} X'W R_t
 * @param famaMacBeth        Σ_t (γ̂_t - γ̂)(γ̂_t - γ̂)'/T² (Fama and MacBeth 1973)
 * @param shanken            (1 + λ̂'Ω̂^{-1}λ̂) times the Fama-MacBeth covariance plus Ω̂/T on the factor block
 *                           (Shanken 1992)
 * @param robust             Σ_t ĥ_t ĥ_t'/T², the misspecification-robust covariance of Kan, Robotti and
 *                           Shanken (2013)
 * @param r2                 ρ̂² = 1 - Q̂/Q̂_0
 * @param r2StdError         sqrt(Σ_t n̂_t²)/T, valid when 0 &lt; ρ² &lt; 1 (KRS 2013)
 * @param assets             N names
 * @param realised           R̄, the mean excess returns
 * @param predicted          X γ̂
 */
public record CrossSectionEstimate(Weighting weighting, boolean intercept, List<String> names, double[] estimates,
        DMatrixRMaj famaMacBeth, DMatrixRMaj shanken, DMatrixRMaj robust, double r2, double r2StdError,
        List<String> assets, double[] realised, double[] predicted) {

    /** The name of the zero-beta rate among {@link #names()}. */
    public static final String INTERCEPT = "intercept";

    public CrossSectionEstimate {
        names = List.copyOf(names);
        estimates = estimates.clone();
        famaMacBeth = famaMacBeth.copy();
        shanken = shanken.copy();
        robust = robust.copy();
        assets = List.copyOf(assets);
        realised = realised.clone();
        predicted = predicted.clone();
    }

    /** One estimate with its three standard errors. */
    public record Coefficient(String name, double estimate, double stdErrorFamaMacBeth, double stdErrorShanken,
            double stdErrorRobust) {
    }

    /** Every coefficient, the intercept first when there is one. */
    public List<Coefficient> coefficients() {
        double[] fm = Dense.standardErrors(famaMacBeth);
        double[] sh = Dense.standardErrors(shanken);
        double[] rb = Dense.standardErrors(robust);
        java.util.ArrayList<Coefficient> out = new java.util.ArrayList<>();
        for (int j = 0; j < names.size(); j++) {
            out.add(new Coefficient(names.get(j), estimates[j], fm[j], sh[j], rb[j]));
        }
        return List.copyOf(out);
    }

    /** The risk premia λ̂ (the coefficients after the intercept). */
    public List<Coefficient> riskPremia() {
        List<Coefficient> all = coefficients();
        return intercept ? all.subList(1, all.size()) : all;
    }

    /** R̄_i - (Xγ̂)_i, the pricing error of each asset. */
    public double[] pricingErrors() {
        double[] out = new double[realised.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = realised[i] - predicted[i];
        }
        return out;
    }

    @Override
    public double[] estimates() {
        return estimates.clone();
    }

    @Override
    public DMatrixRMaj famaMacBeth() {
        return famaMacBeth.copy();
    }

    @Override
    public DMatrixRMaj shanken() {
        return shanken.copy();
    }

    @Override
    public DMatrixRMaj robust() {
        return robust.copy();
    }

    @Override
    public double[] realised() {
        return realised.clone();
    }

    @Override
    public double[] predicted() {
        return predicted.clone();
    }
}
