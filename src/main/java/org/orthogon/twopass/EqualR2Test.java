package org.orthogon.twopass;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.HansenJagannathan;

/**
 * Tests that two linear factor models explain the cross-section of mean returns equally well, ρ_A² = ρ_B²
 * (Kan, Robotti and Shanken 2013, section III), on the same test assets and sample.
 *
 * <p>Write η = Ω^{-1}λ for the prices of covariance risk: the cross section on covariances C = Cov(R, f')
 * has coefficients [γ_0; η] and spans the same space as the one on betas, so ρ² is the same. Its influence
 * is Ω^{-1}(h_λ,t - ((f_t - f̄)(f_t - f̄)' - Ω̂)η̂) with h_λ,t the factor block of the robust influence of
 * {@link CrossSectionalRegression}.
 * <ul>
 *   <li><b>Nested</b> (A's factors a subset of B's): ρ_A² = ρ_B² if and only if η_2 = 0, the prices of B's
 *       extra factors. In the sample T(ρ̂_B² - ρ̂_A²) = T η̂_2'[H^C_22]^{-1}η̂_2 / Q̂_0 exactly (H^C = (X_C'WX_C)^{-1},
 *       Frisch-Waugh), which under the null converges to Σ_i ξ_i χ²_1 with ξ the eigenvalues of
 *       [H^C_22]^{-1} V(η̂_2) / Q_0; the p-value is simulated from that sum with a stated seed.</li>
 *   <li><b>Non-nested</b> (each has a factor the other lacks): when the models' pricing errors differ,
 *       √T(ρ̂_A² - ρ̂_B²) → N(0, E[(n_A,t - n_B,t)²]) with n_t the influence of ρ̂²; two-sided normal p-value.
 *       That limit degenerates when both models price the assets alike, which happens when the prices of
 *       every factor the two do not share are zero; a Wald test of that (misspecification-robust, joint
 *       over both models) is reported first, and the normal test is meaningful only when it rejects.</li>
 * </ul>
 * As in the cross sections themselves, no serial correlation is assumed.
 */
public final class EqualR2Test {
    private static final NormalDistribution NORMAL = new NormalDistribution(null, 0.0, 1.0);

    private EqualR2Test() {
    }

    /**
     * The comparison of two models.
     *
     * @param first          title of the first model (the restricted one when nested)
     * @param second         title of the second model
     * @param nested         true when the first model's factors are a subset of the second's
     * @param r2First        ρ̂² of the first model
     * @param r2Second       ρ̂² of the second model
     * @param statistic      nested: T(ρ̂²_second - ρ̂²_first); non-nested: (ρ̂²_first - ρ̂²_second)/se
     * @param pValue         nested: P(Σ ξ_i χ²_1 ≥ statistic), simulated; non-nested: two-sided normal
     * @param sameCrossSection non-nested only: the Wald test that every non-shared factor's price is zero in
     *                       both models (null when nested)
     */
    public record Result(String first, String second, boolean nested, double r2First, double r2Second,
            double statistic, double pValue, ChiSquareTest sameCrossSection) {
    }

    /**
     * Compares models A and B, each a {@link FactorSample} over the same returns; the nested case is
     * detected by factor names (either order).
     */
    public static Result compare(String titleA, FactorSample a, String titleB, FactorSample b, Weighting weighting,
            boolean intercept, long seed, int draws) {
        if (b.factors().containsAll(a.factors()) && b.factorCount() > a.factorCount()) {
            return nested(titleA, a, titleB, b, weighting, intercept, seed, draws);
        }
        if (a.factors().containsAll(b.factors()) && a.factorCount() > b.factorCount()) {
            return nested(titleB, b, titleA, a, weighting, intercept, seed, draws);
        }
        return nonNested(titleA, a, titleB, b, weighting, intercept);
    }

    private static Result nested(String titleR, FactorSample restricted, String titleU, FactorSample unrestricted,
            Weighting weighting, boolean intercept, long seed, int draws) {
        CrossSectionalRegression.Pieces r = pieces(restricted, weighting, intercept);
        CrossSectionalRegression.Pieces u = pieces(unrestricted, weighting, intercept);
        ExtraPrices extra = ExtraPrices.of(u, restricted, unrestricted);
        double statistic = u.periods * (u.r2 - r.r2);
        return new Result(titleR, titleU, true, r.r2, u.r2, statistic,
                HansenJagannathan.weightedChiSquareUpperTail(statistic, extra.limitWeights(), seed, draws), null);
    }

