package org.orthogon.moments;

import java.util.List;

/**
 * The N pricing errors of the linear SDF in demeaned factors with the factor means fixed at their sample
 * values, μ = f̄, and the sampling error of f̄ carried in each contribution:
 * <pre>
 *   m_t = 1 - b'(F_t - f̄)
 *   e_{t,i} = R^e_{t,i} m_t + R̄^e_i b'(F_t - f̄)
 * </pre>
 * The second term has sample mean zero, so g_T(b) = E_T[R^e m] is the pricing error of the SDF at μ = f̄;
 * it is the first-order effect of estimating μ (∂g/∂μ' = R̄^e b', times f̄ - μ), so a long-run covariance of
 * these contributions is that of g_T(b, f̄) (Newey and McFadden 1994, Handbook of Econometrics 4, section 6,
 * on two-step estimators). The errors are affine in b with ∂e_{t,i}/∂b_k = -(R^e_{t,i} - R̄^e_i)(F_{t,k} - f̄_k).
 *
 * <p>This is the moment set of the Hansen-Jagannathan distance of the demeaned form: the N assets it
 * prices, weighted by their second moments E[R^e R^e'], with μ = f̄ rather than the factor-mean moments,
 * which price no payoff (Kan and Robotti 2009 measure the demeaned SDF's distance the same way).
 *
 * <p>The errors are not of the form m x - p (the second term), so this class implements
 * {@link ObservationErrors} itself; a row selection recomputes f̄ and R̄ on the rows it keeps, so a
 * subsample's distance is taken at its own sample means.
 */
public final class DemeanedPricingErrors implements ObservationErrors {
    private final List<String> parameterNames;
    private final List<String> assetNames;
    private final List<String> factorNames;
    private final double[][] excessReturns; // [t][i]
    private final double[][] factors; // [t][k], as given
    private final double[][] demeanedFactors; // [t][k], F_t - f̄
    private final double[] meanReturns;

    /**
     * @param excessReturns T x N excess returns
     * @param factors       T x K factors on the same dates
     * @param assetNames    N names
     * @param factorNames   K names; the parameters are b_&lt;factor&gt;
     */
    public DemeanedPricingErrors(double[][] excessReturns, double[][] factors, List<String> assetNames,
            List<String> factorNames) {
        this.parameterNames = MomentAlgebra.prefixed("b_", factorNames);
        this.assetNames = List.copyOf(assetNames);
        this.factorNames = List.copyOf(factorNames);
        MomentAlgebra.requireRows(excessReturns.length, factors.length, "returns", "factors");
        this.excessReturns = MomentAlgebra.copyRows(excessReturns, assetNames.size(), "return");
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
        double[][] copy = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
        int t = copy.length;
        double[] factorMeans = new double[factorNames.size()];
        for (double[] row : copy) {
            for (int k = 0; k < row.length; k++) {
                factorMeans[k] += row[k] / t;
            }
        }
        for (double[] row : copy) {
            for (int k = 0; k < row.length; k++) {
                row[k] -= factorMeans[k];
            }
        }
        this.demeanedFactors = copy;
        this.meanReturns = new double[assetNames.size()];
        for (double[] row : this.excessReturns) {
            for (int i = 0; i < row.length; i++) {
                meanReturns[i] += row[i] / t;
            }
        }
    }

    @Override
    public List<String> parameterNames() {
        return parameterNames;
    }

    @Override
    public List<String> assetNames() {
        return assetNames;
    }

    @Override
    public int observations() {
        return excessReturns.length;
    }

    @Override
    public DemeanedPricingErrors select(int[] rows) {
        if (rows.length < 1) {
            throw new IllegalArgumentException("a selection needs at least one row");
        }
        double[][] returns = new double[rows.length][];
        double[][] picked = new double[rows.length][];
        for (int r = 0; r < rows.length; r++) {
            if (rows[r] < 0 || rows[r] >= excessReturns.length) {
                throw new IllegalArgumentException("row " + rows[r] + " is not one of the " + excessReturns.length
                        + " observations");
            }
            returns[r] = excessReturns[rows[r]];
            picked[r] = factors[rows[r]];
        }
        return new DemeanedPricingErrors(returns, picked, assetNames, factorNames);
    }

    @Override
    public void discountFactor(double[] b, double[] out) {
        for (int t = 0; t < demeanedFactors.length; t++) {
            double sdf = 1.0;
            for (int k = 0; k < b.length; k++) {
                sdf -= b[k] * demeanedFactors[t][k];
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
        int n = meanReturns.length;
        for (int t = 0; t < excessReturns.length; t++) {
            double exposure = 0.0;
            for (int k = 0; k < b.length; k++) {
                exposure += b[k] * demeanedFactors[t][k];
            }
            double[] r = excessReturns[t];
            for (int i = 0; i < n; i++) {
                out[t * n + i] = r[i] * (1.0 - exposure) + meanReturns[i] * exposure;
            }
        }
    }

    @Override
    public void errorDerivatives(double[] b, double[][] out) {
        int n = meanReturns.length;
        for (int t = 0; t < excessReturns.length; t++) {
            double[] f = demeanedFactors[t];
            double[] r = excessReturns[t];
            for (int k = 0; k < f.length; k++) {
                for (int i = 0; i < n; i++) {
                    out[k][t * n + i] = -(r[i] - meanReturns[i]) * f[k];
                }
            }
        }
    }
}
