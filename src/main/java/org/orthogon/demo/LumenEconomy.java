package org.orthogon.demo;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;

/**
 * The invented Isle of Lumen economy (docs/demo-scenario.md): its primitive parameters and the true
 * values of every model family's parameters that follow from them.
 *
 * <p>Each month the three factors (MKT, SIZE, TIDE: excess or zero-cost returns) are jointly normal,
 * F = μ_F + L z, with L L' = Σ_F. Log consumption growth is ln g = μ_c/3 + κ'(F - μ_F) + η,
 * η ~ N(0, σ_η²). The twelve portfolios' excess returns are R^e = B F + ε, ε ~ N(0, diag(s²)) and
 * independent of everything else, and the risk-free gross rate is constant. Draws are independent
 * across months.
 *
 * <p>Why both SDFs price the portfolios exactly in population: with M = β^{1/3} g^{-γ} lognormal and
 * R^e normal, Stein's lemma gives E[M R^e] = E[M] (E[R^e] - γ Cov(ln g, R^e)) (Stein 1981, Annals of
 * Statistics 9), which is zero because μ_F = γ Σ_F κ and E[R^e] = B μ_F. Quarterly gross returns and
 * quarterly consumption growth are products over three independent months, so the quarterly Euler
 * equation E[β g_q^{-γ} R_q] = 1 holds exactly as well. For the linear SDF, E[(1 - b'F) R^e] = 0 holds
 * for b = λ / (1 + μ_F'λ) with λ = Σ_F^{-1} μ_F (Cochrane 2005, "Asset Pricing", section 6.3), whatever
 * the distribution, because the portfolios have no alpha.
 */
