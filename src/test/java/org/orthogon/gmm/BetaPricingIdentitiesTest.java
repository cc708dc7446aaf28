package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.BetaPricingErrors;
import org.orthogon.moments.FixedSelection;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

/**
 * Identities of GMM with a fixed selection and of the beta-pricing system.
 * <ul>
 *   <li>With a = D'W the selection formulas are the one-step sandwich and the one-step covariance of the
 *       moments (Hansen 1982, Theorem 3.1 and Lemma 4.1: the estimate solves D'W g = 0).</li>
 *   <li>With S replaced by its i.i.d., conditionally homoskedastic form (E[ε ε' | f] = Σ), the covariance of
 *       (λ_0, λ) is Shanken's (1992, "On the estimation of beta-pricing models", Review of Financial Studies
 *       5, Theorem 1) errors-in-variables formula (1 + λ'Ω^{-1}λ) H X'WΣWX H / T + [0 0; 0 Ω/T], H =
 *       (X'WX)^{-1}, and the test of the pricing errors is Shanken's cross-sectional test
 *       T α'[(1 + λ'Ω^{-1}λ)(I - XHX'W) Σ (I - XHX'W)']^+ α (Cochrane 2005, "Asset Pricing", revised
 *       edition, section 12.2, which shows both from the GMM formulas; from memory). Σ and Ω are the
 *       residual and factor covariances with divisor T, all at the estimate, so the agreement is exact up to
 *       rounding.</li>
 *   <li>S is singular by construction: it has N - K null eigenvalues (in the sample, since the pricing
 *       moments' deviations are β(f_t - f̄) + ε_t).</li>
 * </ul>
 */
class BetaPricingIdentitiesTest {
    private static final int T = 240;
    private static final int N = 7;
    private static final int K = 2;

    @Test
    void theSelectionFormulasWithAEqualToDPrimeWAreTheSandwich() {
        Random random = new Random(3);
        int k = 9;
        int p = 3;
        DMatrixRMaj d = randomMatrix(random, k, p);
        DMatrixRMaj w = positiveDefinite(random, k);
        DMatrixRMaj s = positiveDefinite(random, k);
        DMatrixRMaj a = new DMatrixRMaj(p, k);
        CommonOps_DDRM.multTransA(d, w, a);
        assertClose(Inference.selectionCovariance(d, a, s, 50), Inference.sandwichCovariance(d, w, s, 50), 1e-12);
        assertClose(Inference.selectionErrorCovariance(d, a, s, 50), Inference.pricingErrorCovariance(d, w, s, 50),
                1e-12);
    }

    @ParameterizedTest(name = "{0} cross section, intercept {1}")
    @CsvSource({"OLS, false", "OLS, true", "GLS, false", "GLS, true"})
    void withTheIidHomoskedasticSTheGmmCovarianceIsShankens(BetaPricingErrors.CrossSection weighting,
            boolean intercept) {
        Panel panel = new Panel(17);
        BetaPricingErrors errors = new BetaPricingErrors(panel.returns, panel.factors, names("P", N), names("F", K),
                weighting, intercept);
        MomentModel model = ScaledMoments.unscaled(errors);
        FixedSelection selection = model.fixedSelection().orElseThrow();
        double[] theta = selection.solve();
        int q = errors.crossSectionCoefficients();
        DMatrixRMaj beta = new DMatrixRMaj(N, K);
        for (int i = 0; i < N; i++) {
            for (int j = 0; j < K; j++) {
                beta.set(i, j, theta[q + N + i * K + j]);
            }
        }
        double[] lambda = new double[K];
        System.arraycopy(theta, intercept ? 1 : 0, lambda, 0, K);
        Moments m = new Moments(panel, theta, q);

        DMatrixRMaj sIid = iidLongRun(beta, m);
        DMatrixRMaj d = model.meanJacobian(theta);
        DMatrixRMaj a = selection.matrix(theta);
        DMatrixRMaj gmm = Inference.selectionCovariance(d, a, sIid, T);

        // Shanken (1992) from the formula, with the same Σ, Ω and β.
        DMatrixRMaj x = new DMatrixRMaj(N, q);
        for (int i = 0; i < N; i++) {
            if (intercept) {
                x.set(i, 0, 1.0);
            }
            for (int j = 0; j < K; j++) {
                x.set(i, q - K + j, beta.get(i, j));
            }
        }
        DMatrixRMaj w = weighting == BetaPricingErrors.CrossSection.OLS ? CommonOps_DDRM.identity(N) : inverse(m.sigma);
        DMatrixRMaj xtw = multTransA(x, w);
        DMatrixRMaj h = inverse(mult(xtw, x));
        DMatrixRMaj hxtw = mult(h, xtw);
        DMatrixRMaj shanken = mult(mult(hxtw, m.sigma), transpose(hxtw));
        DMatrixRMaj omegaInverse = inverse(m.omega);
        double c = quadratic(lambda, omegaInverse);
        CommonOps_DDRM.scale((1.0 + c) / T, shanken);
        for (int j = 0; j < K; j++) {
            for (int l = 0; l < K; l++) {
                shanken.add(q - K + j, q - K + l, m.omega.get(j, l) / T);
            }
        }
        DMatrixRMaj block = CommonOps_DDRM.extract(gmm, 0, q, 0, q);
        assertClose(block, shanken, 1e-10);

        // Shanken's cross-sectional test of the pricing errors, against the system's pseudo-inverse test.
        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj errorCovariance = Inference.selectionErrorCovariance(d, a, sIid, T);
        double gmmTest = Inference.jointPricingStatistic(g, errorCovariance, N - q);
        DMatrixRMaj residualMaker = CommonOps_DDRM.identity(N);
        CommonOps_DDRM.multAdd(-1.0, x, hxtw, residualMaker);
        DMatrixRMaj alphaCovariance = mult(mult(residualMaker, m.sigma), transpose(residualMaker));
        CommonOps_DDRM.scale((1.0 + c) / T, alphaCovariance);
        DMatrixRMaj alpha = CommonOps_DDRM.extract(g, 0, N, 0, 1);
        double shankenTest = Inference.jointPricingStatistic(alpha, alphaCovariance, N - q);
        assertThat(gmmTest).isCloseTo(shankenTest, org.assertj.core.api.Assertions.within(1e-9 * shankenTest));
        assertThat(shankenTest).isGreaterThan(0.0);
    }