    /** The limit weights ξ of the nested statistic, largest first (for checks against an outside computation). */
    static double[] nestedLimitWeights(FactorSample restricted, FactorSample unrestricted, Weighting weighting,
            boolean intercept) {
        double[] weights = ExtraPrices.of(pieces(unrestricted, weighting, intercept), restricted, unrestricted)
                .limitWeights();
        java.util.Arrays.sort(weights);
        for (int i = 0; i < weights.length / 2; i++) {
            double swap = weights[i];
            weights[i] = weights[weights.length - 1 - i];
            weights[weights.length - 1 - i] = swap;
        }
        return weights;
    }

    /** T η̂_2'[H^C_22]^{-1}η̂_2 / Q̂_0 for the extra factors of a nested pair (equal to T(ρ̂_B² - ρ̂_A²) in sample). */
    static double nestedQuadraticForm(FactorSample restricted, FactorSample unrestricted, Weighting weighting,
            boolean intercept) {
        CrossSectionalRegression.Pieces u = pieces(unrestricted, weighting, intercept);
        ExtraPrices extra = ExtraPrices.of(u, restricted, unrestricted);
        return u.periods * Dense.quadratic(extra.eta2, extra.h22Inverse) / u.q0;
    }

    /** The unrestricted model's prices of its extra factors, their block of H^C and the limit of the statistic. */
    private record ExtraPrices(CrossSectionalRegression.Pieces u, double[] eta, List<Integer> extra, DMatrixRMaj eta2,
            DMatrixRMaj h22Inverse) {
        static ExtraPrices of(CrossSectionalRegression.Pieces u, FactorSample restricted, FactorSample unrestricted) {
            List<Integer> extra = new ArrayList<>();
            for (int k = 0; k < unrestricted.factorCount(); k++) {
                if (!restricted.factors().contains(unrestricted.factors().get(k))) {
                    extra.add(k);
                }
            }
            double[] eta = covariancePrices(u);
            DMatrixRMaj hc = covarianceBlock(u);
            int m = extra.size();
            DMatrixRMaj h22 = new DMatrixRMaj(m, m);
            DMatrixRMaj eta2 = new DMatrixRMaj(m, 1);
            for (int a = 0; a < m; a++) {
                eta2.set(a, eta[extra.get(a)]);
                for (int c = 0; c < m; c++) {
                    h22.set(a, c, hc.get(extra.get(a), extra.get(c)));
                }
            }
            return new ExtraPrices(u, eta, extra, eta2, Dense.inverseSymmetric(h22,
                    "the covariance-price block of (X'WX)^{-1}"));
        }

        /** ξ: the eigenvalues of [H^C_22]^{-1} V(η̂_2) / Q̂_0, V the asymptotic covariance of √T η̂_2. */
        double[] limitWeights() {
            int m = extra.size();
            int t = u.periods;
            DMatrixRMaj v22 = new DMatrixRMaj(m, m);
            for (int s = 0; s < t; s++) {
                double[] influence = etaInfluence(u, eta, s);
                for (int a = 0; a < m; a++) {
                    for (int c = 0; c < m; c++) {
                        v22.add(a, c, influence[extra.get(a)] * influence[extra.get(c)] / t);
                    }
                }
            }
            DMatrixRMaj product = Dense.multiply(h22Inverse, v22);
            CommonOps_DDRM.divide(product, u.q0);
            return eigenvalues(product);
        }
    }

