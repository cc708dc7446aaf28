package org.orthogon.moments;

import java.util.List;

/**
 * Euler-equation errors of a representative agent with power (CRRA) utility:
 * e_{t,i}(β, γ) = β (C_t/C_{t-1})^{-γ} R_{t,i} - 1, with R_{t,i} the gross return of asset i over
 * the period ending at t. In population E_{t-1}[e_t] = 0 (Hansen and Singleton 1982, Econometrica 50;
 * Hansen and Singleton 1983, Journal of Political Economy 91).
 *
 * <p>The SDF is m_t = β g_t^{-γ}, g = C_t/C_{t-1}, with ∂m/∂β = g^{-γ} and ∂m/∂γ = -β ln(g) g^{-γ}.
 */
public final class PowerUtilityErrors extends SdfErrors {
    public static final List<String> PARAMETERS = List.of("beta", "gamma");

    private final double[] consumptionGrowth;
    private final double[] logGrowth;

    /**
     * @param grossReturns      T x N gross returns R_{t,i}, row t the period ending at t
     * @param consumptionGrowth T gross consumption growth C_t/C_{t-1}, all positive
     * @param assetNames        N asset names
     */
    public PowerUtilityErrors(double[][] grossReturns, double[] consumptionGrowth, List<String> assetNames) {
        super(PARAMETERS, assetNames, grossReturns, Payoff.GROSS, List.of());
        MomentAlgebra.requireRows(grossReturns.length, consumptionGrowth.length, "returns", "consumption growth");
        this.consumptionGrowth = consumptionGrowth.clone();
        this.logGrowth = new double[consumptionGrowth.length];
        for (int t = 0; t < consumptionGrowth.length; t++) {
            if (!(consumptionGrowth[t] > 0)) {
                throw new IllegalArgumentException("consumption growth must be a positive gross rate, found "
                        + consumptionGrowth[t] + " in row " + t);
            }
            this.logGrowth[t] = Math.log(consumptionGrowth[t]);
        }
    }

    private PowerUtilityErrors(PowerUtilityErrors source, int[] rows) {
        super(source, rows);
        this.consumptionGrowth = pick(source.consumptionGrowth, rows);
        this.logGrowth = pick(source.logGrowth, rows);
    }

    @Override
    protected PowerUtilityErrors onRows(int[] rows) {
        return new PowerUtilityErrors(this, rows);
    }

    @Override
    protected void sdf(double[] theta, double[] out) {
        for (int t = 0; t < logGrowth.length; t++) {
            out[t] = theta[0] * Math.exp(-theta[1] * logGrowth[t]);
        }
    }

    @Override
    protected void sdfGradient(double[] theta, double[][] out) {
        double beta = theta[0];
        double gamma = theta[1];
        for (int t = 0; t < logGrowth.length; t++) {
            double marginalUtilityRatio = Math.exp(-gamma * logGrowth[t]);
            out[0][t] = marginalUtilityRatio;
            out[1][t] = -beta * logGrowth[t] * marginalUtilityRatio;
        }
    }

    @Override
    public boolean isLinear() {
        return false;
    }

    /** The gross consumption growth this model was built on (a copy). */
    public double[] consumptionGrowth() {
        return consumptionGrowth.clone();
    }
}
