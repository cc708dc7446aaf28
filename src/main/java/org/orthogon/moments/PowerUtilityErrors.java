package org.orthogon.moments;

import java.util.List;

/**
 * Euler-equation errors of a representative agent with power (CRRA) utility:
 * e_{t,i}(β, γ) = β (C_t/C_{t-1})^{-γ} R_{t,i} - 1, with R_{t,i} the gross return of asset i over
 * the period ending at t. In population E_{t-1}[e_t] = 0 (Hansen and Singleton 1982, Econometrica 50;
 * Hansen and Singleton 1983, Journal of Political Economy 91).
 *
 * <p>Derivatives: ∂e/∂β = g^{-γ} R and ∂e/∂γ = -β ln(g) g^{-γ} R, with g = C_t/C_{t-1}.
 */
public final class PowerUtilityErrors extends NamedErrors {
    public static final List<String> PARAMETERS = List.of("beta", "gamma");

    private final double[][] grossReturns; // [t][i]
    private final double[] consumptionGrowth;
    private final double[] logGrowth;

    /**
     * @param grossReturns      T x N gross returns R_{t,i}, row t the period ending at t
     * @param consumptionGrowth T gross consumption growth C_t/C_{t-1}, all positive
     * @param assetNames        N asset names
     */
    public PowerUtilityErrors(double[][] grossReturns, double[] consumptionGrowth, List<String> assetNames) {
        super(PARAMETERS, assetNames);
        if (grossReturns.length != consumptionGrowth.length) {
            throw new IllegalArgumentException("returns have " + grossReturns.length
                    + " rows but consumption growth has " + consumptionGrowth.length);
        }
        this.grossReturns = new double[grossReturns.length][];
        this.consumptionGrowth = consumptionGrowth.clone();
        this.logGrowth = new double[consumptionGrowth.length];
        for (int t = 0; t < grossReturns.length; t++) {
            if (grossReturns[t].length != assetNames().size()) {
                throw new IllegalArgumentException("return row " + t + " has " + grossReturns[t].length
                        + " values, expected " + assetNames().size());
            }
            if (!(consumptionGrowth[t] > 0)) {
                throw new IllegalArgumentException("consumption growth must be a positive gross rate, found "
                        + consumptionGrowth[t] + " in row " + t);
            }
            this.grossReturns[t] = grossReturns[t].clone();
            this.logGrowth[t] = Math.log(consumptionGrowth[t]);
        }
    }



    @Override
    public int observations() {
        return grossReturns.length;
    }

    @Override
    public void discountFactor(double[] theta, double[] out) {
        for (int t = 0; t < logGrowth.length; t++) {
            out[t] = theta[0] * Math.exp(-theta[1] * logGrowth[t]);
        }
    }

    @Override
    public void payoffs(double[] out) {
        MomentAlgebra.flatten(grossReturns, out);
    }

    @Override
    public boolean isLinear() {
        return false;
    }

    @Override
    public void errors(double[] theta, double[] out) {
        double beta = theta[0];
        double gamma = theta[1];
        int n = assetNames().size();
        for (int t = 0; t < grossReturns.length; t++) {
            double discount = beta * Math.exp(-gamma * logGrowth[t]);
            double[] r = grossReturns[t];
            for (int i = 0; i < n; i++) {
                out[t * n + i] = discount * r[i] - 1.0;
            }
        }
    }

    @Override
    public void errorDerivatives(double[] theta, double[][] out) {
        double beta = theta[0];
        double gamma = theta[1];
        int n = assetNames().size();
        for (int t = 0; t < grossReturns.length; t++) {
            double marginalUtilityRatio = Math.exp(-gamma * logGrowth[t]);
            double[] r = grossReturns[t];
            for (int i = 0; i < n; i++) {
                double discountedPayoff = marginalUtilityRatio * r[i];
                out[0][t * n + i] = discountedPayoff;
                out[1][t * n + i] = -beta * logGrowth[t] * discountedPayoff;
            }
        }
    }

    /** The gross consumption growth this model was built on (a copy). */
    public double[] consumptionGrowth() {
        return consumptionGrowth.clone();
    }
}
