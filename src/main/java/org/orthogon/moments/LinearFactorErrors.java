package org.orthogon.moments;

import java.util.List;

/**
 * Pricing errors of a linear stochastic discount factor on excess returns, m_t = 1 - b'F_t:
 * e_{t,i}(b) = R^e_{t,i} (1 - b'F_t). In population E[m_t R^e_t] = 0 (Cochrane 2005, "Asset
 * Pricing", revised edition, chapters 13.2 and 13.3). The errors are affine in b with
 * ∂e_{t,i}/∂b_k = -R^e_{t,i} F_{t,k}, so the mean is g_T(b) = d - C b with d = mean R^e and
 * C = mean R^e F', and GMM with weight W has the closed form b = (C'WC)^{-1} C'W d.
 */
public final class LinearFactorErrors extends SdfErrors {
    private final double[][] factors; // [t][k]

    /**
     * @param excessReturns T x N excess returns
     * @param factors       T x K factor values on the same dates
     * @param assetNames    N names
     * @param factorNames   K names; the parameters are named b_&lt;factor&gt;
     */
    public LinearFactorErrors(double[][] excessReturns, double[][] factors, List<String> assetNames,
            List<String> factorNames) {
        super(MomentAlgebra.prefixed("b_", factorNames), assetNames, excessReturns, Payoff.EXCESS, List.of());
        MomentAlgebra.requireRows(excessReturns.length, factors.length, "returns", "factors");
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
    }

    private LinearFactorErrors(LinearFactorErrors source, int[] rows) {
        super(source, rows);
        this.factors = pick(source.factors, rows);
    }

    @Override
    protected LinearFactorErrors onRows(int[] rows) {
        return new LinearFactorErrors(this, rows);
    }

    @Override
    protected void sdf(double[] b, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            double sdf = 1.0;
            for (int k = 0; k < b.length; k++) {
                sdf -= b[k] * factors[t][k];
            }
            out[t] = sdf;
        }
    }

    @Override
    protected void sdfGradient(double[] b, double[][] out) {
        for (int t = 0; t < factors.length; t++) {
            for (int k = 0; k < b.length; k++) {
                out[k][t] = -factors[t][k];
            }
        }
    }

    @Override
    public boolean isLinear() {
        return true;
    }
}
