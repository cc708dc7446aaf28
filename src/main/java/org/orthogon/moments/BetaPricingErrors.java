package org.orthogon.moments;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;

/**
 * The beta-pricing model as one GMM system: the time-series regressions and the cross section of mean
 * returns on betas (Cochrane 2005, "Asset Pricing", revised edition, sections 12.2 and 13.3). With
 * excess returns R_t (N), factors f_t (K), ε_t = R_t - a - β f_t and, optionally, a cross-sectional
 * intercept λ_0 (a pricing error common to every asset):
 * <pre>
 *   E[R_t - λ_0 1 - β λ] = 0         N pricing moments, named by asset
 *   E[ε_t] = 0                      N moments eps_&lt;asset&gt;
 *   E[ε_t ⊗ f_t] = 0                N K moments eps_&lt;asset&gt;*&lt;factor&gt;
 * </pre>
 * Parameters, in order: lambda_0 (with the intercept), lambda_&lt;factor&gt;, a_&lt;asset&gt;, then
 * beta_&lt;asset&gt;_&lt;factor&gt; asset by asset. K_moments = N(K + 2) against P = N(K + 1) + K (+ 1):
 * N - K (- 1) overidentifying restrictions, the pricing errors α = E_T[R] - λ_0 - β λ.
 *
 * <p>S is singular by construction: at the estimate the pricing moments' deviations from their means
 * are β(f_t - f̄) + ε_t, so c'(pricing - ε) is zero in every period for each of the N - K directions c
 * with β'c = 0 (in population as in the sample). The efficient weight S^{-1} does not exist, so the
 * system is estimated with the {@link FixedSelection} a_T = [X'W 0; 0 I] (X = β or [1 β]; W = I for the
 * OLS cross section, Σ^{-1} for GLS, Σ the residual covariance with divisor T): the time-series moments
 * taken whole, which makes a and β the OLS regressions, and the pricing moments combined by X'W, which
 * makes (λ_0, λ) = (X'WX)^{-1} X'W E_T[R], the two-pass estimate (Cochrane 2005, section 12.2).
 *
 * <p>Derivatives: ∂(pricing_i)/∂λ_k = -β_ik, ∂(pricing_i)/∂λ_0 = -1, ∂(pricing_i)/∂β_ik = -λ_k;
 * ∂ε_i/∂a_i = -1, ∂ε_i/∂β_ik = -f_k; ∂(ε_i f_j)/∂a_i = -f_j, ∂(ε_i f_j)/∂β_ik = -f_k f_j. The errors
 * are bilinear in (β, λ), so {@link #isLinear()} is false. The moments price no payoff with a stochastic
 * discount factor: there is no Hansen-Jagannathan distance and no m_t.
 */
public final class BetaPricingErrors implements ObservationErrors {
    /** How the cross section weights the pricing moments. */
    public enum CrossSection {
        /** Ordinary least squares: X'. */
        OLS,
        /** Generalised least squares with the residual covariance: X'Σ^{-1}. */
        GLS;

        /** The model-file word. */
        public String id() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    /** The parameter name of the cross-sectional intercept. */
    public static final String INTERCEPT = "lambda_0";

    private final double[][] returns; // [t][i]
    private final double[][] factors; // [t][k]
    private final List<String> assets;
    private final List<String> factorNames;
    private final CrossSection crossSection;
    private final boolean intercept;
    private final List<String> parameterNames;
    private final List<String> momentNames;

    /**
     * @param excessReturns T x N excess returns of the test assets
     * @param factors       T x K factors on the same dates
     * @param assets        N names
     * @param factorNames   K names
     * @param crossSection  OLS or GLS cross section
     * @param intercept     whether the cross section has an intercept λ_0
     */
    public BetaPricingErrors(double[][] excessReturns, double[][] factors, List<String> assets,
            List<String> factorNames, CrossSection crossSection, boolean intercept) {
        MomentAlgebra.requireRows(excessReturns.length, factors.length, "returns", "factors");
        this.returns = MomentAlgebra.copyRows(excessReturns, assets.size(), "return");
        this.factors = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
        this.assets = List.copyOf(assets);
        this.factorNames = List.copyOf(factorNames);
        this.crossSection = crossSection;
        this.intercept = intercept;
        List<String> parameters = new ArrayList<>();
        if (intercept) {
            parameters.add(INTERCEPT);
        }
        parameters.addAll(MomentAlgebra.prefixed("lambda_", factorNames));
        parameters.addAll(MomentAlgebra.prefixed("a_", assets));
        for (String asset : assets) {
            parameters.addAll(MomentAlgebra.prefixed("beta_" + asset + "_", factorNames));
        }
        this.parameterNames = List.copyOf(parameters);
        List<String> moments = new ArrayList<>(assets);
        moments.addAll(MomentAlgebra.prefixed("eps_", assets));
        for (String asset : assets) {
            for (String factor : factorNames) {
                moments.add("eps_" + asset + "*" + factor);
            }
        }
        this.momentNames = List.copyOf(moments);
    }

