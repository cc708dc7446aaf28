package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.Map;
import java.util.Random;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.orthogon.TestLog;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/** One-step weights, iterated and continuously-updated GMM, bounds and the never-clean rules. */
class EstimatorsTest {
    private static final LongRunOptions HC = LongRunOptions.heteroskedasticityConsistent();

    @Test
    void iteratedGmmReachesTheSamePointFromTwoDifferentFirstStepWeights() {
        // The iterated estimator is the fixed point θ = argmin g' S(θ)^{-1} g, which does not depend on
        // the first-step weight (Hansen, Heaton and Yaron 1996, section 2).
        MomentModel model = LumenModels.linearSdf(10, 50, 41L);
        GmmOptions iterated = new GmmOptions(EstimationMethod.ITERATED, LongRunOptions.bartlettLags(3));
        GmmFit fromIdentity = GmmEstimator.estimate(model, new double[3], iterated);
        GmmFit fromSecondMoment = GmmEstimator.estimate(model, new double[3],
                iterated.withInitialWeight(new InitialWeight.SecondMoment()));
        double[] weights = new double[10];
        for (int i = 0; i < 10; i++) {
            weights[i] = 1.0 + 10.0 * i;
        }
        GmmFit fromDiagonal = GmmEstimator.estimate(model, new double[3],
                iterated.withInitialWeight(new InitialWeight.Diagonal(weights)));
        GmmFit twoStepIdentity = GmmEstimator.estimate(model, new double[3], iterated.withMethod(EstimationMethod.TWO_STEP));
        GmmFit twoStepSecondMoment = GmmEstimator.estimate(model, new double[3],
                iterated.withMethod(EstimationMethod.TWO_STEP).withInitialWeight(new InitialWeight.SecondMoment()));
        for (int j = 0; j < 3; j++) {
            assertThat(fromSecondMoment.estimates()[j]).isCloseTo(fromIdentity.estimates()[j], within(1e-8));
            assertThat(fromDiagonal.estimates()[j]).isCloseTo(fromIdentity.estimates()[j], within(1e-8));
        }
        // The two-step estimates from the same two first steps differ: the first step matters there.
        assertThat(Math.abs(twoStepIdentity.estimates()[0] - twoStepSecondMoment.estimates()[0])).isGreaterThan(1e-6);
        assertThat(fromIdentity.diagnostics().converged()).isTrue();
        assertThat(fromIdentity.diagnostics().weightUpdates()).isBetween(2, 100);
        assertThat(fromIdentity.warnings()).noneMatch(w -> w.startsWith(GmmEstimator.NOT_CLEAN));
        // At the fixed point J = T g' S(θ̂)^{-1} g with S re-estimated at θ̂, to the iteration tolerance.
        double j = Inference.quadraticStatistic(model.meanMoments(fromIdentity.estimates()),
                Matrices.invertSymmetric(fromIdentity.longRun().covariance(), "S"), model.observations());
        assertThat(fromIdentity.overidentification().statistic()).isCloseTo(j, within(1e-6 * j));
    }

