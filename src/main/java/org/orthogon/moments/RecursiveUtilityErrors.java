package org.orthogon.moments;

import java.util.List;

/**
 * Euler-equation errors of a representative agent with recursive (Epstein-Zin) utility, priced with a
 * proxy for the return on aggregate wealth:
 * <pre>
 *   m_t = β^θ g_t^{-θ/ψ} R_{w,t}^{θ-1},   θ = (1 - γ) / (1 - 1/ψ),
 *   e_{t,i} = m_t R_{t,i} - 1
 * </pre>
 * with g_t = C_t/C_{t-1}, R_{w,t} the gross wealth return and R_{t,i} the gross return of asset i over
 * the period ending at t; γ is relative risk aversion and ψ the elasticity of intertemporal
 * substitution (Epstein and Zin 1989, Econometrica 57; the Euler equation in this form is the one
 * estimated in Epstein and Zin 1991, Journal of Political Economy 99; cited from memory). The wealth proxy's own Euler equation
 * e_{t,w} = m_t R_{w,t} - 1 is always part of the moment set, because the SDF is only valid if it
 * prices the return it is built from; it is the last asset, named after the proxy column.
 *
 * <p>Limits. At ψ = 1/γ, θ = 1 and m_t = β g_t^{-γ}: power utility, nested exactly. At γ = 1 (ψ ≠ 1),
 * θ = 0 and m_t = 1/R_{w,t}; the formula stays finite but β then drops out, so an estimator started
 * there meets a singular Jacobian. At ψ = 1 (γ ≠ 1) θ is infinite and the SDF depends on continuation
 * values that no return proxy carries; such points are refused with an {@link IllegalArgumentException}.
 *
 * <p>Computation: with κ = θ/ψ = (1 - γ)/(ψ - 1) and θ = (1 - γ)ψ/(ψ - 1), nothing is divided by ψ,
 * so an optimizer that wanders to ψ &le; 0 gets finite values (economically meaningless ones, which
 * the estimate then shows) rather than an exception.
 *
 * <p>Derivatives, with ln m = θ ln β - κ ln g + (θ - 1) ln R_w and ∂m/∂x = m ∂ln m/∂x:
 * ∂ln m/∂β = θ/β; ∂θ/∂γ = -ψ/(ψ - 1), ∂κ/∂γ = -1/(ψ - 1); ∂θ/∂ψ = ∂κ/∂ψ = -(1 - γ)/(ψ - 1)²; so
 * ∂ln m/∂γ = ∂θ/∂γ (ln β + ln R_w) - ∂κ/∂γ ln g and ∂ln m/∂ψ = ∂θ/∂ψ (ln β + ln R_w - ln g).
 */
public final class RecursiveUtilityErrors extends SdfErrors {
    public static final List<String> PARAMETERS = List.of("beta", "gamma", "psi");

    /** ψ closer to 1 than this (with γ ≠ 1) is refused: θ would exceed 1e8 and m overflow. */
    public static final double UNIT_EIS_TOLERANCE = 1e-8;

    private final double[] logGrowth;
    private final double[] logWealthReturn;

    /**
     * @param grossReturns      T x N gross returns of the test assets (without the wealth proxy)
     * @param consumptionGrowth T gross consumption growth C_t/C_{t-1}, positive
     * @param wealthReturn      T gross returns of the wealth proxy, positive
     * @param assetNames        N asset names
     * @param wealthName        the proxy's name, used for its own Euler equation
     */
    public RecursiveUtilityErrors(double[][] grossReturns, double[] consumptionGrowth, double[] wealthReturn,
            List<String> assetNames, String wealthName) {
        super(PARAMETERS, MomentAlgebra.concat(assetNames, List.of(wealthName)),
                withWealth(grossReturns, wealthReturn, assetNames, wealthName), Payoff.GROSS, List.of());
        MomentAlgebra.requireRows(grossReturns.length, consumptionGrowth.length, "returns", "consumption growth");
        this.logGrowth = new double[grossReturns.length];
        this.logWealthReturn = new double[grossReturns.length];
        for (int t = 0; t < grossReturns.length; t++) {
            if (!(consumptionGrowth[t] > 0)) {
                throw new IllegalArgumentException("consumption growth must be a positive gross rate, found "
                        + consumptionGrowth[t] + " in row " + t);
            }
            if (!(wealthReturn[t] > 0)) {
                throw new IllegalArgumentException("the wealth return must be a positive gross return, found "
                        + wealthReturn[t] + " in row " + t);
            }
            this.logGrowth[t] = Math.log(consumptionGrowth[t]);
            this.logWealthReturn[t] = Math.log(wealthReturn[t]);
        }
    }

