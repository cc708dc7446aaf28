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
public final class GrossFactorErrors extends NamedErrors {
    private final double[][] grossReturns; // [t][i], risk-free appended last
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
                MomentAlgebra.concat(assetNames, List.of(riskfreeName)));
        MomentAlgebra.requireRows(grossReturns.length, riskfreeGross.length, "returns", "risk-free rates");
        MomentAlgebra.requireRows(grossReturns.length, factors.length, "returns", "factors");
        if (assetNames.contains(riskfreeName)) {
            throw new IllegalArgumentException("the risk-free asset " + riskfreeName
                    + " is also among the test assets; it is added once, automatically");
        }
        int n = assetNames.size();
        double[][] assets = MomentAlgebra.copyRows(grossReturns, n, "return");
        this.grossReturns = new double[assets.length][n + 1];
        for (int t = 0; t < assets.length; t++) {
            System.arraycopy(assets[t], 0, this.grossReturns[t], 0, n);
            this.grossReturns[t][n] = riskfreeGross[t];
        }
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
    }



    @Override
    public int observations() {
        return grossReturns.length;
    }

    @Override
    public void payoffs(double[] out) {
        MomentAlgebra.flatten(grossReturns, out);
    }

    @Override
    public void discountFactor(double[] theta, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            double sdf = theta[0];
            for (int k = 0; k < factors[t].length; k++) {
                sdf -= theta[k + 1] * factors[t][k];
            }
            out[t] = sdf;
        }
    }

    @Override
    public boolean isLinear() {
        return true;
    }

    @Override
    public void errors(double[] theta, double[] out) {
        int n = assetNames.size();
        for (int t = 0; t < grossReturns.length; t++) {
            double sdf = theta[0];
            double[] f = factors[t];
            for (int k = 0; k < f.length; k++) {
                sdf -= theta[k + 1] * f[k];
            }
            double[] r = grossReturns[t];
            for (int i = 0; i < n; i++) {
                out[t * n + i] = sdf * r[i] - 1.0;
            }
        }
    }

    @Override
    public void errorDerivatives(double[] theta, double[][] out) {
        int n = assetNames.size();
        for (int t = 0; t < grossReturns.length; t++) {
            double[] f = factors[t];
            double[] r = grossReturns[t];
            for (int i = 0; i < n; i++) {
                out[0][t * n + i] = r[i];
                for (int k = 0; k < f.length; k++) {
                    out[k + 1][t * n + i] = -f[k] * r[i];
                }
            }
        }
    }
}
