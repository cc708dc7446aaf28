package org.orthogon.twopass;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;

/**
 * The second pass of the two-pass method on full-sample betas. With X = [1_N, β̂] (or X = β̂ without the
 * intercept), a weight W and H = (X'WX)^{-1}:
 * <pre>
 *   γ̂_t = H X'W R_t,  γ̂ = (1/T) Σ_t γ̂_t = H X'W R̄                                  (Fama and MacBeth 1973)
 *   V_FM = (1/T²) Σ_t (γ̂_t - γ̂)(γ̂_t - γ̂)'
 *   V_Sh = (1 + λ̂'Ω̂^{-1}λ̂) V_FM + [0, 0; 0, Ω̂/T]                                       (Shanken 1992)
 *   V_KRS = (1/T²) Σ_t ĥ_t ĥ_t',
 *     ĥ_t = (γ̂_t - γ̂) - (φ̂_t - φ̂) ŵ_t + H ẑ_t û_t  [ - (γ̂_t - γ̂) û_t for GLS ]      (Kan, Robotti and Shanken 2013)
 * </pre>
 * where λ̂ is the factor block of γ̂, φ̂_t - φ̂ = (γ̂_t - γ̂) - [0; f_t - f̄], ŵ_t = λ̂'Ω̂^{-1}(f_t - f̄),
 * ẑ_t = [0; Ω̂^{-1}(f_t - f̄)], ê = R̄ - Xγ̂ the pricing errors and û_t = ê'W(R_t - R̄). The last term of ĥ_t
 * is zero when the model prices the assets exactly (ê = 0), so V_KRS guards against misspecification;
 * the GLS term accounts for W = V̂_R^{-1} being estimated. Every ĥ_t and n̂_t below has sample mean exactly
 * zero (X'Wê = 0), and, like the Fama-MacBeth variance, the covariances assume no serial correlation.
 *
 * <p>Cross-sectional R² (KRS 2013): ρ̂² = 1 - Q̂/Q̂_0 with Q̂ = ê'Wê and Q̂_0 = ê_0'Wê_0, ê_0 = R̄ - 1_N (1'W1)^{-1}
 * 1'W R̄ (the errors of a model that explains no spread; for OLS ρ̂² = 1 - Σ ê_i²/Σ (R̄_i - mean R̄)²).
 * Its variance for 0 &lt; ρ² &lt; 1 is (1/T²) Σ_t n̂_t² with ŷ_t = 1 - ŵ_t, û_{0t} = ê_0'W(R_t - R̄) and
 * <pre>
 *   OLS: n̂_t = 2[(1 - ρ̂²) û_{0t} - û_t ŷ_t] / Q̂_0
 *   GLS: n̂_t = [û_t² - 2 û_t ŷ_t + (1 - ρ̂²)(2 û_{0t} - û_{0t}²)] / Q̂_0   (+ constants that sum to zero)
 * </pre>
 * References: Fama, E. F. and MacBeth, J. D. (1973), Journal of Political Economy 81, 607-636; Shanken, J.
 * (1992), "On the estimation of beta-pricing models", Review of Financial Studies 5, 1-33; Kan, R.,
 * Robotti, C. and Shanken, J. (2013), "Pricing model performance and the two-pass cross-sectional
 * regression methodology", Journal of Finance 68, 2617-2649 (the influence functions are derived here
 * from the estimating equations and agree with that paper's Theorems 1 and 2).
 */
public final class CrossSectionalRegression {
    private CrossSectionalRegression() {
    }

