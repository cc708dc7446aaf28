package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;

/** The estimators on the non-linear power-utility Euler equations of the simulated Lumen economy. */
class NonlinearEstimatorsTest {
    private static final LongRunOptions HC = LongRunOptions.heteroskedasticityConsistent();

    /** Quarterly gross returns of 6 portfolios and consumption growth, 60 years. */
    private static MomentModel powerUtility(long seed) {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 60, seed);
        int quarters = sample.quarters().size();
        int assets = 6;
        double[][] gross = new double[quarters][assets];
        for (int q = 0; q < quarters; q++) {
            for (int i = 0; i < assets; i++) {
                double product = 1.0;
                for (int m = 3 * q; m < 3 * q + 3; m++) {
                    product *= 1.0 + sample.portfolioReturns()[m][i];
                }
                gross[q][i] = product;
            }
        }
        return ScaledMoments.unscaled(new PowerUtilityErrors(gross, sample.consumptionGrowth(),
                economy.portfolioNames().subList(0, assets)));
    }

    @Test
    void iteratedGmmOnEulerEquationsConvergesToTheSamePointFromTwoFirstSteps() {
        MomentModel model = powerUtility(3L);
        GmmOptions options = new GmmOptions(EstimationMethod.ITERATED, HC);
        GmmFit fromIdentity = GmmEstimator.estimate(model, new double[] {0.99, 5.0}, options);
        GmmFit fromSecondMoment = GmmEstimator.estimate(model, new double[] {0.99, 5.0},
                options.withInitialWeight(new InitialWeight.SecondMoment()));
        assertThat(fromIdentity.diagnostics().clean()).isTrue();
        for (int j = 0; j < 2; j++) {
            // The iterations stop at max|Δθ| < 1e-8; two paths to one fixed point agree to a few times that.
            assertThat(fromSecondMoment.estimates()[j]).isCloseTo(fromIdentity.estimates()[j], within(1e-7));
        }
        // Lumen's true quarterly β is 0.98 and γ is 10 (docs/demo-scenario.md); 4 standard errors.
        assertThat(fromIdentity.estimates()[1]).isCloseTo(10.0, within(4 * fromIdentity.parameters().get(1).stdError()));
    }

    @Test
    void continuouslyUpdatedGmmOnEulerEquationsConvergesAndReportsItsStarts() {
        MomentModel model = powerUtility(4L);
        GmmOptions options = new GmmOptions(EstimationMethod.CONTINUOUSLY_UPDATED, HC);
        GmmFit cue = GmmEstimator.estimate(model, new double[] {0.99, 5.0}, options);
        assertThat(cue.diagnostics().converged()).isTrue();
        // J is the minimum of T g' S(θ)^{-1} g, and it is a minimum: the objective rises in each direction.
        double q = ContinuouslyUpdated.objective(model, HC, cue.estimates());
        assertThat(cue.overidentification().statistic()).isCloseTo(q, within(1e-9 * q));
        for (int j = 0; j < 2; j++) {
            for (double sign : new double[] {-1, 1}) {
                double[] moved = cue.estimates();
                moved[j] += sign * 0.01 * cue.parameters().get(j).stdError();
                assertThat(ContinuouslyUpdated.objective(model, HC, moved)).isGreaterThanOrEqualTo(q);
            }
        }
    }

    @Test
    void continuouslyUpdatedObjectiveReselectsAnAutomaticBandwidthAtEveryEvaluation() {
        // docs/methods.md: an automatic (Andrews 1991) bandwidth is chosen again for the S of each θ.
        MomentModel model = powerUtility(5L);
        LongRunOptions andrews = new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.Andrews(), true, false);
        GmmFit cue = GmmEstimator.estimate(model, new double[] {0.99, 5.0},
                new GmmOptions(EstimationMethod.CONTINUOUSLY_UPDATED, andrews));
        double[] theta = cue.estimates();
        var atEstimate = LongRunCovariance.estimate(model.contributions(theta), andrews);
        assertThat(cue.longRun().bandwidth()).isEqualTo(atEstimate.bandwidth());
        double[] elsewhere = {theta[0], theta[1] + 3.0};
        assertThat(LongRunCovariance.estimate(model.contributions(elsewhere), andrews).bandwidth())
                .isNotEqualTo(atEstimate.bandwidth());
        DMatrixRMaj g = model.meanMoments(theta);
        double j = Inference.quadraticStatistic(g, Matrices.invertSymmetric(atEstimate.covariance(), "S"),
                model.observations());
        assertThat(cue.overidentification().statistic()).isCloseTo(j, within(1e-9 * j));
    }

    @Test
    void aBindingBoundOnGammaIsReportedAndANonBindingBoundOnBetaIsNot() {
        MomentModel model = powerUtility(6L);
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, HC);
        GmmFit positiveBeta = GmmEstimator.estimate(model, new double[] {0.99, 5.0}, options.withBounds(
                ParameterBounds.byName(model.parameterNames(), Map.of("beta", new double[] {0.0, Double.POSITIVE_INFINITY}))));
        assertThat(positiveBeta.diagnostics().clean()).isTrue();
        GmmFit capped = GmmEstimator.estimate(model, new double[] {0.99, 2.0}, options.withBounds(
                ParameterBounds.byName(model.parameterNames(), Map.of("gamma", new double[] {0.0, 3.0}))));
        assertThat(capped.estimates()[1]).isCloseTo(3.0, within(1e-7));
        assertThat(capped.diagnostics().parametersAtBounds()).containsExactly("gamma = 3.0 (its upper bound)");
        assertThat(capped.diagnostics().clean()).isFalse();
        assertThat(capped.warnings()).anyMatch(w -> w.startsWith(GmmEstimator.NOT_CLEAN));
    }

    @Test
    void disagreeingStartsOfTheContinuouslyUpdatedSearchAreReported() {
        // g(θ) = (mean x1 - θ², mean x2 - θ²) has two minima ±θ* with the same objective; a start on the
        // other side of zero ends at the other one, and the search must say so.
        int t = 200;
        java.util.Random random = new java.util.Random(9L);
        double[][] x = new double[t][2];
        for (double[] row : x) {
            row[0] = 4.0 + random.nextGaussian();
            row[1] = 4.0 + random.nextGaussian();
        }
        MomentModel model = new SquareModel(x);
        ContinuouslyUpdated.Result result = ContinuouslyUpdated.minimize(model, HC, new double[] {2.0},
                new double[] {2.0}, ParameterBounds.none().forParameters(1));
        assertThat(Math.abs(result.theta()[0])).isCloseTo(2.0, within(0.2));
        assertThat(result.notes()).anyMatch(n -> n.contains("starts disagree"));
    }

    /** f_t = x_t - θ² (1 parameter, 2 moments). */
    private static final class SquareModel implements MomentModel {
        private final double[][] x;

        SquareModel(double[][] x) {
            this.x = x;
        }

        @Override
        public List<String> parameterNames() {
            return List.of("theta");
        }

        @Override
        public List<String> momentNames() {
            return List.of("x1", "x2");
        }

        @Override
        public int observations() {
            return x.length;
        }

        @Override
        public DMatrixRMaj contributions(double[] theta) {
            DMatrixRMaj f = new DMatrixRMaj(x.length, 2);
            for (int t = 0; t < x.length; t++) {
                f.set(t, 0, x[t][0] - theta[0] * theta[0]);
                f.set(t, 1, x[t][1] - theta[0] * theta[0]);
            }
            return f;
        }

        @Override
        public DMatrixRMaj meanJacobian(double[] theta) {
            return new DMatrixRMaj(new double[][] {{-2 * theta[0]}, {-2 * theta[0]}});
        }

        @Override
        public boolean isLinear() {
            return false;
        }

        @Override
        public DMatrixRMaj payoffs() {
            return contributions(new double[1]);
        }
    }
}
