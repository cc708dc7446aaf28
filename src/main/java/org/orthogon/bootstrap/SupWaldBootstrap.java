package org.orthogon.bootstrap;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.function.IntConsumer;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.analysis.ParallelRunner;
import org.orthogon.analysis.Stability;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.moments.MomentModel;

/**
 * Bootstrap critical values and p-value of the sup-Wald test of a one-time parameter change (Andrews
 * 1993). Under the null of no break the full sample is one bootstrap world: blocks of rows resampled from
 * the whole sample, the moments recentred at their bootstrap mean at the full-sample estimate θ̂ (Hall and
 * Horowitz 1996), so that θ̂ holds in every period of every resample. Each replication recomputes the
 * sup-Wald statistic exactly as the sample's: the same candidate dates, trimming and estimator, each side
 * fitted from θ̂. p = (1 + #{sup*_b ≥ sup}) / (B' + 1) over the B' replications that could be fitted; the
 * critical values are the (B' + 1)α-th order statistics.
 *
 * <p>The Wald statistics use each side's own covariance, with no block correction: with blocks of one row
 * the bootstrap reproduces the first-order null distribution (the Andrews limit) and the finite-sample
 * distortion of the subsample fits together; with longer blocks the kernel/block mismatch of the side
 * covariances is not corrected (docs/methods.md).
 *
 * <p>Cost: B × (number of candidate dates) × 2 subsample fits; for models linear in θ each fit comes from
 * running sums and costs one long-run covariance, so B = 199 replications of a 300-month, 25-asset sample
 * take about as long as 200 sample sup-Wald runs.
 */
public final class SupWaldBootstrap {
    private SupWaldBootstrap() {
    }

    /**
     * The bootstrap of one sup-Wald statistic.
     *
     * @param statistic      the sample's sup-Wald statistic
     * @param failureReasons reason → count of the replications that could not be fitted
     */
    public record Result(int replications, int blockLength, boolean automaticBlockLength, BlockScheme scheme,
            long seed, double statistic, double pValue, double critical10, double critical05, double critical01,
            int failedReplications, Map<String, Integer> failureReasons) {
        public Result {
            failureReasons = Map.copyOf(failureReasons);
        }
    }

    /**
     * Runs the bootstrap of the sup-Wald statistic {@code statistic} of {@code model} fitted with
     * {@code options} (the full sample is fitted here from {@code start} to find θ̂ and the block length).
     *
     * @throws EstimationException when the full sample cannot be fitted or too many replications fail
     */
    public static Result run(MomentModel model, double[] start, GmmOptions options, double trimming, double statistic,
            BootstrapPlan plan, int threads, IntConsumer progress) {
        GmmFit full = GmmEstimator.estimate(model, start, options, GmmEstimator.Detail.ESTIMATES);
        double[] theta = full.estimates();
        DMatrixRMaj contributions = model.contributions(theta);
        int length = plan.blockLengthFor(contributions);
        BootstrapWorld world = BootstrapWorld.atNull(model, theta,
                new BlockResampler(model.observations(), length, plan.scheme()), plan.seed());
        List<Object> draws = ParallelRunner.map(plan.replications(), threads, b -> {
            try {
                double sup = Stability.supWaldStatistic(world.replication(b), theta, options, trimming);
                return Double.isNaN(sup) ? "no candidate break date could be fitted on both sides" : (Object) sup;
            } catch (EstimationException | IllegalArgumentException e) {
                return BootstrapFailures.reason(e);
            }
        }, progress);
        List<String> reasons = new ArrayList<>();
        double[] values = new double[draws.size()];
        int n = 0;
        for (Object draw : draws) {
            if (draw instanceof Double value) {
                values[n++] = value;
            } else {
                reasons.add((String) draw);
            }
        }
        Map<String, Integer> tally = BootstrapFailures.tally(reasons);
        BootstrapFailures.refuseIfTooMany(reasons.size(), plan.replications(), tally, "sup-Wald bootstrap");
        double[] sorted = Arrays.copyOf(values, n);
        Arrays.sort(sorted);
        return new Result(plan.replications(), length, plan.automaticBlockLength(), plan.scheme(), plan.seed(),
                statistic, Quantiles.upperTailPValue(sorted, statistic), Quantiles.orderStatistic(sorted, 0.90),
                Quantiles.orderStatistic(sorted, 0.95), Quantiles.orderStatistic(sorted, 0.99), reasons.size(), tally);
    }
}
