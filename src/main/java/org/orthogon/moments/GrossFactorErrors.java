package org.orthogon.moments;

import java.util.List;

/**
 * A linear SDF on gross returns, m_t = a - b'F_t, with the risk-free asset among the priced assets:
 * e_{t,i}(a, b) = (a - b'F_t) R_{t,i} - 1 (Cochrane 2005, "Asset Pricing", revised edition, section
 * 13.2; cited from memory). Pricing the risk-free rate as well is what pins down the mean of the SDF,
 * E[m] = 1/R_f, which excess returns alone leave free; the constructor therefore takes the risk-free
 * rate separately and appends it as the last asset, so it cannot be forgotten.
 *
 * <p>Affine in θ = (a, b): ∂e_i/∂a = R_i and ∂e_i/∂b_k = -F_k R_i, so {@link #isLinear()} is true and
 * the closed-form GMM estimate θ = -(D'WD)^{-1} D'W g_T(0) applies.
 */
public final class GrossFactorErrors extends SdfErrors {
    private final double[][] factors;

    /**
     * @param grossReturns   T x N gross returns of the test assets
     * @param riskfreeGross  T gross risk-free rates, known at the start of each period
     * @param factors        T x K factors
     * @param assetNames     N asset names
     * @param riskfreeName   the name of the risk-free asset's moment
     * @param factorNames    K names; the parameters are a, then b_&lt;factor&gt;
     */
    public GrossFactorErrors(double[][] grossReturns, double[] riskfreeGross, double[][] factors,
            List<String> assetNames, String riskfreeName, List<String> factorNames) {
        super(MomentAlgebra.concat(List.of("a"), MomentAlgebra.prefixed("b_", factorNames)),
                MomentAlgebra.concat(assetNames, List.of(riskfreeName)),
                withRiskfree(grossReturns, riskfreeGross, assetNames, riskfreeName), Payoff.GROSS, List.of());
        MomentAlgebra.requireRows(grossReturns.length, factors.length, "returns", "factors");
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
    }

    private GrossFactorErrors(GrossFactorErrors source, int[] rows) {
        super(source, rows);
        this.factors = pick(source.factors, rows);
    }

    /** The test assets' gross returns with the risk-free rate appended as the last priced asset. */
    private static double[][] withRiskfree(double[][] grossReturns, double[] riskfreeGross, List<String> assetNames,
            String riskfreeName) {
        MomentAlgebra.requireRows(grossReturns.length, riskfreeGross.length, "returns", "risk-free rates");
        if (assetNames.contains(riskfreeName)) {
            throw new IllegalArgumentException("the risk-free asset " + riskfreeName
                    + " is also among the test assets; it is added once, automatically");
        }
        int n = assetNames.size();
        double[][] assets = MomentAlgebra.copyRows(grossReturns, n, "return");
        double[][] rows = new double[assets.length][];
        for (int t = 0; t < assets.length; t++) {
            double[] row = java.util.Arrays.copyOf(assets[t], n + 1);
            row[n] = riskfreeGross[t];
            rows[t] = row;
        }
        return rows;
    }

    @Override
    protected GrossFactorErrors onRows(int[] rows) {
        return new GrossFactorErrors(this, rows);
    }

    @Override
    protected void sdf(double[] theta, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            double sdf = theta[0];
            for (int k = 0; k < factors[t].length; k++) {
                sdf -= theta[k + 1] * factors[t][k];
            }
            out[t] = sdf;
        }
    }

    @Override
    protected void sdfGradient(double[] theta, double[][] out) {
        for (int t = 0; t < factors.length; t++) {
            out[0][t] = 1.0;
            for (int k = 0; k < factors[t].length; k++) {
                out[k + 1][t] = -factors[t][k];
            }
        }
    }

    @Override
    public boolean isLinear() {
        return true;
    }
}
