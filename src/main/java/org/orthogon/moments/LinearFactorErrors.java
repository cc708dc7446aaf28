package org.orthogon.moments;

import java.util.List;

/**
 * Pricing errors of a linear stochastic discount factor on excess returns, m_t = 1 - b'F_t:
 * e_{t,i}(b) = R^e_{t,i} (1 - b'F_t). In population E[m_t R^e_t] = 0 (Cochrane 2005, "Asset
 * Pricing", revised edition, chapters 13.2 and 13.3). The errors are affine in b with
 * ∂e_{t,i}/∂b_k = -R^e_{t,i} F_{t,k}, so the mean is g_T(b) = d - C b with d = mean R^e and
 * C = mean R^e F', and GMM with weight W has the closed form b = (C'WC)^{-1} C'W d.
 */
public final class LinearFactorErrors extends NamedErrors {
    private final double[][] excessReturns; // [t][i]
    private final double[][] factors; // [t][k]

    /**
     * @param excessReturns T x N excess returns
     * @param factors       T x K factor values on the same dates
     * @param assetNames    N names
     * @param factorNames   K names; the parameters are named b_&lt;factor&gt;
     */
    public LinearFactorErrors(double[][] excessReturns, double[][] factors, List<String> assetNames,
            List<String> factorNames) {
        super(MomentAlgebra.prefixed("b_", factorNames), assetNames);
        if (excessReturns.length != factors.length) {
            throw new IllegalArgumentException("returns have " + excessReturns.length + " rows but factors have "
                    + factors.length);
        }
        this.excessReturns = MomentAlgebra.copyRows(excessReturns, assetNames().size(), "return");
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
    }



    @Override
    public int observations() {
        return excessReturns.length;
    }

    @Override
    public void discountFactor(double[] b, double[] out) {
        for (int t = 0; t < factors.length; t++) {
            double sdf = 1.0;
            for (int k = 0; k < b.length; k++) {
                sdf -= b[k] * factors[t][k];
            }
            out[t] = sdf;
        }
    }

    @Override
    public void payoffs(double[] out) {
        MomentAlgebra.flatten(excessReturns, out);
    }

    @Override
    public boolean isLinear() {
        return true;
    }

    @Override
    public void errors(double[] b, double[] out) {
        int n = assetNames().size();
        double[] sdf = new double[excessReturns.length];
        discountFactor(b, sdf);
        for (int t = 0; t < excessReturns.length; t++) {
            double[] r = excessReturns[t];
            for (int i = 0; i < n; i++) {
                out[t * n + i] = r[i] * sdf[t];
            }
        }
    }

    @Override
    public void errorDerivatives(double[] b, double[][] out) {
        int n = assetNames().size();
        for (int t = 0; t < excessReturns.length; t++) {
            double[] f = factors[t];
            double[] r = excessReturns[t];
            for (int k = 0; k < f.length; k++) {
                for (int i = 0; i < n; i++) {
                    out[k][t * n + i] = -r[i] * f[k];
                }
            }
        }
    }
}
