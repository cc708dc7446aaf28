package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;

/** Confidence intervals, Wald tests of linear restrictions, the delta method and factor risk premia. */
class InferenceExtrasTest {
    private static final List<String> NAMES = List.of("b_MKT", "b_SIZE", "b_TIDE");
    private static final LongRunOptions HC = LongRunOptions.heteroskedasticityConsistent();

    private static GmmFit fit(long seed) {
        return GmmEstimator.estimate(LumenModels.linearSdf(10, 40, seed), new double[3],
                new GmmOptions(EstimationMethod.TWO_STEP, HC));
    }

    @Test
    void parsesTheRestrictionsOfTheModelFileSyntax() {
        LinearRestrictions two = LinearRestrictions.parse("b_SIZE = 0, b_TIDE = 0", NAMES);
        assertThat(two.matrix().data).containsExactly(0, 1, 0, 0, 0, 1);
        assertThat(two.values()).containsExactly(0, 0);
        LinearRestrictions difference = LinearRestrictions.parse("b_MKT - b_SIZE = 0", NAMES);
        assertThat(difference.matrix().data).containsExactly(1, -1, 0);
        LinearRestrictions mixed = LinearRestrictions.parse(" 2*b_MKT + 0.5 b_SIZE = 1 + b_TIDE - 3e-1 ", NAMES);
        assertThat(mixed.matrix().data).containsExactly(2, 0.5, -1);
        assertThat(mixed.values()[0]).isCloseTo(0.7, within(1e-15));
        LinearRestrictions beta = LinearRestrictions.parse("beta = 0.99", List.of("beta", "gamma"));
        assertThat(beta.matrix().data).containsExactly(1, 0);
        assertThat(beta.values()).containsExactly(0.99);
        assertThat(LinearRestrictions.parse("-b_TIDE + b_TIDE + b_MKT = -2", NAMES).values()).containsExactly(-2);
    }

    @Test
    void refusesBadRestrictionsWithThePosition() {
        assertThatThrownBy(() -> LinearRestrictions.parse("b_SIZ = 0", NAMES))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("unknown parameter \"b_SIZ\"").hasMessageContaining("position 1")
                .hasMessageContaining("b_SIZE");
        assertThatThrownBy(() -> LinearRestrictions.parse("b_SIZE = 0,, b_TIDE = 0", NAMES))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("position 12");
        assertThatThrownBy(() -> LinearRestrictions.parse("b_SIZE 0", NAMES))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("expected '='")
                .hasMessageContaining("position 8");
        assertThatThrownBy(() -> LinearRestrictions.parse("1 = 0", NAMES))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("involves no parameter");
        assertThatThrownBy(() -> LinearRestrictions.parse("b_MKT = 0, 2 b_MKT = 1", NAMES))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("linearly dependent");
        assertThatThrownBy(() -> LinearRestrictions.parse("b_MKT = 0 0", NAMES))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("expected ',' or the end")
                .hasMessageContaining("position 11");
    }

    @Test
    void waldTestOfOneRestrictionIsTheSquaredTStatistic() {
        // With R = e_j', W = (θ̂_j - r)² / V_jj (common practice, no source: the definition).
        GmmFit fit = fit(51L);
        ParameterEstimate size = fit.parameter("b_SIZE");
        ChiSquareTest wald = fit.waldTest("b_SIZE = 0");
        assertThat(wald.df()).isEqualTo(1);
        assertThat(wald.statistic()).isCloseTo(size.tStat() * size.tStat(), within(1e-10 * wald.statistic()));
        assertThat(wald.pValue()).isCloseTo(size.pValue(), within(1e-10));
    }

    @Test
    void jointWaldTestMatchesAHandComputation() {
        GmmFit fit = fit(52L);
        double[] b = fit.estimates();
        DMatrixRMaj v = fit.covariance();
        // "b_MKT - b_SIZE = 1, b_TIDE = 2": R θ - r = (b0 - b1 - 1, b2 - 2); R V R' by hand.
        double d0 = b[0] - b[1] - 1;
        double d1 = b[2] - 2;
        double a = v.get(0, 0) - 2 * v.get(0, 1) + v.get(1, 1);
        double c = v.get(0, 2) - v.get(1, 2);
        double e = v.get(2, 2);
        double det = a * e - c * c;
        double byHand = (e * d0 * d0 - 2 * c * d0 * d1 + a * d1 * d1) / det;
        ChiSquareTest wald = fit.waldTest("b_MKT - b_SIZE = 1, b_TIDE = 2");
        assertThat(wald.df()).isEqualTo(2);
        assertThat(wald.statistic()).isCloseTo(byHand, within(1e-9 * byHand));
        // NIST/SEMATECH e-Handbook table 1.3.6.7.4: the upper 5% point of χ²_2 is 5.991.
        assertThat(ChiSquareTest.upperTail(5.991, 2)).isCloseTo(0.05, within(1e-4));
    }

