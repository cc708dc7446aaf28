package org.orthogon.moments;

import java.util.List;

/**
 * A linear SDF in demeaned factors with the factor means estimated jointly:
 * <pre>
 *   m_t = 1 - b'(F_t - μ)
 *   e_{t,i} = R^e_{t,i} (1 - b'(F_t - μ))   for each asset i = 1..N
 *   e_{t,N+k} = F_{t,k} - μ_k              for each factor k = 1..K
 * </pre>
 * Stacking the mean equations makes the standard errors of b account for μ being estimated
 * (Cochrane 2005, "Asset Pricing", revised edition, section 13.4; cited from memory). With demeaned
 * factors E[m] = 1 and the pricing equation reads E[R^e] = Cov(R^e, F') b, so b are prices of
 * covariance risk that do not depend on the factor means (same reference).
 *
 * <p>The errors are not affine in θ = (b, μ): b'μ is a product of parameters, so {@link #isLinear()}
 * is false. Derivatives: ∂e_i/∂b_k = -R^e_i (F_k - μ_k); ∂e_i/∂μ_k = R^e_i b_k; ∂e_{N+k}/∂μ_j = -δ_{kj};
 * ∂e_{N+k}/∂b = 0.
 *
 * <p>Parameters are b_&lt;factor&gt; then mu_&lt;factor&gt;. The asset moments come first, then one
 * moment per factor named mean_&lt;factor&gt;. Those mean moments price no payoff; {@link #payoffs}
 * reports F_k for them (e = 1·F_k - μ_k), so the Hansen-Jagannathan distance is taken over the first
 * {@link #pricingMoments()} moments only, with μ = f̄ ({@link #distanceErrors()}).
 */
public final class DemeanedFactorErrors extends SdfErrors {
    private final double[][] factors; // [t][k]
    private final int factorCount;

    /**
     * @param excessReturns T x N excess returns
     * @param factors       T x K factors on the same dates
     * @param assetNames    N names
     * @param factorNames   K names
     */
    public DemeanedFactorErrors(double[][] excessReturns, double[][] factors, List<String> assetNames,
            List<String> factorNames) {
        super(MomentAlgebra.concat(MomentAlgebra.prefixed("b_", factorNames), MomentAlgebra.prefixed("mu_", factorNames)),
                assetNames, excessReturns, Payoff.EXCESS, MomentAlgebra.prefixed("mean_", factorNames));
        MomentAlgebra.requireRows(excessReturns.length, factors.length, "returns", "factors");
        this.factorCount = factorNames.size();
        this.factors = MomentAlgebra.copyRows(factors, factorCount, "factor");
    }

    private DemeanedFactorErrors(DemeanedFactorErrors source, int[] rows) {
        super(source, rows);
        this.factorCount = source.factorCount;
        this.factors = pick(source.factors, rows);
    }

    @Override
    protected DemeanedFactorErrors onRows(int[] rows) {
        return new DemeanedFactorErrors(this, rows);
    }

    /** The number N of moments that price assets; the K factor-mean moments follow them. */
    public int pricingMoments() {
        return pricedAssets();
    }

    /** Sample factor means, the exactly identified estimate of μ and a natural start value. */
    public double[] sampleFactorMeans() {
        double[] mean = new double[factorCount];
        for (double[] f : factors) {
            for (int k = 0; k < factorCount; k++) {
                mean[k] += f[k] / factors.length;
            }
        }
        return mean;
    }

    @Override
    protected void sdf(double[] theta, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            double sdf = 1.0;
            for (int k = 0; k < factorCount; k++) {
                sdf -= theta[k] * (factors[t][k] - theta[factorCount + k]);
            }
            out[t] = sdf;
        }
    }

    /** The N asset errors at μ = f̄, the moment set of this form's Hansen-Jagannathan distance. */
    @Override
    public java.util.Optional<ObservationErrors> distanceErrors() {
        return java.util.Optional.of(new DemeanedPricingErrors(pricedPayoffRows(), factors,
                assetNames().subList(0, pricedAssets()), factorNames()));
    }

    private List<String> factorNames() {
        return parameterNames().subList(0, factorCount).stream().map(name -> name.substring(2)).toList();
    }

    @Override
    protected void sdfGradient(double[] theta, double[][] out) {
        for (int t = 0; t < factors.length; t++) {
            for (int k = 0; k < factorCount; k++) {
                out[k][t] = -(factors[t][k] - theta[factorCount + k]);
                out[factorCount + k][t] = theta[k];
            }
        }
    }

    @Override
    protected void auxiliaryErrors(double[] theta, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            for (int k = 0; k < factorCount; k++) {
                out[t * factorCount + k] = factors[t][k] - theta[factorCount + k];
            }
        }
    }

    @Override
    protected void auxiliaryDerivatives(double[] theta, double[][] out) {
        for (int t = 0; t < factors.length; t++) {
            for (int k = 0; k < factorCount; k++) {
                out[factorCount + k][t * factorCount + k] = -1.0;
            }
        }
    }

    @Override
    protected void auxiliaryPayoffs(double[] out) {
        for (int t = 0; t < factors.length; t++) {
            System.arraycopy(factors[t], 0, out, t * factorCount, factorCount);
        }
    }

    @Override
    public boolean isLinear() {
        return false;
    }
}
