package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

class SmallSampleCorrectionTest {

    private static MomentModel model() {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 10, 3L);
        int months = sample.months().size();
        double[][] excess = new double[months][6];
        for (int t = 0; t < months; t++) {
            for (int i = 0; i < 6; i++) {
                excess[t][i] = sample.portfolioReturns()[t][i] - sample.riskfree()[t];
            }
        }
        return ScaledMoments.unscaled(new LinearFactorErrors(excess, sample.factors(),
                economy.portfolioNames().subList(0, 6), economy.factorNames()));
    }

    @Test
    void correctedInferenceEqualsTheFormulasWithTheScaledS() {
        MomentModel model = model();
        GmmOptions plain = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.bartlettLags(3));
        GmmFit fit = GmmEstimator.estimate(model, new double[3], plain);
        GmmFit corrected = GmmEstimator.estimate(model, new double[3], plain.withSmallSample(true));
        int t = model.observations();
        double c = t / (t - 3.0);

        // Scaling S by a constant leaves the minimiser unchanged (W2 is only rescaled).
        assertThat(corrected.estimates()).containsExactly(fit.estimates(), within(1e-12));
        // (D'(cS)^{-1}D)^{-1}/T computed directly from the fit's own D and S (Hansen 1982, Theorem 3.2).
        DMatrixRMaj s = fit.longRun().covariance();
        CommonOps_DDRM.scale(c, s);
        DMatrixRMaj direct = Inference.efficientCovariance(model.meanJacobian(fit.estimates()), s, t);
        for (int i = 0; i < 3; i++) {
            assertThat(corrected.parameters().get(i).stdError()).isCloseTo(Math.sqrt(direct.get(i, i)),
                    within(1e-12 * Math.sqrt(direct.get(i, i))));
        }
        // J = T g' (c S1)^{-1} g = J_plain / c.
        assertThat(corrected.overidentification().statistic())
                .isCloseTo(fit.overidentification().statistic() / c, within(1e-12));
        assertThat(corrected.pricingErrors().get(2).stdError())
                .isCloseTo(fit.pricingErrors().get(2).stdError() * Math.sqrt(c), within(1e-15));
        assertThat(corrected.warnings()).anyMatch(w -> w.contains("T/(T-P)"));
        assertThat(corrected.hj()).isPresent();
        assertThat(corrected.hj().get().value()).isEqualTo(fit.hj().get().value());
        assertThat(List.of(corrected.hj().get().pValue())).allMatch(p -> p >= fit.hj().get().pValue() - 1e-12);
    }
}