    /** The cross-sectional weighting. */
    public CrossSection crossSection() {
        return crossSection;
    }

    /** Whether the cross section has the intercept λ_0. */
    public boolean hasIntercept() {
        return intercept;
    }

    /** The number of cross-sectional coefficients, K (+ 1 with the intercept): they come first in θ. */
    public int crossSectionCoefficients() {
        return factorNames.size() + (intercept ? 1 : 0);
    }

    @Override
    public List<String> parameterNames() {
        return parameterNames;
    }

    @Override
    public List<String> assetNames() {
        return momentNames;
    }

    @Override
    public int pricedAssets() {
        return assets.size();
    }

    @Override
    public int observations() {
        return returns.length;
    }

    @Override
    public boolean isLinear() {
        return false;
    }

    @Override
    public void errors(double[] theta, double[] out) {
        int n = assets.size();
        int k = factorNames.size();
        int q = crossSectionCoefficients();
        int width = momentNames.size();
        double level = intercept ? theta[0] : 0.0;
        int lambda = intercept ? 1 : 0;
        double[] predicted = new double[n];
        for (int i = 0; i < n; i++) {
            double value = level;
            for (int j = 0; j < k; j++) {
                value += theta[beta(i, j, q, n, k)] * theta[lambda + j];
            }
            predicted[i] = value;
        }
        for (int t = 0; t < returns.length; t++) {
            int row = t * width;
            double[] r = returns[t];
            double[] f = factors[t];
            for (int i = 0; i < n; i++) {
                out[row + i] = r[i] - predicted[i];
                double residual = r[i] - theta[q + i];
                for (int j = 0; j < k; j++) {
                    residual -= theta[beta(i, j, q, n, k)] * f[j];
                }
                out[row + n + i] = residual;
                int at = row + 2 * n + i * k;
                for (int j = 0; j < k; j++) {
                    out[at + j] = residual * f[j];
                }
            }
        }
    }

    @Override
    public void errorDerivatives(double[] theta, double[][] out) {
        int n = assets.size();
        int k = factorNames.size();
        int q = crossSectionCoefficients();
        int width = momentNames.size();
        int lambda = intercept ? 1 : 0;
        for (int t = 0; t < returns.length; t++) {
            int row = t * width;
            double[] f = factors[t];
            for (int i = 0; i < n; i++) {
                if (intercept) {
                    out[0][row + i] = -1.0;
                }
                for (int j = 0; j < k; j++) {
                    out[lambda + j][row + i] = -theta[beta(i, j, q, n, k)];
                }
                double[] ofA = out[q + i];
                ofA[row + n + i] = -1.0;
                int at = row + 2 * n + i * k;
                for (int j = 0; j < k; j++) {
                    ofA[at + j] = -f[j];
                }
                for (int j = 0; j < k; j++) {
                    double[] ofBeta = out[beta(i, j, q, n, k)];
                    ofBeta[row + i] = -theta[lambda + j];
                    ofBeta[row + n + i] = -f[j];
                    for (int l = 0; l < k; l++) {
                        ofBeta[at + l] = -f[j] * f[l];
                    }
                }
            }
        }
    }

    /** The index of β_ij in θ. */
    private static int beta(int i, int j, int q, int n, int k) {
        return q + n + i * k + j;
    }

    /** The moments price no payoff with a stochastic discount factor. */
    @Override
    public void payoffs(double[] out) {
        throw new UnsupportedOperationException("the beta-pricing system prices no payoff with a discount factor");
    }

    /** The moments come from no stochastic discount factor. */
    @Override
    public void discountFactor(double[] theta, double[] out) {
        throw new UnsupportedOperationException("the beta-pricing system has no stochastic discount factor");
    }

    /** None: the moments price no payoff with an SDF, so there is no Hansen-Jagannathan distance. */
    @Override
    public Optional<ObservationErrors> distanceErrors() {
        return Optional.empty();
    }

