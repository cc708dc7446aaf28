package org.orthogon.bootstrap;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.function.IntConsumer;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.analysis.ParallelRunner;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.Inference;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.moments.MomentModel;

/**
 * The recentred block bootstrap of a GMM fit (Hall and Horowitz 1996, "Bootstrap critical values for
 * tests based on generalized-method-of-moments estimators", Econometrica 64): B resamples of blocks of
 * rows ({@link BlockResampler}), the moments recentred at their bootstrap expectation at θ̂
 * ({@link BootstrapWorld}), each refitted with the sample fit's own estimator and options from θ̂, and
 * <ul>
 *   <li>bootstrap p-values of J (the joint pricing-error test for one-step fits, whose J is not
 *       chi-square) and of the joint pricing-error test: p = (1 + #{s*_b ≥ s}) / (B' + 1) over the B'
 *       replications that refitted (Davison and Hinkley 1997, "Bootstrap methods and their application",
 *       equation 4.11), s*_b the replication's statistic with the Hall-Horowitz correction
 *       ({@link HallHorowitz});</li>
 *   <li>equal-tailed percentile-t intervals θ̂_p - q*_{1-α/2} se_p .. θ̂_p - q*_{α/2} se_p, q* the
 *       quantiles of t̃*_p = τ_p (θ*_p - θ̂_p) / se*_p, se*_p the replication's own standard error (Hall
 *       1992, "The bootstrap and Edgeworth expansion", section 3.5; Hall and Horowitz 1996).</li>
 * </ul>
 * Replication b uses the stream {@link ReplicationStreams#stream(long, int)} of (seed, b), so the result
 * is the same for any thread count. A replication whose refit fails is counted with its reason; more than
 * {@link BootstrapPlan#MAX_FAILED_SHARE} failed is a refusal.
 */
public final class FitBootstrap {
    private FitBootstrap() {
    }

    /** One parameter's bootstrap interval. */
    public record Interval(String name, double estimate, double stdError, double low, double high, double level) {
    }

    /**
     * A bootstrap test: the sample statistic, its bootstrap p-value and critical values, and the sorted
     * corrected replication statistics (for the distribution chart).
     */
    public record Test(String kind, double statistic, int df, double asymptoticPValue, double pValue,
            double critical10, double critical05, double critical01, double[] draws) {
        public Test {
            draws = draws.clone();
        }

        @Override
        public double[] draws() {
            return draws.clone();
        }
    }

    /**
     * Everything a bootstrap of a fit reports.
     *
     * @param overidentification null when K = P
     * @param pricingErrorsJoint null when K = P
     * @param failureReasons     reason → count of the failed replications
     * @param tScale             the Hall-Horowitz τ of each parameter
     */
    public record Result(int replications, int blockLength, boolean automaticBlockLength, BlockScheme scheme,
            long seed, Test overidentification, Test pricingErrorsJoint, List<Interval> parameters,
            int failedReplications, Map<String, Integer> failureReasons, double[] tScale) {
        public Result {
            parameters = List.copyOf(parameters);
            failureReasons = Map.copyOf(failureReasons);
            tScale = tScale.clone();
        }

        @Override
        public double[] tScale() {
            return tScale.clone();
        }

        /** Replications whose refit succeeded. */
        public int successfulReplications() {
            return replications - failedReplications;
        }
    }

    /** One replication's corrected statistics, or the reason it failed. */
    private record Draw(double j, double joint, double[] t, String failure) {
    }

