package org.orthogon.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

/**
 * Windows cut from running sums are the model's own rows: the same means, Jacobian, contributions and
 * fits as {@link MomentModel#rows(int, int)}, up to rounding.
 */
class LinearWindowsTest {

    /** The linear SDF on the twelve Lumen portfolios, unscaled or scaled by (1, lagged MKT). */
    private static MomentModel lumen(boolean scaled) {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 30, 21L);
        int months = sample.months().size();
        double[][] excess = new double[months][12];
        double[][] lagged = new double[months][2];
        for (int t = 0; t < months; t++) {
            for (int i = 0; i < 12; i++) {
                excess[t][i] = sample.portfolioReturns()[t][i] - sample.riskfree()[t];
            }
            lagged[t][0] = 1.0;
            lagged[t][1] = t == 0 ? 0.0 : sample.factors()[t - 1][0];
        }
        LinearFactorErrors errors = new LinearFactorErrors(excess, sample.factors(), economy.portfolioNames(),
                economy.factorNames());
        return scaled ? ScaledMoments.scaled(errors, lagged, List.of("const", "MKT_lag"))
                : ScaledMoments.unscaled(errors);
    }

    private static void assertClose(DMatrixRMaj actual, DMatrixRMaj expected, double relative) {
        assertThat(actual.numRows).isEqualTo(expected.numRows);
        assertThat(actual.numCols).isEqualTo(expected.numCols);
        double scale = 0.0;
        for (double v : expected.data) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (int i = 0; i < expected.getNumElements(); i++) {
            assertThat(actual.data[i]).isCloseTo(expected.data[i], within(relative * scale));
        }
    }

    @ParameterizedTest(name = "scaled by instruments: {0}")
    @ValueSource(booleans = {false, true})
    void windowsHaveTheMomentsOfTheirRows(boolean scaled) {
        MomentModel model = lumen(scaled);
        LinearWindows windows = LinearWindows.of(model);
        assertThat(windows).isNotNull();
        double[] theta = {2.5, 1.0, 4.0};
        for (int[] cut : new int[][] {{0, 360}, {0, 54}, {54, 360}, {100, 221}, {359, 360}}) {
            MomentModel window = windows.window(cut[0], cut[1]);
            MomentModel rows = model.rows(cut[0], cut[1]);
            assertThat(window.observations()).isEqualTo(cut[1] - cut[0]);
            assertClose(window.contributions(theta), rows.contributions(theta), 1e-14);
            assertClose(window.meanMoments(theta), rows.meanMoments(theta), 1e-12);
            assertClose(window.meanJacobian(theta), rows.meanJacobian(theta), 1e-12);
            assertClose(window.payoffs(), rows.payoffs(), 0.0);
        }
    }

    @ParameterizedTest(name = "scaled by instruments: {0}")
    @ValueSource(booleans = {false, true})
    void rowJacobiansAverageToTheMeanJacobian(boolean scaled) {
        MomentModel model = lumen(scaled);
        double[] theta = {1.0, -2.0, 0.5};
        DMatrixRMaj rows = model.rowJacobians(theta);
        DMatrixRMaj mean = new DMatrixRMaj(model.momentCount(), model.parameterCount());
        for (int t = 0; t < rows.numRows; t++) {
            for (int c = 0; c < rows.numCols; c++) {
                mean.data[c] += rows.get(t, c) / rows.numRows;
            }
        }
        assertClose(mean, model.meanJacobian(theta), 1e-12);
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"one-step", "two-step", "iterated"})
    void fitsOnWindowsEqualFitsOnRows(String method) {
        MomentModel model = lumen(false);
        LinearWindows windows = LinearWindows.of(model);
        List<LongRunOptions> choices = new ArrayList<>(List.of(LongRunOptions.bartlettLags(3),
                new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.NeweyWest(), true, false),
                new LongRunOptions(Kernel.QUADRATIC_SPECTRAL, new BandwidthRule.Andrews(), true, true)));
        for (LongRunOptions longRun : choices) {
            GmmOptions options = new GmmOptions(EstimationMethod.fromId(method), longRun);
            GmmFit onWindow = GmmEstimator.estimate(windows.window(40, 250), new double[3], options);
            GmmFit onRows = GmmEstimator.estimate(model.rows(40, 250), new double[3], options);
            for (int p = 0; p < 3; p++) {
                assertThat(onWindow.estimates()[p]).isCloseTo(onRows.estimates()[p], within(1e-9));
            }
            assertClose(onWindow.covariance(), onRows.covariance(), 1e-8);
            assertThat(onWindow.overidentification().statistic())
                    .isCloseTo(onRows.overidentification().statistic(), within(1e-8));
            assertThat(onWindow.hjDistance().pValue()).isCloseTo(onRows.hjDistance().pValue(), within(1e-8));
        }
    }
}