    private static Result nonNested(String titleA, FactorSample a, String titleB, FactorSample b, Weighting weighting,
            boolean intercept) {
        CrossSectionalRegression.Pieces pa = pieces(a, weighting, intercept);
        CrossSectionalRegression.Pieces pb = pieces(b, weighting, intercept);
        int t = pa.periods;
        double variance = 0.0;
        for (int s = 0; s < t; s++) {
            double d = pa.r2Influence(s) - pb.r2Influence(s);
            variance += d * d;
        }
        double se = Math.sqrt(variance) / t;
        double z = (pa.r2 - pb.r2) / se;
        double pValue = 2.0 * NORMAL.cumulativeProbability(-Math.abs(z));
        // The pre-test: the prices of the factors the two models do not share, all zero in both.
        List<Integer> onlyA = new ArrayList<>();
        List<Integer> onlyB = new ArrayList<>();
        for (int k = 0; k < a.factorCount(); k++) {
            if (!b.factors().contains(a.factors().get(k))) {
                onlyA.add(k);
            }
        }
        for (int k = 0; k < b.factorCount(); k++) {
            if (!a.factors().contains(b.factors().get(k))) {
                onlyB.add(k);
            }
        }
        int m = onlyA.size() + onlyB.size();
        double[] etaA = covariancePrices(pa);
        double[] etaB = covariancePrices(pb);
        DMatrixRMaj estimate = new DMatrixRMaj(m, 1);
        for (int j = 0; j < onlyA.size(); j++) {
            estimate.set(j, etaA[onlyA.get(j)]);
        }
        for (int j = 0; j < onlyB.size(); j++) {
            estimate.set(onlyA.size() + j, etaB[onlyB.get(j)]);
        }
        DMatrixRMaj covariance = new DMatrixRMaj(m, m);
        double[] stacked = new double[m];
        for (int s = 0; s < t; s++) {
            double[] ia = etaInfluence(pa, etaA, s);
            double[] ib = etaInfluence(pb, etaB, s);
            for (int j = 0; j < onlyA.size(); j++) {
                stacked[j] = ia[onlyA.get(j)];
            }
            for (int j = 0; j < onlyB.size(); j++) {
                stacked[onlyA.size() + j] = ib[onlyB.get(j)];
            }
            for (int i = 0; i < m; i++) {
                for (int j = 0; j < m; j++) {
                    covariance.add(i, j, stacked[i] * stacked[j] / ((double) t * t));
                }
            }
        }
        double wald = Dense.quadratic(estimate, Dense.inverseSymmetric(Dense.symmetrize(covariance),
                "the covariance of the non-shared factor prices"));
        return new Result(titleA, titleB, false, pa.r2, pb.r2, z, pValue,
                ChiSquareTest.of("non-shared-prices-zero", wald, m));
    }

    private static CrossSectionalRegression.Pieces pieces(FactorSample sample, Weighting weighting, boolean intercept) {
        return CrossSectionalRegression.Pieces.of(sample, TimeSeriesRegressions.estimate(sample), weighting, intercept);
    }

    /** η̂ = Ω̂^{-1}λ̂. */
    private static double[] covariancePrices(CrossSectionalRegression.Pieces p) {
        int offset = p.intercept ? 1 : 0;
        DMatrixRMaj lambda = new DMatrixRMaj(p.factors, 1);
        for (int k = 0; k < p.factors; k++) {
            lambda.set(k, p.gamma.get(offset + k));
        }
        return Dense.multiply(p.omegaInverse, lambda).data.clone();
    }

    /** The factor block of (X_C'WX_C)^{-1} = Ω^{-1} [(X'WX)^{-1}]_λλ Ω^{-1}, since X_C = X diag(1, Ω). */
    private static DMatrixRMaj covarianceBlock(CrossSectionalRegression.Pieces p) {
        int offset = p.intercept ? 1 : 0;
        DMatrixRMaj block = new DMatrixRMaj(p.factors, p.factors);
        for (int a = 0; a < p.factors; a++) {
            for (int c = 0; c < p.factors; c++) {
                block.set(a, c, p.h.get(offset + a, offset + c));
            }
        }
        return Dense.symmetrize(Dense.multiply(Dense.multiply(p.omegaInverse, block), p.omegaInverse));
    }

    /** Ω̂^{-1}(h_λ,t - ((f_t - f̄)(f_t - f̄)' - Ω̂)η̂), the influence of η̂ in period s. */
    private static double[] etaInfluence(CrossSectionalRegression.Pieces p, double[] eta, int s) {
        int offset = p.intercept ? 1 : 0;
        double[] h = p.influence(s);
        double[] inner = new double[p.factors];
        for (int a = 0; a < p.factors; a++) {
            double value = h[offset + a];
            for (int c = 0; c < p.factors; c++) {
                double outer = p.factorDeviations.get(s, a) * p.factorDeviations.get(s, c) - p.omega.get(a, c);
                value -= outer * eta[c];
            }
            inner[a] = value;
        }
        double[] out = new double[p.factors];
        for (int a = 0; a < p.factors; a++) {
            for (int c = 0; c < p.factors; c++) {
                out[a] += p.omegaInverse.get(a, c) * inner[c];
            }
        }
        return out;
    }

    /** Eigenvalues of A (similar to a symmetric positive semi-definite matrix), negatives from rounding set to 0. */
    private static double[] eigenvalues(DMatrixRMaj a) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(a.numRows, false, false);
        if (!eig.decompose(a.copy())) {
            throw new IllegalStateException("eigen-decomposition of the nested R² limit failed");
        }
        double[] out = new double[a.numRows];
        for (int i = 0; i < out.length; i++) {
            out[i] = Math.max(eig.getEigenvalue(i).real, 0.0);
        }
        return out;
    }
}