    @Override
    public BetaPricingErrors select(int[] rows) {
        if (rows.length < 1) {
            throw new IllegalArgumentException("a selection needs at least one row");
        }
        double[][] r = new double[rows.length][];
        double[][] f = new double[rows.length][];
        for (int s = 0; s < rows.length; s++) {
            if (rows[s] < 0 || rows[s] >= returns.length) {
                throw new IllegalArgumentException("row " + rows[s] + " is not one of the " + returns.length
                        + " observations");
            }
            r[s] = returns[rows[s]];
            f[s] = factors[rows[s]];
        }
        return new BetaPricingErrors(r, f, assets, factorNames, crossSection, intercept);
    }

    @Override
    public Optional<FixedSelection> fixedSelection() {
        return Optional.of(new Selection());
    }

    /** a_T = [X'W 0; 0 I] and its closed-form solution (see the class comment). */
    private final class Selection implements FixedSelection {
        @Override
        public String id() {
            return crossSection.id();
        }

        @Override
        public int focalParameters() {
            return crossSectionCoefficients();
        }

        @Override
        public DMatrixRMaj matrix(double[] theta) {
            int n = assets.size();
            int k = factorNames.size();
            int q = crossSectionCoefficients();
            int p = parameterNames.size();
            DMatrixRMaj x = regressors(theta);
            DMatrixRMaj xtw = weighted(x, theta);
            DMatrixRMaj a = new DMatrixRMaj(p, momentNames.size());
            CommonOps_DDRM.insert(xtw, a, 0, 0);
            for (int r = q; r < p; r++) {
                a.set(r, n + (r - q), 1.0);
            }
            return a;
        }

        @Override
        public double[] solve() {
            int n = assets.size();
            int k = factorNames.size();
            int t = returns.length;
            int q = crossSectionCoefficients();
            double[] factorMean = columnMeans(factors, k);
            double[] returnMean = columnMeans(returns, n);
            DMatrixRMaj omega = new DMatrixRMaj(k, k);
            DMatrixRMaj cross = new DMatrixRMaj(n, k);
            for (int s = 0; s < t; s++) {
                for (int j = 0; j < k; j++) {
                    double fj = factors[s][j] - factorMean[j];
                    for (int l = 0; l < k; l++) {
                        omega.add(j, l, fj * (factors[s][l] - factorMean[l]) / t);
                    }
                    for (int i = 0; i < n; i++) {
                        cross.add(i, j, (returns[s][i] - returnMean[i]) * fj / t);
                    }
                }
            }
            DMatrixRMaj beta = new DMatrixRMaj(n, k);
            CommonOps_DDRM.mult(cross, invert(omega, "the factor covariance matrix",
                    "drop a factor that is (nearly) a linear combination of the others, or use a longer sample"), beta);
            double[] theta = new double[parameterNames.size()];
            for (int i = 0; i < n; i++) {
                double a = returnMean[i];
                for (int j = 0; j < k; j++) {
                    a -= beta.get(i, j) * factorMean[j];
                    theta[q + n + i * k + j] = beta.get(i, j);
                }
                theta[q + i] = a;
            }
            DMatrixRMaj x = regressors(theta);
            DMatrixRMaj xtw = weighted(x, theta);
            DMatrixRMaj xtwx = new DMatrixRMaj(q, q);
            CommonOps_DDRM.mult(xtw, x, xtwx);
            symmetrize(xtwx);
            DMatrixRMaj xtwr = new DMatrixRMaj(q, 1);
            CommonOps_DDRM.mult(xtw, DMatrixRMaj.wrap(n, 1, returnMean), xtwr);
            DMatrixRMaj coefficients = new DMatrixRMaj(q, 1);
            CommonOps_DDRM.mult(invert(xtwx, "X'WX of the betas" + (intercept ? " and the intercept" : ""),
                    "the betas do not separate the factors' premia: drop a factor"
                            + (intercept ? " or the cross-sectional intercept" : "") + ", or add test assets whose "
                            + "betas differ"), xtwr, coefficients);
            System.arraycopy(coefficients.data, 0, theta, 0, q);
            return theta;
        }
    }

    /** X = β, or [1 β] with the intercept, at θ (N x q). */
    private DMatrixRMaj regressors(double[] theta) {
        int n = assets.size();
        int k = factorNames.size();
        int q = crossSectionCoefficients();
        DMatrixRMaj x = new DMatrixRMaj(n, q);
        int offset = intercept ? 1 : 0;
        for (int i = 0; i < n; i++) {
            if (intercept) {
                x.set(i, 0, 1.0);
            }
            for (int j = 0; j < k; j++) {
                x.set(i, offset + j, theta[beta(i, j, q, n, k)]);
            }
        }
        return x;
    }