    @Test
    void confidenceIntervalsUseTheNormalQuantile() {
        GmmFit fit = fit(53L);
        // z_0.975 = 1.960 and z_0.95 = 1.645 (NIST/SEMATECH e-Handbook, table 1.3.6.7.1).
        ConfidenceInterval ci = fit.confidenceIntervals().get(1);
        ParameterEstimate p = fit.parameters().get(1);
        assertThat(ci.level()).isEqualTo(0.95);
        assertThat((ci.upper() - ci.estimate()) / p.stdError()).isCloseTo(1.960, within(5e-4));
        assertThat((ci.estimate() - ci.lower()) / p.stdError()).isCloseTo(1.960, within(5e-4));
        ConfidenceInterval ninety = fit.confidenceIntervals(0.90).get(1);
        assertThat((ninety.upper() - ninety.estimate()) / p.stdError()).isCloseTo(1.645, within(5e-4));
        assertThatThrownBy(() -> fit.confidenceIntervals(1.0)).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void deltaMethodOfALinearFunctionIsExact() {
        // h(θ) = A θ has H = A, so H V H' = A V A' (common practice, no source: the definition).
        GmmFit fit = fit(54L);
        DeltaMethod.Transformed t = DeltaMethod.apply(x -> new double[] {x[0] - 2 * x[1], 3 * x[2] + 1}, fit);
        DMatrixRMaj a = new DMatrixRMaj(new double[][] {{1, -2, 0}, {0, 0, 3}});
        DMatrixRMaj av = new DMatrixRMaj(2, 3);
        CommonOps_DDRM.mult(a, fit.covariance(), av);
        DMatrixRMaj expected = new DMatrixRMaj(2, 2);
        CommonOps_DDRM.multTransB(av, a, expected);
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                assertThat(t.covariance().get(i, j)).isCloseTo(expected.get(i, j), within(1e-8 * expected.get(i, i)));
            }
        }
        double[] b = fit.estimates();
        assertThat(t.values()).containsExactly(b[0] - 2 * b[1], 3 * b[2] + 1);
    }

    @Test
    void deltaMethodOfARatioMatchesTheAnalyticGradient() {
        // h = θ0/θ2: ∇h = (1/θ2, 0, -θ0/θ2²) (common practice, no source).
        GmmFit fit = fit(55L);
        double[] b = fit.estimates();
        DMatrixRMaj v = fit.covariance();
        double[] grad = {1 / b[2], 0, -b[0] / (b[2] * b[2])};
        double var = 0.0;
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                var += grad[i] * v.get(i, j) * grad[j];
            }
        }
        double se = DeltaMethod.apply(x -> new double[] {x[0] / x[2]}, fit).standardErrors()[0];
        assertThat(se).isCloseTo(Math.sqrt(var), within(1e-7 * Math.sqrt(var)));
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {61L, 62L})
    void numericalMeanJacobianAgreesWithTheAnalyticOne(long seed) {
        // Power utility with instruments, whose analytic D is in moments/ (common practice, no source).
        Random random = new Random(seed);
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 20, seed);
        int quarters = sample.quarters().size();
        double[][] gross = new double[quarters][4];
        double[][] z = new double[quarters][2];
        for (int q = 0; q < quarters; q++) {
            for (int i = 0; i < 4; i++) {
                gross[q][i] = 1.0 + sample.portfolioReturns()[3 * q][i];
            }
            z[q][0] = 1.0;
            z[q][1] = random.nextGaussian();
        }
        MomentModel model = ScaledMoments.scaled(new PowerUtilityErrors(gross, sample.consumptionGrowth(),
                economy.portfolioNames().subList(0, 4)), z, List.of("const", "z"));
        double[] theta = {0.98, 5.0 + random.nextDouble()};
        DMatrixRMaj analytic = model.meanJacobian(theta);
        DMatrixRMaj numerical = NumericalDerivatives.meanJacobian(model, theta);
        for (int i = 0; i < analytic.numRows; i++) {
            for (int p = 0; p < 2; p++) {
                assertThat(numerical.get(i, p)).isCloseTo(analytic.get(i, p),
                        within(1e-8 * Math.max(1.0, Math.abs(analytic.get(i, p)))));
            }
        }
    }

    @Test
    void riskPremiaWithGivenCovarianceAreSigmaTimesB() {
        MomentModel model = LumenModels.linearSdf(10, 40, 56L);
        GmmFit fit = GmmEstimator.estimate(model, new double[3], new GmmOptions(EstimationMethod.TWO_STEP, HC));
        double[][] factors = LumenSimulator.simulate(LumenEconomy.standard(), 1962, 40, 56L).factors();
        DeltaMethod.Transformed lambda = RiskPremia.withGivenCovariance(factors, fit, NAMES);
        DMatrixRMaj sigma = RiskPremia.covariance(factors);
        DMatrixRMaj b = DMatrixRMaj.wrap(3, 1, fit.estimates());
        DMatrixRMaj expected = new DMatrixRMaj(3, 1);
        CommonOps_DDRM.mult(sigma, b, expected);
        DMatrixRMaj sv = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.mult(sigma, fit.covariance(), sv);
        DMatrixRMaj var = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.mult(sv, sigma, var);
        for (int k = 0; k < 3; k++) {
            assertThat(lambda.values()[k]).isCloseTo(expected.get(k), within(1e-14));
            assertThat(lambda.standardErrors()[k]).isCloseTo(Math.sqrt(var.get(k, k)),
                    within(1e-7 * Math.sqrt(var.get(k, k))));
        }
    }

    @Test
    void riskPremiaWithEstimatedCovarianceMatchAHandBuiltStackedDeltaMethod() {
        // Independent build of the same formula: influence functions of b̂ (efficient: -(D'S^{-1}D)^{-1}D'S^{-1} f_t)
        // and of Σ̂ (vech of demeaned outer products), their HC covariance, and the analytic gradient of Σ b.
        MomentModel model = LumenModels.linearSdf(10, 40, 57L);
        GmmFit fit = GmmEstimator.estimate(model, new double[3], new GmmOptions(EstimationMethod.TWO_STEP, HC));
        double[][] factors = LumenSimulator.simulate(LumenEconomy.standard(), 1962, 40, 57L).factors();
        DeltaMethod.Transformed lambda = RiskPremia.withEstimatedCovariance(factors, model, fit, NAMES);
        DeltaMethod.Transformed given = RiskPremia.withGivenCovariance(factors, fit, NAMES);

        int t = model.observations();
        double[] b = fit.estimates();
        DMatrixRMaj d = model.meanJacobian(b);
        DMatrixRMaj sInv = new DMatrixRMaj(10, 10);
        CommonOps_DDRM.invert(fit.longRun().covariance(), sInv);
        DMatrixRMaj dts = new DMatrixRMaj(3, 10);
        CommonOps_DDRM.multTransA(d, sInv, dts);
        DMatrixRMaj info = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.mult(dts, d, info);
        CommonOps_DDRM.invert(info);
        DMatrixRMaj a = new DMatrixRMaj(3, 10);
        CommonOps_DDRM.mult(info, dts, a);
        DMatrixRMaj f = model.contributions(b);
        DMatrixRMaj sigma = RiskPremia.covariance(factors);
        double[] mean = new double[3];
        for (double[] row : factors) {
            for (int k = 0; k < 3; k++) {
                mean[k] += row[k] / t;
            }
        }
        int[][] pairs = {{0, 0}, {0, 1}, {0, 2}, {1, 1}, {1, 2}, {2, 2}};
        double[][] psi = new double[t][9];
        double[] psiMean = new double[9];
        for (int s = 0; s < t; s++) {
            for (int k = 0; k < 3; k++) {
                for (int c = 0; c < 10; c++) {
                    psi[s][k] -= a.get(k, c) * f.get(s, c);
                }
            }
            for (int q = 0; q < 6; q++) {
                int i = pairs[q][0];
                int j = pairs[q][1];
                psi[s][3 + q] = (factors[s][i] - mean[i]) * (factors[s][j] - mean[j]) - sigma.get(i, j);
            }
            for (int c = 0; c < 9; c++) {
                psiMean[c] += psi[s][c] / t;
            }
        }
        double[][] omega = new double[9][9];
        for (double[] row : psi) {
            for (int i = 0; i < 9; i++) {
                for (int j = 0; j < 9; j++) {
                    omega[i][j] += (row[i] - psiMean[i]) * (row[j] - psiMean[j]) / t / t;
                }
            }
        }
        // ∂λ_k/∂b_l = σ_kl; ∂λ_k/∂σ_ij = b_j [k = i] + b_i [k = j] for i < j, b_k for i = j = k.
        double[][] grad = new double[3][9];
        for (int k = 0; k < 3; k++) {
            for (int l = 0; l < 3; l++) {
                grad[k][l] = sigma.get(k, l);
            }
            for (int q = 0; q < 6; q++) {
                int i = pairs[q][0];
                int j = pairs[q][1];
                if (i == j) {
                    grad[k][3 + q] = k == i ? b[i] : 0.0;
                } else {
                    grad[k][3 + q] = (k == i ? b[j] : 0.0) + (k == j ? b[i] : 0.0);
                }
            }
        }
        for (int k = 0; k < 3; k++) {
            double var = 0.0;
            for (int i = 0; i < 9; i++) {
                for (int j = 0; j < 9; j++) {
                    var += grad[k][i] * omega[i][j] * grad[k][j];
                }
            }
            assertThat(lambda.standardErrors()[k]).as("se λ_%d", k).isCloseTo(Math.sqrt(var),
                    within(1e-6 * Math.sqrt(var)));
            assertThat(lambda.values()[k]).isCloseTo(given.values()[k], within(1e-14));
        }
    }
}