    /**
     * Runs the bootstrap of {@code fit}, the estimate of {@code model} with {@code options}.
     *
     * @param progress told each finished replication (a progress bar); never feeds into results
     * @throws EstimationException when too many replications fail
     */
    public static Result run(MomentModel model, GmmFit fit, GmmOptions options, BootstrapPlan plan, int threads,
            IntConsumer progress) {
        int t = model.observations();
        int k = model.momentCount();
        int p = model.parameterCount();
        double[] theta = fit.estimates();
        DMatrixRMaj contributions = model.contributions(theta);
        int length = plan.blockLengthFor(contributions);
        BlockResampler resampler = new BlockResampler(t, length, plan.scheme());
        BootstrapWorld world = BootstrapWorld.atNull(model, theta, resampler, plan.seed());
        HallHorowitz correction = corrections(model, fit, options, resampler, contributions);
        boolean efficient = options.method().isEfficient();
        int df = k - p;

        List<Draw> draws = ParallelRunner.map(plan.replications(), threads, b -> {
            try {
                MomentModel resample = world.replication(b);
                GmmFit refit = GmmEstimator.estimate(resample, theta, options, GmmEstimator.Detail.ESTIMATES);
                double[] tStats = new double[p];
                double[] estimates = refit.estimates();
                for (int i = 0; i < p; i++) {
                    double se = refit.parameters().get(i).stdError();
                    tStats[i] = correction.tScale()[i] * (estimates[i] - theta[i]) / se;
                }
                double j = Double.NaN;
                double joint = Double.NaN;
                if (df > 0) {
                    DMatrixRMaj g = resample.meanMoments(estimates);
                    DMatrixRMaj weight = refit.weight();
                    DMatrixRMaj errorCovariance = Inference.pricingErrorCovariance(resample.meanJacobian(estimates),
                            weight, refit.longRun().covariance(), t);
                    joint = correction.jointPricing(g, errorCovariance, t);
                    j = efficient ? correction.overidentification(g, weight, t) : joint;
                }
                if (!finite(tStats) || (df > 0 && !(Double.isFinite(j) && Double.isFinite(joint)))) {
                    return new Draw(Double.NaN, Double.NaN, null, "a statistic of the refit is not finite");
                }
                return new Draw(j, joint, tStats, null);
            } catch (EstimationException | IllegalArgumentException e) {
                return new Draw(Double.NaN, Double.NaN, null, BootstrapFailures.reason(e));
            }
        }, progress);

        List<String> reasons = new ArrayList<>();
        List<Draw> good = new ArrayList<>();
        for (Draw draw : draws) {
            if (draw.failure() != null) {
                reasons.add(draw.failure());
            } else {
                good.add(draw);
            }
        }
        Map<String, Integer> tally = BootstrapFailures.tally(reasons);
        BootstrapFailures.refuseIfTooMany(reasons.size(), plan.replications(), tally, "bootstrap");

        Test overidentification = null;
        Test joint = null;
        if (df > 0) {
            double[] jDraws = good.stream().mapToDouble(Draw::j).toArray();
            double[] jointDraws = good.stream().mapToDouble(Draw::joint).toArray();
            overidentification = test(fit.overidentification().kind(), fit.overidentification().statistic(), df,
                    fit.overidentification().pValue(), jDraws);
            joint = test("pricing-errors-joint", fit.pricingErrorsJoint().statistic(), df,
                    fit.pricingErrorsJoint().pValue(), jointDraws);
        }
        double level = fit.confidenceLevel();
        List<Interval> intervals = new ArrayList<>();
        for (int i = 0; i < p; i++) {
            final int parameter = i;
            double[] tDraws = good.stream().mapToDouble(d -> d.t()[parameter]).sorted().toArray();
            double se = fit.parameters().get(i).stdError();
            double upperQuantile = Quantiles.orderStatistic(tDraws, 0.5 + 0.5 * level);
            double lowerQuantile = Quantiles.orderStatistic(tDraws, 0.5 - 0.5 * level);
            intervals.add(new Interval(fit.parameters().get(i).name(), theta[i], se, theta[i] - upperQuantile * se,
                    theta[i] - lowerQuantile * se, level));
        }
        return new Result(plan.replications(), length, plan.automaticBlockLength(), plan.scheme(), plan.seed(),
                overidentification, joint, intervals, reasons.size(), tally, correction.tScale());
    }

    /** The Hall-Horowitz corrections of this fit's bootstrap world (the identity for blocks of one row). */
    static HallHorowitz corrections(MomentModel model, GmmFit fit, GmmOptions options, BlockResampler resampler,
            DMatrixRMaj contributions) {
        int k = model.momentCount();
        int p = model.parameterCount();
        if (resampler.blockLength() == 1) {
            return HallHorowitz.identity(k, p);
        }
        DMatrixRMaj[] world = resampler.worldCovariances(contributions, fit.longRun().kernel(),
                fit.longRun().bandwidth());
        if (options.smallSample()) {
            double factor = LongRunCovariance.smallSampleFactor(model.observations(), p);
            org.ejml.dense.row.CommonOps_DDRM.scale(factor, world[1]);
        }
        DMatrixRMaj fixedWeight = options.method() == EstimationMethod.ONE_STEP ? fit.weight() : null;
        try {
            return HallHorowitz.of(model.meanJacobian(fit.estimates()), fixedWeight, world[0], world[1]);
        } catch (IllegalArgumentException e) {
            throw new EstimationException("the bootstrap world's covariances cannot be formed: " + e.getMessage(),
                    List.of("block length " + resampler.blockLength(), "K = " + k, "P = " + p),
                    "use a shorter block length (--block-length) or fewer moments");
        }
    }

    /** The bootstrap test of a sample statistic against the replications' corrected statistics. */
    static Test test(String kind, double statistic, int df, double asymptotic, double[] draws) {
        double[] sorted = draws.clone();
        Arrays.sort(sorted);
        return new Test(kind, statistic, df, asymptotic, Quantiles.upperTailPValue(sorted, statistic),
                Quantiles.orderStatistic(sorted, 0.90), Quantiles.orderStatistic(sorted, 0.95),
                Quantiles.orderStatistic(sorted, 0.99), sorted);
    }

    private static boolean finite(double[] values) {
        for (double v : values) {
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        return true;
    }
}