    @Test
    void iteratedGmmAtItsCapIsLoudlyNotClean() {
        MomentModel model = LumenModels.linearSdf(10, 50, 42L);
        GmmFit fit = GmmEstimator.estimate(model, new double[3],
                new GmmOptions(EstimationMethod.ITERATED, HC).withMaxIterations(1));
        assertThat(fit.diagnostics().converged()).isFalse();
        assertThat(fit.diagnostics().clean()).isFalse();
        assertThat(fit.diagnostics().weightUpdates()).isEqualTo(1);
        assertThat(fit.warnings()).anyMatch(w -> w.startsWith(GmmEstimator.NOT_CLEAN) && w.contains("cap of 1"));
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {101L, 202L, 303L})
    void continuouslyUpdatedGmmIsInvariantToRescalingAMomentAndTwoStepIsNot(long seed) {
        // Q(θ) = T g' S(θ)^{-1} g is unchanged when g_i → c g_i, because S_ij → c S_ij (Hansen, Heaton and
        // Yaron 1996, section 2.3); the two-step estimate moves with c through its identity first step.
        Random random = new Random(seed);
        int index = random.nextInt(8);
        double factor = Math.exp(random.nextDouble() * 6.0 - 3.0);
        MomentModel model = LumenModels.linearSdf(8, 30, seed);
        MomentModel scaled = LumenModels.rescaled(model, index, factor);
        GmmOptions cue = new GmmOptions(EstimationMethod.CONTINUOUSLY_UPDATED, HC).withHjSimulation(1L, 1000);
        GmmFit plain = GmmEstimator.estimate(model, new double[3], cue);
        GmmFit rescaled = GmmEstimator.estimate(scaled, new double[3], cue);
        double cueLargest = 0.0;
        for (int j = 0; j < 3; j++) {
            cueLargest = Math.max(cueLargest,
                    Math.abs(rescaled.estimates()[j] - plain.estimates()[j]) / plain.parameters().get(j).stdError());
        }
        for (int j = 0; j < 3; j++) {
            double se = plain.parameters().get(j).stdError();
            assertThat(rescaled.estimates()[j]).as("b_%d, moment %d times %.3f", j, index, factor)
                    .isCloseTo(plain.estimates()[j], within(1e-6 * se));
            assertThat(rescaled.parameters().get(j).stdError()).isCloseTo(se, within(1e-6 * se));
        }
        assertThat(rescaled.overidentification().statistic())
                .isCloseTo(plain.overidentification().statistic(), within(1e-8 * plain.overidentification().statistic()));
        assertThat(plain.diagnostics().clean()).isTrue();

        GmmOptions secondStep = cue.withMethod(EstimationMethod.TWO_STEP);
        double[] a = GmmEstimator.estimate(model, new double[3], secondStep).estimates();
        double[] b = GmmEstimator.estimate(scaled, new double[3], secondStep).estimates();
        double largest = 0.0;
        for (int j = 0; j < 3; j++) {
            largest = Math.max(largest, Math.abs(a[j] - b[j]) / plain.parameters().get(j).stdError());
        }
        TestLog.printf(EstimatorsTest.class,
                "moment %d times %.4f: CUE moves by %.1e standard errors, two-step by %.1e%n", index,
                factor, cueLargest, largest);
        assertThat(largest).as("two-step change in standard errors").isGreaterThan(1e-4);
    }

    @Test
    void continuouslyUpdatedJIsNoLargerThanTheTwoStepJ() {
        // CUE minimises T g' S(θ)^{-1} g over θ; at the two-step θ̂2 that objective is T g' S(θ̂2)^{-1} g,
        // so the CUE minimum is below it (common practice, no source: follows from the definition).
        MomentModel model = LumenModels.linearSdf(10, 40, 7L);
        GmmOptions options = new GmmOptions(EstimationMethod.CONTINUOUSLY_UPDATED, HC);
        GmmFit cue = GmmEstimator.estimate(model, new double[3], options);
        GmmFit secondStep = GmmEstimator.estimate(model, new double[3], options.withMethod(EstimationMethod.TWO_STEP));
        double atTwoStep = ContinuouslyUpdated.objective(model, HC, secondStep.estimates());
        assertThat(cue.overidentification().statistic()).isLessThanOrEqualTo(atTwoStep);
        assertThat(cue.overidentification().df()).isEqualTo(7);
    }

    @Test
    void oneStepWithTheSecondMomentWeightIsTheHansenJagannathanMinimiser() {
        MomentModel model = LumenModels.linearSdf(10, 40, 8L);
        GmmFit fit = GmmEstimator.estimate(model, new double[3],
                new GmmOptions(EstimationMethod.ONE_STEP, HC).withInitialWeight(new InitialWeight.SecondMoment()));
        // δ² = min g' G^{-1} g and the one-step objective is T g' G^{-1} g at the same minimiser.
        assertThat(fit.hjDistance().value() * fit.hjDistance().value() * model.observations())
                .isCloseTo(fit.objective(), within(1e-10 * fit.objective()));
        var g = InitialWeight.secondMoments(model);
        var byHand = new org.ejml.data.DMatrixRMaj(10, 10);
        CommonOps_DDRM.invert(g, byHand);
        for (int i = 0; i < 10; i++) {
            for (int j = 0; j < 10; j++) {
                assertThat(fit.weight().get(i, j)).isCloseTo(byHand.get(i, j), within(1e-8 * Math.abs(byHand.get(i, i))));
            }
        }
    }

