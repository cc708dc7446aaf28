package org.orthogon.twopass;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.special.Beta;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.gmm.EstimationException;

/**
 * The first pass of the two-pass method: one ordinary least-squares regression per test asset,
 * R^e_{t,i} = α_i + β_i'f_t + ε_{t,i}, t = 1..T, and the Gibbons, Ross and Shanken (1989, "A test of the
 * efficiency of a given portfolio", Econometrica 57, 1121-1152) test of H0: α = 0,
 * <pre>
 *   GRS = (T/N) ((T - N - K)/(T - K - 1)) α̂'Σ̂^{-1}α̂ / (1 + μ̂'Ω̂^{-1}μ̂)  ~  F(N, T - N - K),
 * </pre>
 * with Σ̂ = (1/T) Σ_t ε̂_t ε̂_t' the residual covariance and μ̂, Ω̂ = (1/T) Σ_t (f_t - μ̂)(f_t - μ̂)' the mean
 * and covariance of the factors (all with divisor T). The F distribution is exact when the errors are
 * normal and independent over time given the factors (GRS 1989, Theorem 1).
 */
public final class TimeSeriesRegressions {
    private TimeSeriesRegressions() {
    }

    /**
     * The time-series regressions of every asset and the GRS test.
     *
     * @throws IllegalArgumentException when T ≤ N + K (the GRS statistic needs T - N - K > 0 degrees of
     *                                  freedom and an invertible Σ̂)
     * @throws EstimationException      when Σ̂ or Ω̂ is singular
     */
    public static TimeSeriesFit estimate(FactorSample sample) {
        int t = sample.periods();
        int n = sample.assetCount();
        int k = sample.factorCount();
        if (t <= n + k) {
            throw new IllegalArgumentException("the time-series regressions and the GRS test need more periods than "
                    + "test assets plus factors: T = " + t + ", N = " + n + ", K = " + k);
        }
        DMatrixRMaj returns = Dense.of(sample.excessReturns());
        DMatrixRMaj factors = Dense.of(sample.factorValues());
        DMatrixRMaj factorMean = Dense.columnMeans(factors);
        DMatrixRMaj factorDeviations = Dense.demeaned(factors);
        DMatrixRMaj omega = Dense.symmetrize(Dense.crossProduct(factorDeviations, factorDeviations));
        DMatrixRMaj omegaInverse = Dense.inverseSymmetric(omega, "the factor covariance matrix Ω");
        // β = Cov(R, f) Ω^{-1} and α = R̄ - β μ: the least-squares coefficients with a constant.
        DMatrixRMaj returnDeviations = Dense.demeaned(returns);
        DMatrixRMaj crossCovariance = Dense.crossProduct(returnDeviations, factorDeviations); // N x K
        DMatrixRMaj beta = Dense.multiply(crossCovariance, omegaInverse);
        DMatrixRMaj returnMean = Dense.columnMeans(returns);
        DMatrixRMaj alpha = returnMean.copy();
        DMatrixRMaj fitted = Dense.multiply(beta, factorMean);
        for (int i = 0; i < n; i++) {
            alpha.data[i] -= fitted.data[i];
        }
        DMatrixRMaj residuals = new DMatrixRMaj(t, n);
        for (int s = 0; s < t; s++) {
            for (int i = 0; i < n; i++) {
                double value = returnDeviations.get(s, i);
                for (int j = 0; j < k; j++) {
                    value -= beta.get(i, j) * factorDeviations.get(s, j);
                }
                residuals.set(s, i, value);
            }
        }
        DMatrixRMaj sigma = Dense.symmetrize(Dense.crossProduct(residuals, residuals));
        DMatrixRMaj sigmaInverse = Dense.inverseSymmetric(sigma, "the residual covariance matrix Σ");
        double sharpe = Dense.quadratic(factorMean, omegaInverse);
        double statistic = (double) t / n * (t - n - k) / (t - k - 1.0) * Dense.quadratic(alpha, sigmaInverse)
                / (1.0 + sharpe);
        GrsTest grs = new GrsTest(statistic, n, t - n - k, fUpperTail(statistic, n, t - n - k));

        int residualDf = t - k - 1;
        List<Alpha> alphas = new ArrayList<>(n);
        double[][] betas = new double[n][k];
        double[][] betaErrors = new double[n][k];
        double[] r2 = new double[n];
        for (int i = 0; i < n; i++) {
            double s2 = t * sigma.get(i, i) / residualDf;
            double se = Math.sqrt(s2 * (1.0 + sharpe) / t);
            double tStat = alpha.data[i] / se;
            alphas.add(new Alpha(sample.assets().get(i), alpha.data[i], se, tStat, tTwoSided(tStat, residualDf)));
            double total = 0.0;
            for (int s = 0; s < t; s++) {
                total += returnDeviations.get(s, i) * returnDeviations.get(s, i);
            }
            r2[i] = 1.0 - t * sigma.get(i, i) / total;
            for (int j = 0; j < k; j++) {
                betas[i][j] = beta.get(i, j);
                // (X'X)^{-1} for the slopes is Ω^{-1}/T when X = [1, f].
                betaErrors[i][j] = Math.sqrt(s2 * omegaInverse.get(j, j) / t);
            }
        }
        return new TimeSeriesFit(sample.assets(), sample.factors(), t, alphas, betas, betaErrors, r2, sigma,
                factorMean.data.clone(), omega, grs);
    }

    /**
     * P(F(d1, d2) ≥ x) = I_{d2/(d2 + d1 x)}(d2/2, d1/2), the regularized incomplete beta function
     * (Abramowitz and Stegun 1964, 26.6.2), taken directly so that small p-values keep their precision.
     */
    public static double fUpperTail(double x, int d1, int d2) {
        if (!(x > 0.0)) {
            return 1.0;
        }
        return Beta.regularizedBeta(d2 / (d2 + d1 * x), d2 / 2.0, d1 / 2.0, 1e-15, 100_000);
    }

    /** P(|t_ν| ≥ |x|) = I_{ν/(ν + x²)}(ν/2, 1/2) (Abramowitz and Stegun 1964, 26.7.1). */
    public static double tTwoSided(double x, int df) {
        if (!Double.isFinite(x)) {
            return Double.NaN;
        }
        return Beta.regularizedBeta(df / (df + x * x), df / 2.0, 0.5, 1e-15, 100_000);
    }
}