public record LumenEconomy(
        double quarterlyBeta,
        double gamma,
        double quarterlyMeanLogGrowth,
        double consumptionNoise,
        double[] factorMeans,
        double[] factorVolatilities,
        double[][] factorCorrelations,
        double[][] loadings,
        double[] idiosyncraticVolatilities,
        List<String> factorNames,
        List<String> portfolioNames) {

    /** The shipped scenario; the numbers are documented in docs/demo-scenario.md. */
    public static LumenEconomy standard() {
        double[] mktLoading = {1.20, 1.15, 1.10, 1.05};
        double[] sizeLoading = {0.90, 0.40, -0.25};
        double[] tideLoading = {-0.50, 0.00, 0.50, 1.00};
        double[] idiosyncratic = {0.020, 0.016, 0.012};
        double[][] loadings = new double[12][];
        double[] vols = new double[12];
        List<String> names = new ArrayList<>();
        for (int size = 0; size < 3; size++) {
            for (int tide = 0; tide < 4; tide++) {
                int i = size * 4 + tide;
                loadings[i] = new double[] {mktLoading[tide] - 0.10 * size, sizeLoading[size], tideLoading[tide]};
                vols[i] = idiosyncratic[size];
                names.add("S" + (size + 1) + "T" + (tide + 1));
            }
        }
        return new LumenEconomy(0.98, 10.0, 0.004, 0.006,
                new double[] {0.0060, 0.0025, 0.0035},
                new double[] {0.045, 0.030, 0.025},
                new double[][] {{1.0, 0.25, 0.15}, {0.25, 1.0, 0.05}, {0.15, 0.05, 1.0}},
                loadings, vols, List.of("MKT", "SIZE", "TIDE"), List.copyOf(names));
    }

    /** Σ_F = diag(vol) R diag(vol), the monthly factor covariance. */
    public DMatrixRMaj factorCovariance() {
        int k = factorMeans.length;
        DMatrixRMaj sigma = new DMatrixRMaj(k, k);
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                sigma.set(a, b, factorVolatilities[a] * factorVolatilities[b] * factorCorrelations[a][b]);
            }
        }
        return sigma;
    }

    /** Lower Cholesky factor L of Σ_F, used to draw the factors. */
    public DMatrixRMaj factorCholesky() {
        CholeskyDecomposition_F64<DMatrixRMaj> chol = DecompositionFactory_DDRM.chol(factorMeans.length, true);
        if (!chol.decompose(factorCovariance())) {
            throw new IllegalStateException("factor correlation matrix is not positive definite");
        }
        return chol.getT(null);
    }

    /** λ = Σ_F^{-1} μ_F: the factor prices of risk in the covariance form of the linear SDF. */
    public double[] factorRiskPrices() {
        DMatrixRMaj lambda = new DMatrixRMaj(factorMeans.length, 1);
        CommonOps_DDRM.solve(factorCovariance(), DMatrixRMaj.wrap(factorMeans.length, 1, factorMeans.clone()), lambda);
        return lambda.data;
    }

    /** κ = λ / γ: the loadings of log consumption growth on the factors that make μ_F = γ Σ_F κ. */
    public double[] consumptionLoadings() {
        double[] lambda = factorRiskPrices();
        double[] kappa = new double[lambda.length];
        for (int k = 0; k < lambda.length; k++) {
            kappa[k] = lambda[k] / gamma;
        }
        return kappa;
    }

    /** Variance of monthly log consumption growth, κ'Σ_F κ + σ_η². */
    public double monthlyLogGrowthVariance() {
        double[] kappa = consumptionLoadings();
        DMatrixRMaj sigma = factorCovariance();
        double variance = consumptionNoise * consumptionNoise;
        for (int a = 0; a < kappa.length; a++) {
            for (int b = 0; b < kappa.length; b++) {
                variance += kappa[a] * sigma.get(a, b) * kappa[b];
            }
        }
        return variance;
    }

    /**
     * The constant monthly gross risk-free rate 1/E[M], with M = β^{1/3} g^{-γ} lognormal:
     * E[M] = β^{1/3} exp(-γ μ_c/3 + γ² Var(ln g)/2).
     */
    public double monthlyRiskfreeGross() {
        double logMean = Math.log(quarterlyBeta) / 3.0 - gamma * quarterlyMeanLogGrowth / 3.0
                + 0.5 * gamma * gamma * monthlyLogGrowthVariance();
        return Math.exp(-logMean);
    }

    /** True b of m = 1 - b'F on excess returns: b = λ / (1 + μ_F'λ). */
    public double[] linearSdfCoefficients() {
        double[] lambda = factorRiskPrices();
        double scale = 1.0;
        for (int k = 0; k < lambda.length; k++) {
            scale += factorMeans[k] * lambda[k];
        }
        double[] b = new double[lambda.length];
        for (int k = 0; k < lambda.length; k++) {
            b[k] = lambda[k] / scale;
        }
        return b;
    }

    /** Population mean excess returns E[R^e] = B μ_F. */
    public double[] expectedExcessReturns() {
        double[] mean = new double[loadings.length];
        for (int i = 0; i < loadings.length; i++) {
            for (int k = 0; k < factorMeans.length; k++) {
                mean[i] += loadings[i][k] * factorMeans[k];
            }
        }
        return mean;
    }

    /**
     * The pseudo-true b of the misspecified market-only SDF m = 1 - b MKT under the identity weight:
     * b = (c'c)^{-1} c'd with d = E[R^e] and c = E[R^e MKT] = B (Σ_F e_1 + μ_F μ_MKT), the population
     * counterpart of the one-step closed form (Hansen 1982; Hall and Inoue 2003, Journal of
     * Econometrics 114, on pseudo-true values under misspecification).
     */
    public double marketOnlyPseudoTrueCoefficient() {
        DMatrixRMaj sigma = factorCovariance();
        double[] d = expectedExcessReturns();
        double numerator = 0.0;
        double denominator = 0.0;
        for (int i = 0; i < loadings.length; i++) {
            double c = 0.0;
            for (int k = 0; k < factorMeans.length; k++) {
                c += loadings[i][k] * (sigma.get(k, 0) + factorMeans[k] * factorMeans[0]);
            }
            numerator += c * d[i];
            denominator += c * c;
        }
        return numerator / denominator;
    }

    /**
     * True b of the demeaned SDF m = 1 - b'(F - μ_F) on excess returns: b = Σ_F^{-1} μ_F = λ, because
     * E[R^e] = Cov(R^e, F') b is E[R^e] = B μ_F = B Σ_F b (Cochrane 2005, "Asset Pricing", section 13.4;
     * cited from memory). The jointly estimated factor means have truth μ_F.
     */
    public double[] demeanedSdfCoefficients() {
        return factorRiskPrices();
    }

    /**
     * True (a, b) of m = a - b'F on gross returns with the risk-free asset: m must be proportional to
     * 1 - b_e'F with b_e = {@link #linearSdfCoefficients()} to price excess returns, and E[m] R_f = 1
     * fixes the scale, a = 1 / (R_f (1 - b_e'μ_F)), b = a b_e (algebra from Cochrane 2005, section 6.3).
     * Element 0 is a, then b in factor order.
     */
    public double[] grossSdfParameters() {
        double[] be = linearSdfCoefficients();
        double meanSdf = 1.0;
        for (int k = 0; k < be.length; k++) {
            meanSdf -= be[k] * factorMeans[k];
        }
        double a = 1.0 / (monthlyRiskfreeGross() * meanSdf);
        double[] out = new double[be.length + 1];
        out[0] = a;
        for (int k = 0; k < be.length; k++) {
            out[k + 1] = a * be[k];
        }
        return out;
    }

    /**
     * True (β, γ, ψ) of recursive utility on quarterly data with the market as wealth proxy: the
     * economy's SDF is power utility, which recursive utility nests at ψ = 1/γ (θ = 1, Epstein and Zin
     * 1989), so β and γ are those of power utility and ψ = 1/γ.
     */
    public double[] recursiveUtilityParameters() {
        return new double[] {quarterlyBeta, gamma, 1.0 / gamma};
    }
}