    /**
     * The second pass on the betas of {@code timeSeries}.
     *
     * @throws IllegalArgumentException when there are not more assets than coefficients
     */
    public static CrossSectionEstimate estimate(FactorSample sample, TimeSeriesFit timeSeries, Weighting weighting,
            boolean intercept) {
        Pieces p = Pieces.of(sample, timeSeries, weighting, intercept);
        int t = p.periods;
        int q = p.coefficients;
        DMatrixRMaj fm = new DMatrixRMaj(q, q);
        DMatrixRMaj robust = new DMatrixRMaj(q, q);
        double r2Variance = 0.0;
        for (int s = 0; s < t; s++) {
            double[] g = p.deviation(s);
            double[] h = p.influence(s);
            for (int a = 0; a < q; a++) {
                for (int b = 0; b < q; b++) {
                    fm.add(a, b, g[a] * g[b]);
                    robust.add(a, b, h[a] * h[b]);
                }
            }
            double n = p.r2Influence(s);
            r2Variance += n * n;
        }
        CommonOps_DDRM.divide(fm, (double) t * t);
        CommonOps_DDRM.divide(robust, (double) t * t);
        DMatrixRMaj shanken = fm.copy();
        CommonOps_DDRM.scale(1.0 + p.sharpeOfPremia, shanken);
        int offset = intercept ? 1 : 0;
        for (int a = 0; a < p.factors; a++) {
            for (int b = 0; b < p.factors; b++) {
                shanken.add(offset + a, offset + b, p.omega.get(a, b) / t);
            }
        }
        List<String> names = new ArrayList<>();
        if (intercept) {
            names.add(CrossSectionEstimate.INTERCEPT);
        }
        names.addAll(sample.factors());
        return new CrossSectionEstimate(weighting, intercept, names, p.gamma.data.clone(), Dense.symmetrize(fm),
                Dense.symmetrize(shanken), Dense.symmetrize(robust), p.r2, Math.sqrt(r2Variance) / t, sample.assets(),
                p.meanReturns.data.clone(), p.predicted());
    }

    /**
     * Every intermediate quantity of the second pass, kept so that the tests of equal R² can reuse the
     * influence functions of each model.
     */
    static final class Pieces {
        final int periods;
        final int assets;
        final int factors;
        final int coefficients;
        final boolean intercept;
        final boolean gls;
        final DMatrixRMaj x; // N x q
        final DMatrixRMaj weight; // N x N
        final DMatrixRMaj h; // q x q, (X'WX)^{-1}
        final DMatrixRMaj gamma; // q x 1
        final DMatrixRMaj gammaSeries; // T x q, γ_t
        final DMatrixRMaj meanReturns; // N x 1
        final DMatrixRMaj returnDeviations; // T x N
        final DMatrixRMaj factorDeviations; // T x K
        final DMatrixRMaj omega;
        final DMatrixRMaj omegaInverse;
        final double sharpeOfPremia;
        final double[] u; // u_t
        final double[] u0; // u_{0t}
        final double[] w; // w_t
        final double q;
        final double q0;
        final double r2;