    @Test
    void sIsSingularByConstructionAndOnlyOneStepIsAccepted() {
        Panel panel = new Panel(29);
        BetaPricingErrors errors = new BetaPricingErrors(panel.returns, panel.factors, names("P", N), names("F", K),
                BetaPricingErrors.CrossSection.OLS, false);
        MomentModel model = ScaledMoments.unscaled(errors);
        double[] theta = model.fixedSelection().orElseThrow().solve();
        DMatrixRMaj s = GmmEstimator.longRun(model, theta, LongRunOptions.heteroskedasticityConsistent()).covariance();
        double[] eigen = eigenvalues(s);
        double largest = eigen[eigen.length - 1];
        int zero = 0;
        for (double value : eigen) {
            if (Math.abs(value) < 1e-12 * largest) {
                zero++;
            }
        }
        assertThat(zero).isEqualTo(N - K);
        assertThat(eigen[N - K]).isGreaterThan(1e-6 * largest);
        for (EstimationMethod method : List.of(EstimationMethod.TWO_STEP, EstimationMethod.ITERATED,
                EstimationMethod.CONTINUOUSLY_UPDATED)) {
            assertThatThrownBy(() -> GmmEstimator.estimate(model, new double[model.parameterCount()],
                    new GmmOptions(method, LongRunOptions.heteroskedasticityConsistent())))
                    .isInstanceOf(EstimationException.class).hasMessageContaining("singular by construction");
        }
        GmmFit fit = GmmEstimator.estimate(model, new double[model.parameterCount()],
                new GmmOptions(EstimationMethod.ONE_STEP, LongRunOptions.heteroskedasticityConsistent()));
        assertThat(fit.estimates()).containsExactly(theta);
        assertThat(fit.pricingErrorsJoint().df()).isEqualTo(N - K);
        assertThat(fit.hj()).isEmpty();
    }

    /** S under i.i.d. draws with E[ε | f] = 0 and E[εε' | f] = Σ, in the system's moment order. */
    private static DMatrixRMaj iidLongRun(DMatrixRMaj beta, Moments m) {
        int width = N * (K + 2);
        DMatrixRMaj s = new DMatrixRMaj(width, width);
        DMatrixRMaj priced = mult(mult(beta, m.omega), transpose(beta));
        CommonOps_DDRM.addEquals(priced, m.sigma);
        CommonOps_DDRM.insert(priced, s, 0, 0);
        for (int i = 0; i < N; i++) {
            for (int j = 0; j < N; j++) {
                double sij = m.sigma.get(i, j);
                // pricing and ε: Σ; ε and ε: Σ
                s.set(i, N + j, sij);
                s.set(N + i, j, sij);
                s.set(N + i, N + j, sij);
                for (int k = 0; k < K; k++) {
                    // (pricing or ε) with ε_j f_k: Σ_ij E[f_k]
                    double withMean = sij * m.factorMean[k];
                    s.set(i, 2 * N + j * K + k, withMean);
                    s.set(2 * N + j * K + k, i, withMean);
                    s.set(N + i, 2 * N + j * K + k, withMean);
                    s.set(2 * N + j * K + k, N + i, withMean);
                    for (int l = 0; l < K; l++) {
                        s.set(2 * N + i * K + k, 2 * N + j * K + l, sij * m.secondMoments.get(k, l));
                    }
                }
            }
        }
        return s;
    }

