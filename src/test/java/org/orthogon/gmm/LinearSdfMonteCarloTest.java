package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.orthogon.TestLog;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;

/**
 * Size of the two-step J test and coverage of the 95% intervals on the simulated Lumen economy, whose
 * linear SDF m = 1 - b'F prices the portfolios exactly with a known b ({@link LumenEconomy}): N = 10
 * portfolios, T = 600 serially independent months, 400 replications, fixed seeds.
 */
class LinearSdfMonteCarloTest {
    private static final int ASSETS = 10;
    private static final int YEARS = 50;
    private static final int REPLICATIONS = 400;
    private static final long FIRST_SEED = 600_000L;

    /** Rejection rate of J at 5% and coverage of each b_k's 95% interval. */
    private static double[] rates(LongRunOptions longRun) {
        LumenEconomy economy = LumenEconomy.standard();
        double[] truth = economy.linearSdfCoefficients();
        // The HJ p-value is not studied here; few draws keep the replications fast.
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, longRun).withHjSimulation(1L, 10);
        int rejections = 0;
        int[] covered = new int[truth.length];
        for (int r = 0; r < REPLICATIONS; r++) {
            GmmFit fit = GmmEstimator.estimate(LumenModels.linearSdf(ASSETS, YEARS, FIRST_SEED + r), new double[truth.length], options);
            if (fit.overidentification().pValue() < 0.05) {
                rejections++;
            }
            List<ConfidenceInterval> intervals = fit.confidenceIntervals(0.95);
            for (int k = 0; k < truth.length; k++) {
                if (intervals.get(k).covers(truth[k])) {
                    covered[k]++;
                }
            }
        }
        double[] out = new double[1 + truth.length];
        out[0] = rejections / (double) REPLICATIONS;
        for (int k = 0; k < truth.length; k++) {
            out[1 + k] = covered[k] / (double) REPLICATIONS;
        }
        return out;
    }

    @Test
    void twoStepJTestHasAboutItsNominalSizeAndIntervalsCoverTheTruth() {
        double[] hc = rates(LongRunOptions.heteroskedasticityConsistent());
        TestLog.printf(LinearSdfMonteCarloTest.class,
                "Monte Carlo, N = %d, T = %d, %d replications, two-step, HC S: J rejects at 5%% in %.1f%%; "
                + "95%% intervals cover b_MKT %.1f%%, b_SIZE %.1f%%, b_TIDE %.1f%%%n", ASSETS, YEARS * 12,
                REPLICATIONS, 100 * hc[0], 100 * hc[1], 100 * hc[2], 100 * hc[3]);
        double[] nw = rates(new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.NeweyWest(), true, false));
        TestLog.printf(LinearSdfMonteCarloTest.class,
                "Monte Carlo, same samples, Bartlett with the Newey-West (1994) bandwidth: J rejects at 5%% "
                + "in %.1f%%; 95%% intervals cover b_MKT %.1f%%, b_SIZE %.1f%%, b_TIDE %.1f%%%n",
                100 * nw[0], 100 * nw[1], 100 * nw[2], 100 * nw[3]);
        // Acceptance band of issue 4: with 400 replications the binomial standard error of a 5% rate is
        // 1.1 points, of a 95% coverage 1.1 points.
        assertThat(hc[0]).as("J rejection rate").isBetween(0.025, 0.085);
        for (int k = 1; k < hc.length; k++) {
            assertThat(hc[k]).as("coverage of b_%d", k - 1).isBetween(0.91, 0.985);
        }
    }
}