        private Pieces(FactorSample sample, TimeSeriesFit ts, Weighting weighting, boolean intercept) {
            periods = sample.periods();
            assets = sample.assetCount();
            factors = sample.factorCount();
            this.intercept = intercept;
            gls = weighting == Weighting.GLS;
            coefficients = factors + (intercept ? 1 : 0);
            if (assets <= coefficients) {
                throw new IllegalArgumentException("the cross-sectional regression needs more test assets than "
                        + "coefficients: N = " + assets + ", coefficients = " + coefficients);
            }
            DMatrixRMaj returns = Dense.of(sample.excessReturns());
            meanReturns = Dense.columnMeans(returns);
            returnDeviations = Dense.demeaned(returns);
            factorDeviations = Dense.demeaned(Dense.of(sample.factorValues()));
            omega = ts.factorCovariance();
            omegaInverse = Dense.inverseSymmetric(omega, "the factor covariance matrix Ω");
            double[][] beta = ts.betas();
            x = new DMatrixRMaj(assets, coefficients);
            for (int i = 0; i < assets; i++) {
                int c = 0;
                if (intercept) {
                    x.set(i, c++, 1.0);
                }
                for (int k = 0; k < factors; k++) {
                    x.set(i, c++, beta[i][k]);
                }
            }
            weight = gls ? Dense.inverseSymmetric(Dense.symmetrize(Dense.crossProduct(returnDeviations,
                    returnDeviations)), "the covariance matrix of the returns V_R") : CommonOps_DDRM.identity(assets);
            DMatrixRMaj xtw = Dense.multiplyTransA(x, weight); // q x N
            h = Dense.inverseSymmetric(Dense.symmetrize(Dense.multiply(xtw, x)), "X'WX of the betas");
            DMatrixRMaj a = Dense.multiply(h, xtw); // q x N
            gamma = Dense.multiply(a, meanReturns);
            DMatrixRMaj returnsMatrix = returns;
            gammaSeries = new DMatrixRMaj(periods, coefficients);
            CommonOps_DDRM.multTransB(returnsMatrix, a, gammaSeries);
            DMatrixRMaj lambda = new DMatrixRMaj(factors, 1);
            for (int k = 0; k < factors; k++) {
                lambda.data[k] = gamma.data[(intercept ? 1 : 0) + k];
            }
            sharpeOfPremia = Dense.quadratic(lambda, omegaInverse);
            DMatrixRMaj errors = meanReturns.copy();
            DMatrixRMaj fitted = Dense.multiply(x, gamma);
            CommonOps_DDRM.subtractEquals(errors, fitted);
            DMatrixRMaj we = Dense.multiply(weight, errors);
            q = CommonOps_DDRM.dot(errors, we);
            // e_0: the errors of the constant alone, R̄ - 1 (1'W1)^{-1} 1'W R̄.
            DMatrixRMaj ones = new DMatrixRMaj(assets, 1);
            ones.fill(1.0);
            DMatrixRMaj wOnes = Dense.multiply(weight, ones);
            double level = CommonOps_DDRM.dot(wOnes, meanReturns) / CommonOps_DDRM.dot(wOnes, ones);
            DMatrixRMaj errors0 = meanReturns.copy();
            CommonOps_DDRM.add(errors0, -level, ones, errors0);
            DMatrixRMaj we0 = Dense.multiply(weight, errors0);
            q0 = CommonOps_DDRM.dot(errors0, we0);
            r2 = 1.0 - q / q0;
            DMatrixRMaj uSeries = Dense.multiply(returnDeviations, we);
            DMatrixRMaj u0Series = Dense.multiply(returnDeviations, we0);
            DMatrixRMaj loading = Dense.multiply(omegaInverse, lambda);
            DMatrixRMaj wSeries = Dense.multiply(factorDeviations, loading);
            u = uSeries.data.clone();
            u0 = u0Series.data.clone();
            w = wSeries.data.clone();
        }

        static Pieces of(FactorSample sample, TimeSeriesFit ts, Weighting weighting, boolean intercept) {
            return new Pieces(sample, ts, weighting, intercept);
        }

        /** γ̂_t - γ̂. */
        double[] deviation(int s) {
            double[] g = new double[coefficients];
            for (int a = 0; a < coefficients; a++) {
                g[a] = gammaSeries.get(s, a) - gamma.data[a];
            }
            return g;
        }

        /** ĥ_t of the misspecification-robust covariance. */
        double[] influence(int s) {
            double[] g = deviation(s);
            int offset = intercept ? 1 : 0;
            double[] z = new double[coefficients];
            for (int k = 0; k < factors; k++) {
                double sum = 0.0;
                for (int j = 0; j < factors; j++) {
                    sum += omegaInverse.get(k, j) * factorDeviations.get(s, j);
                }
                z[offset + k] = sum;
            }
            double[] out = new double[coefficients];
            for (int a = 0; a < coefficients; a++) {
                double phi = g[a] - (a >= offset ? factorDeviations.get(s, a - offset) : 0.0);
                double hz = 0.0;
                for (int b = 0; b < coefficients; b++) {
                    hz += h.get(a, b) * z[b];
                }
                out[a] = g[a] - phi * w[s] + hz * u[s] - (gls ? g[a] * u[s] : 0.0);
            }
            return out;
        }

        /** n̂_t of the variance of ρ̂². */
        double r2Influence(int s) {
            double y = 1.0 - w[s];
            if (!gls) {
                return 2.0 * ((1.0 - r2) * u0[s] - u[s] * y) / q0;
            }
            return (u[s] * u[s] - q - 2.0 * u[s] * y + (1.0 - r2) * (2.0 * u0[s] - u0[s] * u0[s] + q0)) / q0;
        }

        double[] predicted() {
            return Dense.multiply(x, gamma).data.clone();
        }
    }
}