    private RecursiveUtilityErrors(RecursiveUtilityErrors source, int[] rows) {
        super(source, rows);
        this.logGrowth = pick(source.logGrowth, rows);
        this.logWealthReturn = pick(source.logWealthReturn, rows);
    }

    /** The test assets' returns with the wealth proxy appended as the last priced asset. */
    private static double[][] withWealth(double[][] grossReturns, double[] wealthReturn, List<String> assetNames,
            String wealthName) {
        MomentAlgebra.requireRows(grossReturns.length, wealthReturn.length, "returns", "wealth returns");
        if (assetNames.contains(wealthName)) {
            throw new IllegalArgumentException("the wealth proxy " + wealthName
                    + " is also among the test assets; its Euler equation is added once, automatically");
        }
        int n = assetNames.size();
        double[][] assets = MomentAlgebra.copyRows(grossReturns, n, "return");
        double[][] rows = new double[assets.length][];
        for (int t = 0; t < assets.length; t++) {
            double[] row = java.util.Arrays.copyOf(assets[t], n + 1);
            row[n] = wealthReturn[t];
            rows[t] = row;
        }
        return rows;
    }

    @Override
    protected RecursiveUtilityErrors onRows(int[] rows) {
        return new RecursiveUtilityErrors(this, rows);
    }

    /**
     * θ = (1 - γ)/(1 - 1/ψ) (Epstein and Zin 1989), computed as (1 - γ) ψ/(ψ - 1) so that it stays
     * finite at ψ = 0.
     *
     * @throws IllegalArgumentException if ψ is within {@link #UNIT_EIS_TOLERANCE} of 1 (θ infinite, or
     *                                  undefined when γ = 1 too)
     */
    public static double theta(double gamma, double psi) {
        return (1.0 - gamma) * psi / unitDistance(gamma, psi);
    }

    /** θ/ψ = (1 - γ)/(ψ - 1), the exponent of consumption growth, with no division by ψ. */
    private static double growthExponent(double gamma, double psi) {
        return (1.0 - gamma) / unitDistance(gamma, psi);
    }

    private static double unitDistance(double gamma, double psi) {
        if (!(Math.abs(psi - 1.0) >= UNIT_EIS_TOLERANCE)) {
            throw new ParameterOutOfRangeException("recursive utility with psi = " + psi + " and gamma = " + gamma
                    + " is refused: theta = (1 - gamma)/(1 - 1/psi) is " + (gamma == 1.0 ? "undefined (0/0)" : "infinite")
                    + " at psi = 1, where the SDF depends on continuation values that a wealth-return proxy does not"
                    + " carry; start psi away from 1, or use power utility (psi = 1/gamma)");
        }
        return psi - 1.0;
    }

    @Override
    protected void sdf(double[] parameters, double[] out) {
        double logBeta = Math.log(requirePositiveBeta(parameters[0]));
        double theta = theta(parameters[1], parameters[2]);
        double kappa = growthExponent(parameters[1], parameters[2]);
        for (int t = 0; t < logGrowth.length; t++) {
            out[t] = Math.exp(logSdf(theta, kappa, logBeta, t));
        }
    }

    @Override
    protected void sdfGradient(double[] parameters, double[][] out) {
        double beta = requirePositiveBeta(parameters[0]);
        double gamma = parameters[1];
        double psi = parameters[2];
        double theta = theta(gamma, psi);
        double kappa = growthExponent(gamma, psi);
        double logBeta = Math.log(beta);
        double thetaByGamma = -psi / (psi - 1.0);
        double kappaByGamma = -1.0 / (psi - 1.0);
        // θ and κ = θ/ψ have the same derivative in ψ, -(1 - γ)/(ψ - 1)².
        double byPsiOfBoth = -(1.0 - gamma) / ((psi - 1.0) * (psi - 1.0));
        double byBeta = theta / beta;
        for (int t = 0; t < logGrowth.length; t++) {
            double sdf = Math.exp(logSdf(theta, kappa, logBeta, t));
            double priceTerms = logBeta + logWealthReturn[t];
            out[0][t] = sdf * byBeta;
            out[1][t] = sdf * (thetaByGamma * priceTerms - kappaByGamma * logGrowth[t]);
            out[2][t] = sdf * (byPsiOfBoth * (priceTerms - logGrowth[t]));
        }
    }

    @Override
    public boolean isLinear() {
        return false;
    }

    private double logSdf(double theta, double kappa, double logBeta, int t) {
        return theta * logBeta - kappa * logGrowth[t] + (theta - 1.0) * logWealthReturn[t];
    }

    private static double requirePositiveBeta(double beta) {
        if (!(beta > 0)) {
            throw new ParameterOutOfRangeException("beta must be positive for beta^theta to be defined, got beta = " + beta);
        }
        return beta;
    }
}
