package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * The cheaper routes of the inference against the textbook formulas they replace: the pricing-error
 * covariance expanded in O(K² P), the joint test through the known null space, the inversion that
 * certifies its condition number from a bound, and the estimate at each level of detail.
 */
class FastInferenceTest {
    private static final LongRunOptions BARTLETT = LongRunOptions.bartlettLags(4);

    /** A one-step (identity-weight) setting: W is not S^{-1}, so no term of the formulas cancels. */
    private record Setting(DMatrixRMaj g, DMatrixRMaj d, DMatrixRMaj weight, DMatrixRMaj s, int t) {
    }

    private static Setting oneStep(int assets, long seed) {
        MomentModel model = LumenModels.linearSdf(assets, 40, seed);
        DMatrixRMaj weight = CommonOps_DDRM.identity(assets);
        double[] theta = WeightedMinimizer.closedForm(model, weight).theta();
        DMatrixRMaj s = GmmEstimator.longRun(model, theta, BARTLETT).covariance();
        return new Setting(model.meanMoments(theta), model.meanJacobian(theta), weight, s, model.observations());
    }

    @Test
    void pricingErrorCovarianceEqualsTheAnnihilatorSandwich() {
        // (1/T)(I - D(D'WD)^{-1}D'W) S (I - D(D'WD)^{-1}D'W)' (Hansen 1982, Lemma 4.1), formed here with
        // the two K x K products
        Setting c = oneStep(12, 41L);
        int k = c.d().numRows;
        DMatrixRMaj bread = new DMatrixRMaj(3, 3);
        DMatrixRMaj dtw = new DMatrixRMaj(3, k);
        CommonOps_DDRM.multTransA(c.d(), c.weight(), dtw);
        CommonOps_DDRM.mult(dtw, c.d(), bread);
        CommonOps_DDRM.invert(bread);
        DMatrixRMaj temp = new DMatrixRMaj(k, 3);
        CommonOps_DDRM.mult(c.d(), bread, temp);
        DMatrixRMaj annihilator = CommonOps_DDRM.identity(k);
        CommonOps_DDRM.multAdd(-1.0, temp, dtw, annihilator);
        DMatrixRMaj as = new DMatrixRMaj(k, k);
        CommonOps_DDRM.mult(annihilator, c.s(), as);
        DMatrixRMaj expected = new DMatrixRMaj(k, k);
        CommonOps_DDRM.multTransB(as, annihilator, expected);
        CommonOps_DDRM.divide(expected, c.t());

        DMatrixRMaj actual = Inference.pricingErrorCovariance(c.d(), c.weight(), c.s(), c.t());
        double scale = CommonOps_DDRM.elementMaxAbs(expected);
        for (int i = 0; i < k * k; i++) {
            assertThat(actual.data[i]).isCloseTo(expected.data[i], within(1e-12 * scale));
        }
    }

    @Test
    void jointTestThroughTheNullSpaceEqualsTheEigenvaluePseudoInverse() {
        // g' Var(g)^+ g over the K - P largest eigenvalues (Cochrane 2005, equation 11.17)
        for (long seed : new long[] {42L, 43L, 44L}) {
            Setting c = oneStep(10, seed);
            DMatrixRMaj v = Inference.pricingErrorCovariance(c.d(), c.weight(), c.s(), c.t());
            double byEigenvalues = Inference.jointPricingStatistic(c.g(), v, 7);
            double byNullSpace = Inference.jointPricingStatistic(c.g(), v, 7, c.d(), c.weight());
            assertThat(byNullSpace).isCloseTo(byEigenvalues, within(1e-9 * byEigenvalues));
        }
    }

    @Test
    void inversionWithoutTheEigenvaluesGivesTheSameInverseAndRefusesTheSameMatrices() {
        Setting c = oneStep(12, 45L);
        DMatrixRMaj inverse = Matrices.invertSymmetric(c.s(), "S");
        DMatrixRMaj product = new DMatrixRMaj(12, 12);
        CommonOps_DDRM.mult(c.s(), inverse, product);
        for (int i = 0; i < 12; i++) {
            for (int j = 0; j < 12; j++) {
                assertThat(product.get(i, j)).isCloseTo(i == j ? 1.0 : 0.0, within(1e-9));
            }
        }
        // a repeated row and column: scaled condition number 0, refused with its value in the message
        DMatrixRMaj singular = new DMatrixRMaj(new double[][] {{2, 1, 2}, {1, 3, 1}, {2, 1, 2}});
        assertThatThrownBy(() -> Matrices.invertSymmetric(singular, "the test matrix"))
                .isInstanceOf(Matrices.SingularMatrixException.class)
                .hasMessageStartingWith("the test matrix is numerically singular");
        // condition number 1e15 after scaling: below the 1e-13 threshold although Cholesky succeeds
        DMatrixRMaj nearly = new DMatrixRMaj(new double[][] {{1, 1 - 1e-15 * 2}, {1 - 1e-15 * 2, 1}});
        assertThatThrownBy(() -> Matrices.invertSymmetric(nearly, "the nearly singular matrix"))
                .isInstanceOf(Matrices.SingularMatrixException.class);
        // condition number 1e11: accepted, by the exact eigenvalues since the bound is too loose there
        DMatrixRMaj illConditioned = new DMatrixRMaj(new double[][] {{1, 1 - 2e-11}, {1 - 2e-11, 1}});
        // 1/(1 - a²) with a = 1 - 2e-11; accurate to about the condition number times the rounding of a
        assertThat(Matrices.invertSymmetric(illConditioned, "ill").get(0, 0)).isCloseTo(2.5e10, within(2.5e5));
    }

    @Test
    void symmetricConditionNumberEqualsTheSingularValueRatio() {
        Setting c = oneStep(12, 46L);
        assertThat(Matrices.symmetricReciprocalCondition(c.s()))
                .isCloseTo(Matrices.reciprocalCondition(c.s()), within(1e-12));
    }

    @Test
    void everyLevelOfDetailComputesTheSameNumbers() {
        MomentModel model = LumenModels.linearSdf(12, 40, 47L);
        for (EstimationMethod method : new EstimationMethod[] {EstimationMethod.ONE_STEP, EstimationMethod.TWO_STEP}) {
            GmmOptions options = new GmmOptions(method, BARTLETT);
            GmmFit full = GmmEstimator.estimate(model, new double[3], options, GmmEstimator.Detail.FULL);
            GmmFit noHj = GmmEstimator.estimate(model, new double[3], options,
                    GmmEstimator.Detail.WITHOUT_HJ_DISTANCE);
            GmmFit estimates = GmmEstimator.estimate(model, new double[3], options, GmmEstimator.Detail.ESTIMATES);
            assertThat(full.hjDistance()).isNotNull();
            assertThat(noHj.hjDistance()).isNull();
            assertThat(noHj.warnings()).isEqualTo(full.warnings());
            assertThat(noHj.overidentification()).isEqualTo(full.overidentification());
            assertThat(noHj.pricingErrors()).isEqualTo(full.pricingErrors());
            assertThat(estimates.estimates()).containsExactly(full.estimates());
            assertThat(estimates.covariance().data).containsExactly(full.covariance().data);
            assertThat(estimates.pricingErrors()).isEmpty();
            assertThat(estimates.hjDistance()).isNull();
            if (method.isEfficient()) {
                assertThat(estimates.overidentification()).isEqualTo(full.overidentification());
            } else {
                assertThat(estimates.overidentification().statistic()).isNaN();
            }
        }
    }
}