    /** Residual covariance Σ, factor covariance Ω (divisor T), factor means and E[ff'] at the estimate. */
    private static final class Moments {
        final DMatrixRMaj sigma = new DMatrixRMaj(N, N);
        final DMatrixRMaj omega = new DMatrixRMaj(K, K);
        final DMatrixRMaj secondMoments = new DMatrixRMaj(K, K);
        final double[] factorMean = new double[K];

        Moments(Panel panel, double[] theta, int q) {
            for (double[] f : panel.factors) {
                for (int k = 0; k < K; k++) {
                    factorMean[k] += f[k] / T;
                }
            }
            for (int t = 0; t < T; t++) {
                double[] f = panel.factors[t];
                double[] e = new double[N];
                for (int i = 0; i < N; i++) {
                    e[i] = panel.returns[t][i] - theta[q + i];
                    for (int k = 0; k < K; k++) {
                        e[i] -= theta[q + N + i * K + k] * f[k];
                    }
                }
                for (int i = 0; i < N; i++) {
                    for (int j = 0; j < N; j++) {
                        sigma.add(i, j, e[i] * e[j] / T);
                    }
                }
                for (int k = 0; k < K; k++) {
                    for (int l = 0; l < K; l++) {
                        omega.add(k, l, (f[k] - factorMean[k]) * (f[l] - factorMean[l]) / T);
                        secondMoments.add(k, l, f[k] * f[l] / T);
                    }
                }
            }
        }
    }

    /** Seeded excess returns R = 0.001 + β f + ε with two factors and heteroskedastic-looking scales. */
    private static final class Panel {
        final double[][] returns = new double[T][N];
        final double[][] factors = new double[T][K];

        Panel(long seed) {
            Random random = new Random(seed);
            double[][] loadings = new double[N][K];
            for (int i = 0; i < N; i++) {
                for (int k = 0; k < K; k++) {
                    loadings[i][k] = 0.5 + random.nextDouble();
                }
            }
            for (int t = 0; t < T; t++) {
                for (int k = 0; k < K; k++) {
                    factors[t][k] = 0.005 + 0.04 * random.nextGaussian();
                }
                for (int i = 0; i < N; i++) {
                    double r = 0.001 + 0.02 * random.nextGaussian();
                    for (int k = 0; k < K; k++) {
                        r += loadings[i][k] * factors[t][k];
                    }
                    returns[t][i] = r;
                }
            }
        }
    }

    private static List<String> names(String prefix, int count) {
        List<String> names = new ArrayList<>();
        for (int i = 1; i <= count; i++) {
            names.add(prefix + i);
        }
        return names;
    }

    private static double[] eigenvalues(DMatrixRMaj symmetric) {
        var eig = org.ejml.dense.row.factory.DecompositionFactory_DDRM.eig(symmetric.numRows, false, true);
        assertThat(eig.decompose(symmetric.copy())).isTrue();
        double[] values = new double[symmetric.numRows];
        for (int i = 0; i < values.length; i++) {
            values[i] = eig.getEigenvalue(i).real;
        }
        java.util.Arrays.sort(values);
        return values;
    }

    private static DMatrixRMaj randomMatrix(Random random, int rows, int cols) {
        DMatrixRMaj m = new DMatrixRMaj(rows, cols);
        for (int i = 0; i < m.data.length; i++) {
            m.data[i] = random.nextGaussian();
        }
        return m;
    }

    private static DMatrixRMaj positiveDefinite(Random random, int n) {
        DMatrixRMaj root = randomMatrix(random, n, n);
        DMatrixRMaj out = multTransA(root, root);
        for (int i = 0; i < n; i++) {
            out.add(i, i, 0.5);
        }
        return out;
    }

    private static DMatrixRMaj mult(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numRows, b.numCols);
        CommonOps_DDRM.mult(a, b, out);
        return out;
    }

    private static DMatrixRMaj multTransA(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numCols, b.numCols);
        CommonOps_DDRM.multTransA(a, b, out);
        return out;
    }

    private static DMatrixRMaj transpose(DMatrixRMaj a) {
        return CommonOps_DDRM.transpose(a, null);
    }

    private static DMatrixRMaj inverse(DMatrixRMaj a) {
        DMatrixRMaj out = a.copy();
        assertThat(CommonOps_DDRM.invert(out)).isTrue();
        return out;
    }

    private static double quadratic(double[] x, DMatrixRMaj m) {
        double sum = 0.0;
        for (int i = 0; i < x.length; i++) {
            for (int j = 0; j < x.length; j++) {
                sum += x[i] * m.get(i, j) * x[j];
            }
        }
        return sum;
    }

    private static void assertClose(DMatrixRMaj actual, DMatrixRMaj expected, double relative) {
        double scale = CommonOps_DDRM.elementMaxAbs(expected);
        for (int i = 0; i < expected.getNumElements(); i++) {
            assertThat(Math.abs(actual.data[i] - expected.data[i])).as("element %d", i)
                    .isLessThanOrEqualTo(relative * scale);
        }
    }
}
