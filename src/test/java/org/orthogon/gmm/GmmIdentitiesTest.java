package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;

/** Closed-form identities of GMM that any correct implementation satisfies. */
class GmmIdentitiesTest {
    private static final GmmOptions TWO_STEP_BARTLETT = new GmmOptions(EstimationMethod.TWO_STEP,
            LongRunOptions.bartlettLags(4));

    /** Excess returns and factors from a short simulated Lumen sample. */
    private static MomentModel linearModel(int assets, long seed) {
        return LumenModels.linearSdf(assets, 40, seed);
    }

    @Test
    void exactlyIdentifiedLinearSdfHasZeroJ() {
        // K = P: the estimate sets every moment to zero, so J = 0 (Hansen 1982; common practice).
        GmmFit fit = GmmEstimator.estimate(linearModel(3, 11L), new double[3], TWO_STEP_BARTLETT);
        assertThat(fit.overidentification().df()).isZero();
        assertThat(fit.overidentification().statistic()).isCloseTo(0.0, within(1e-10));
        for (PricingError error : fit.pricingErrors()) {
            assertThat(error.error()).isCloseTo(0.0, within(1e-12));
        }
    }

    @Test
    void closedFormOfTheLinearSdfMatchesAHandComputationAndTheNumericalSolver() {
        MomentModel model = linearModel(12, 12L);
        int k = model.momentCount();
        DMatrixRMaj weight = CommonOps_DDRM.identity(k);
        double[] closed = WeightedMinimizer.closedForm(model, weight).theta();

        // b = (C'C)^{-1} C'd with d = mean R^e and C = mean R^e F' (Cochrane 2005, eq. 13.5), computed here
        // directly from the contributions at b = 0 and at unit vectors, independently of the estimator.
        DMatrixRMaj d = model.meanMoments(new double[3]);
        DMatrixRMaj c = new DMatrixRMaj(k, 3);
        for (int j = 0; j < 3; j++) {
            double[] unit = new double[3];
            unit[j] = 1.0;
            DMatrixRMaj g = model.meanMoments(unit);
            for (int i = 0; i < k; i++) {
                c.set(i, j, d.get(i) - g.get(i));
            }
        }
        DMatrixRMaj ctc = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.multTransA(c, c, ctc);
        DMatrixRMaj ctd = new DMatrixRMaj(3, 1);
        CommonOps_DDRM.multTransA(c, d, ctd);
        DMatrixRMaj byHand = new DMatrixRMaj(3, 1);
        CommonOps_DDRM.solve(ctc, ctd, byHand);

        double[] numerical = WeightedMinimizer.levenbergMarquardt(model, weight, new double[] {0.5, 0.5, 0.5}).theta();
        for (int j = 0; j < 3; j++) {
            assertThat(closed[j]).isCloseTo(byHand.get(j), within(1e-10 * Math.abs(byHand.get(j))));
            assertThat(numerical[j]).as("Levenberg-Marquardt vs closed form, b_%d", j)
                    .isCloseTo(closed[j], within(1e-8 * Math.max(1.0, Math.abs(closed[j]))));
        }
    }