    @Test
    void aParameterOnItsBoundIsNeverClean() {
        // The unconstrained b_MKT is about 3 here; an upper bound of 1 binds.
        MomentModel model = LumenModels.linearSdf(10, 40, 9L);
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, HC).withBounds(ParameterBounds.byName(
                model.parameterNames(), Map.of("b_MKT", new double[] {Double.NEGATIVE_INFINITY, 1.0})));
        GmmFit free = GmmEstimator.estimate(model, new double[3], options.withBounds(ParameterBounds.none()));
        assertThat(free.estimates()[0]).isGreaterThan(1.5);
        GmmFit bounded = GmmEstimator.estimate(model, new double[3], options);
        assertThat(bounded.estimates()[0]).isCloseTo(1.0, within(1e-7));
        assertThat(bounded.diagnostics().clean()).isFalse();
        assertThat(bounded.diagnostics().parametersAtBounds()).containsExactly("b_MKT = 1.0 (its upper bound)");
        assertThat(bounded.warnings()).anyMatch(w -> w.startsWith(GmmEstimator.NOT_CLEAN) && w.contains("b_MKT"));
        assertThat(free.diagnostics().clean()).isTrue();
    }

    @Test
    void unidentifiedParametersAreRefused() {
        // Two identical factors: D has two equal columns and D'WD is singular.
        MomentModel base = LumenModels.linearSdf(6, 20, 10L);
        MomentModel duplicated = new DuplicatedParameter(base);
        assertThatThrownBy(() -> GmmEstimator.estimate(duplicated, new double[4],
                new GmmOptions(EstimationMethod.TWO_STEP, HC)))
                .isInstanceOf(EstimationException.class)
                .hasMessageContaining("singular")
                .satisfies(e -> assertThat(((EstimationException) e).fix()).contains("not identified"));
    }

    @Test
    void diagnosticsReportSizesAndConditionNumbers() {
        MomentModel model = LumenModels.linearSdf(10, 5, 11L);
        GmmFit fit = GmmEstimator.estimate(model, new double[3], new GmmOptions(EstimationMethod.TWO_STEP, HC));
        GmmDiagnostics d = fit.diagnostics();
        assertThat(d.moments()).isEqualTo(10);
        assertThat(d.observations()).isEqualTo(60);
        assertThat(d.parameters()).isEqualTo(3);
        assertThat(d.weightUpdates()).isEqualTo(1);
        assertThat(d.conditionS()).isGreaterThan(1.0).isFinite();
        assertThat(d.conditionDWD()).isGreaterThan(1.0).isFinite();
        // K² v / T = 100/60 > 1.5 with HC (v = 1): the many-moments warning names the fix.
        assertThat(fit.warnings()).anyMatch(w -> w.contains("K² v / T = 1.67") && w.contains("fixed (one-step) weight"));
    }

    /** The base model with its first parameter split into two identical copies (θ_0 + θ_1 enters). */
    private static final class DuplicatedParameter extends ForwardingMomentModel {
        DuplicatedParameter(MomentModel base) {
            super(base);
        }

        private double[] merged(double[] theta) {
            double[] out = new double[theta.length - 1];
            out[0] = theta[0] + theta[1];
            System.arraycopy(theta, 2, out, 1, theta.length - 2);
            return out;
        }

        @Override
        public java.util.List<String> parameterNames() {
            java.util.List<String> names = new java.util.ArrayList<>(base.parameterNames());
            names.add(1, names.get(0) + "_copy");
            return names;
        }

        @Override
        public org.ejml.data.DMatrixRMaj contributions(double[] theta) {
            return base.contributions(merged(theta));
        }

        @Override
        public org.ejml.data.DMatrixRMaj meanJacobian(double[] theta) {
            var d = base.meanJacobian(merged(theta));
            var out = new org.ejml.data.DMatrixRMaj(d.numRows, d.numCols + 1);
            for (int i = 0; i < d.numRows; i++) {
                out.set(i, 0, d.get(i, 0));
                out.set(i, 1, d.get(i, 0));
                for (int p = 1; p < d.numCols; p++) {
                    out.set(i, p + 1, d.get(i, p));
                }
            }
            return out;
        }
    }
}