    /** X'W: X' for the OLS cross section, X'Σ(θ)^{-1} for GLS (q x N). */
    private DMatrixRMaj weighted(DMatrixRMaj x, double[] theta) {
        DMatrixRMaj xtw = new DMatrixRMaj(x.numCols, x.numRows);
        if (crossSection == CrossSection.GLS) {
            CommonOps_DDRM.multTransA(x, invert(residualCovariance(theta), "the residual covariance Σ",
                    "drop test assets whose residuals are (nearly) linear combinations of others, use a longer "
                            + "sample, or use cross_section = \"ols\""), xtw);
        } else {
            CommonOps_DDRM.transpose(x, xtw);
        }
        return xtw;
    }

    /** Σ(θ) = (1/T) Σ_t ε_t ε_t' of the time-series residuals at θ. */
    private DMatrixRMaj residualCovariance(double[] theta) {
        int n = assets.size();
        int k = factorNames.size();
        int q = crossSectionCoefficients();
        int t = returns.length;
        DMatrixRMaj residuals = new DMatrixRMaj(t, n);
        for (int s = 0; s < t; s++) {
            for (int i = 0; i < n; i++) {
                double e = returns[s][i] - theta[q + i];
                for (int j = 0; j < k; j++) {
                    e -= theta[beta(i, j, q, n, k)] * factors[s][j];
                }
                residuals.set(s, i, e);
            }
        }
        DMatrixRMaj sigma = new DMatrixRMaj(n, n);
        CommonOps_DDRM.multTransA(residuals, residuals, sigma);
        CommonOps_DDRM.divide(sigma, t);
        symmetrize(sigma);
        return sigma;
    }

    private static double[] columnMeans(double[][] rows, int width) {
        double[] mean = new double[width];
        for (double[] row : rows) {
            for (int j = 0; j < width; j++) {
                mean[j] += row[j];
            }
        }
        for (int j = 0; j < width; j++) {
            mean[j] /= rows.length;
        }
        return mean;
    }

    private static void symmetrize(DMatrixRMaj a) {
        for (int i = 0; i < a.numRows; i++) {
            for (int j = 0; j < i; j++) {
                double mean = 0.5 * (a.get(i, j) + a.get(j, i));
                a.set(i, j, mean);
                a.set(j, i, mean);
            }
        }
    }

    /** Smallest reciprocal condition (after scaling to a unit diagonal) accepted for an inverse. */
    private static final double SINGULAR_RCOND = 1e-12;

    /**
     * The inverse of a symmetric positive-definite matrix by Cholesky after scaling to a unit diagonal;
     * refuses one whose smallest pivot ratio says it is numerically singular.
     */
    private static DMatrixRMaj invert(DMatrixRMaj a, String what, String fix) {
        int n = a.numRows;
        double[] scale = new double[n];
        for (int i = 0; i < n; i++) {
            double d = a.get(i, i);
            if (!(d > 0.0) || !Double.isFinite(d)) {
                throw new FixedSelection.Unsolvable(what + " is singular (a zero variance)", fix);
            }
            scale[i] = 1.0 / Math.sqrt(d);
        }
        DMatrixRMaj scaled = new DMatrixRMaj(n, n);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                scaled.set(i, j, a.get(i, j) * scale[i] * scale[j]);
            }
        }
        CholeskyDecomposition_F64<DMatrixRMaj> cholesky = DecompositionFactory_DDRM.chol(n, true);
        if (!cholesky.decompose(scaled.copy())) {
            throw new FixedSelection.Unsolvable(what + " is singular (not positive definite)", fix);
        }
        DMatrixRMaj lower = cholesky.getT(null);
        double smallest = Double.POSITIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            smallest = Math.min(smallest, lower.get(i, i) * lower.get(i, i));
        }
        if (!(smallest > SINGULAR_RCOND)) {
            throw new FixedSelection.Unsolvable(what + " is numerically singular (smallest pivot " + smallest
                    + " after scaling to a unit diagonal)", fix);
        }
        DMatrixRMaj inverse = new DMatrixRMaj(n, n);
        CommonOps_DDRM.invert(scaled, inverse);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                inverse.set(i, j, inverse.get(i, j) * scale[i] * scale[j]);
            }
        }
        symmetrize(inverse);
        return inverse;
    }
}
