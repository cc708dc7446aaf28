package org.orthogon.twopass;

import java.util.List;
import org.ejml.data.DMatrixRMaj;

/**
 * The first pass: each test asset's excess return regressed on a constant and the factors over the
 * whole sample, R^e_{t,i} = α_i + β_i'f_t + ε_{t,i}.
 *
 * @param assets             N names
 * @param factors            K names
 * @param observations       T
 * @param alphas             one per asset
 * @param betas              N x K, row i the loadings β_i'
 * @param betaStdErrors      N x K ordinary least-squares standard errors of the loadings
 * @param r2                 each regression's R²
 * @param residualCovariance Σ = (1/T) Σ_t ε_t ε_t', N x N
 * @param factorMeans        μ = f̄, K values
 * @param factorCovariance   Ω = (1/T) Σ_t (f_t - f̄)(f_t - f̄)', K x K
 * @param grs                the joint test that every alpha is zero
 */
public record TimeSeriesFit(List<String> assets, List<String> factors, int observations, List<Alpha> alphas,
        double[][] betas, double[][] betaStdErrors, double[] r2, DMatrixRMaj residualCovariance, double[] factorMeans,
        DMatrixRMaj factorCovariance, GrsTest grs) {

    public TimeSeriesFit {
        assets = List.copyOf(assets);
        factors = List.copyOf(factors);
        alphas = List.copyOf(alphas);
        betas = deepCopy(betas);
        betaStdErrors = deepCopy(betaStdErrors);
        r2 = r2.clone();
        residualCovariance = residualCovariance.copy();
        factorMeans = factorMeans.clone();
        factorCovariance = factorCovariance.copy();
    }

    @Override
    public double[][] betas() {
        return deepCopy(betas);
    }

    @Override
    public double[][] betaStdErrors() {
        return deepCopy(betaStdErrors);
    }

    @Override
    public double[] r2() {
        return r2.clone();
    }

    @Override
    public DMatrixRMaj residualCovariance() {
        return residualCovariance.copy();
    }

    @Override
    public double[] factorMeans() {
        return factorMeans.clone();
    }

    @Override
    public DMatrixRMaj factorCovariance() {
        return factorCovariance.copy();
    }

    private static double[][] deepCopy(double[][] rows) {
        double[][] out = new double[rows.length][];
        for (int i = 0; i < rows.length; i++) {
            out[i] = rows[i].clone();
        }
        return out;
    }
}