    @Test
    void closedFormMatchesTheNumericalSolverWithAnEfficientWeight() {
        MomentModel model = linearModel(12, 13L);
        double[] first = WeightedMinimizer.closedForm(model, CommonOps_DDRM.identity(12)).theta();
        DMatrixRMaj s = GmmEstimator.longRun(model, first, LongRunOptions.bartlettLags(4)).covariance();
        DMatrixRMaj weight = new DMatrixRMaj(12, 12);
        CommonOps_DDRM.invert(s, weight);
        double[] closed = WeightedMinimizer.closedForm(model, weight).theta();
        double[] numerical = WeightedMinimizer.levenbergMarquardt(model, weight, new double[3]).theta();
        for (int j = 0; j < 3; j++) {
            assertThat(numerical[j]).isCloseTo(closed[j], within(1e-8 * Math.max(1.0, Math.abs(closed[j]))));
        }
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {21L, 22L, 23L})
    void efficientCovarianceIsNoLargerThanTheIdentitySandwich(long seed) {
        // Hansen (1982), Theorem 3.2: (D'WD)^{-1} D'WSWD (D'WD)^{-1} - (D'S^{-1}D)^{-1} is PSD for every W.
        MomentModel model = linearModel(12, seed);
        double[] theta = WeightedMinimizer.closedForm(model, CommonOps_DDRM.identity(12)).theta();
        DMatrixRMaj d = model.meanJacobian(theta);
        DMatrixRMaj s = GmmEstimator.longRun(model, theta, LongRunOptions.bartlettLags(4)).covariance();
        DMatrixRMaj sandwich = Inference.sandwichCovariance(d, CommonOps_DDRM.identity(12), s, model.observations());
        DMatrixRMaj efficient = Inference.efficientCovariance(d, s, model.observations());
        DMatrixRMaj difference = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.subtract(sandwich, efficient, difference);
        assertThat(minEigenvalue(difference)).isGreaterThanOrEqualTo(-1e-12 * CommonOps_DDRM.trace(sandwich));
        // The inequality is strict in general: identity weighting loses efficiency here.
        assertThat(CommonOps_DDRM.trace(difference)).isGreaterThan(0.0);
    }

    @Test
    void jointPricingErrorTestEqualsJWhenTheWeightIsTheInverseOfTheSameS() {
        // With W = S^{-1}, g' Var(g)^+ g = T g' S^{-1} g (Cochrane 2005, "Asset Pricing", section 11.5).
        MomentModel model = linearModel(12, 31L);
        double[] first = WeightedMinimizer.closedForm(model, CommonOps_DDRM.identity(12)).theta();
        DMatrixRMaj s = GmmEstimator.longRun(model, first, LongRunOptions.bartlettLags(4)).covariance();
        DMatrixRMaj weight = new DMatrixRMaj(12, 12);
        CommonOps_DDRM.invert(s, weight);
        double[] theta = WeightedMinimizer.closedForm(model, weight).theta();
        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj d = model.meanJacobian(theta);
        int t = model.observations();
        double j = Inference.quadraticStatistic(g, weight, t);
        double joint = Inference.jointPricingStatistic(g, Inference.pricingErrorCovariance(d, weight, s, t), 9);
        assertThat(joint).isCloseTo(j, within(1e-8 * j));
    }

    @Test
    void twoStepPowerUtilityOnUnscaledAndConstantScaledMomentsAgree() {
        // Scaling by the single instrument "const" (a column of ones) leaves the moments unchanged.
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 50, 5L);
        int quarters = sample.quarters().size();
        double[][] gross = new double[quarters][12];
        for (int q = 0; q < quarters; q++) {
            for (int i = 0; i < 12; i++) {
                double product = 1.0;
                for (int m = 3 * q; m < 3 * q + 3; m++) {
                    product *= 1.0 + sample.portfolioReturns()[m][i];
                }
                gross[q][i] = product;
            }
        }
        PowerUtilityErrors errors = new PowerUtilityErrors(gross, sample.consumptionGrowth(), economy.portfolioNames());
        double[][] ones = new double[quarters][1];
        for (double[] row : ones) {
            row[0] = 1.0;
        }
        GmmFit plain = GmmEstimator.estimate(ScaledMoments.unscaled(errors), new double[] {0.99, 2.0}, TWO_STEP_BARTLETT);
        GmmFit scaled = GmmEstimator.estimate(ScaledMoments.scaled(errors, ones, List.of("const")),
                new double[] {0.99, 2.0}, TWO_STEP_BARTLETT);
        assertThat(scaled.estimates()[1]).isCloseTo(plain.estimates()[1], within(1e-8));
        assertThat(scaled.overidentification().statistic()).isCloseTo(plain.overidentification().statistic(), within(1e-8));
    }

    private static double minEigenvalue(DMatrixRMaj symmetric) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(symmetric.numRows, false, true);
        eig.decompose(symmetric.copy());
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < symmetric.numRows; i++) {
            min = Math.min(min, eig.getEigenvalue(i).real);
        }
        return min;
    }
}
