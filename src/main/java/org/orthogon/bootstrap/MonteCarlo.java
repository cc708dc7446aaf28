package org.orthogon.bootstrap;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.IntConsumer;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.analysis.ParallelRunner;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.moments.MomentModel;

/**
 * How often the asymptotic tests reject in samples like the user's when the fitted model is true: R
 * samples of the same T drawn from the recentred block bootstrap world of the estimate (same N and K,
 * the serial dependence kept within blocks; Hall and Horowitz 1996), each fitted with the model file's
 * estimator from θ̂, and the share of samples in which each test rejects at 1, 5 and 10%: the J test
 * (the joint pricing-error test for one-step fits), the joint pricing-error test, and each parameter's t
 * test of θ_p = θ̂_p (θ̂ is the truth of the bootstrap world). Under a stated {@link Alternative} the same
 * rates are power. Each rate r carries its Monte Carlo standard error √(r(1 - r)/R') over the R'
 * samples that could be fitted (binomial; common practice, no source).
 */
public final class MonteCarlo {
    /** The nominal levels studied. */
    public static final double[] LEVELS = {0.01, 0.05, 0.10};
    private static final org.apache.commons.math3.distribution.NormalDistribution NORMAL =
            new org.apache.commons.math3.distribution.NormalDistribution(null, 0.0, 1.0);

    private MonteCarlo() {
    }

    /**
     * The rejection rates of one test.
     *
     * @param test     "hansen-j", "pricing-errors-joint" or "t:<parameter>"
     * @param rates    one per {@link #LEVELS}
     * @param stdErrors the Monte Carlo standard errors of the rates
     * @param underNull whether the test's null holds in the simulated world (a size) or not (a power)
     */
    public record Rates(String test, double[] rates, double[] stdErrors, boolean underNull) {
        public Rates {
            rates = rates.clone();
            stdErrors = stdErrors.clone();
        }

        @Override
        public double[] rates() {
            return rates.clone();
        }

        @Override
        public double[] stdErrors() {
            return stdErrors.clone();
        }
    }

    /** A Monte Carlo study's result. */
    public record Result(int replications, int blockLength, boolean automaticBlockLength, BlockScheme scheme,
            long seed, int observations, int moments, List<String> parameterNames, double[] truth,
            Alternative alternative, List<Rates> rates, int failedReplications, Map<String, Integer> failureReasons) {
        public Result {
            parameterNames = List.copyOf(parameterNames);
            truth = truth.clone();
            rates = List.copyOf(rates);
            failureReasons = Map.copyOf(failureReasons);
        }

        @Override
        public double[] truth() {
            return truth.clone();
        }

        public int successfulReplications() {
            return replications - failedReplications;
        }
    }

    /** One sample's p-values: J, joint, then one per parameter; or why it failed. */
    private record Draw(double[] pValues, String failure) {
    }

    /**
     * Runs the study: {@code plan.replications()} samples from the bootstrap world of {@code fit}.
     *
     * @throws EstimationException when too many samples cannot be fitted
     */
    public static Result run(MomentModel model, GmmFit fit, GmmOptions options, BootstrapPlan plan,
            Alternative alternative, int threads, IntConsumer progress) {
        int t = model.observations();
        int k = model.momentCount();
        int p = model.parameterCount();
        double[] theta = fit.estimates();
        DMatrixRMaj contributions = model.contributions(theta);
        int length = plan.blockLengthFor(contributions);
        BlockResampler resampler = new BlockResampler(t, length, plan.scheme());
        BootstrapWorld world = BootstrapWorld.withPricingErrors(model, theta, resampler, plan.seed(),
                alternative.delta(model.momentNames()));
        double[] shifts = alternative.shifts(model.parameterNames());
        boolean efficient = options.method().isEfficient();
        int df = k - p;
        List<Draw> draws = ParallelRunner.map(plan.replications(), threads, b -> {
            try {
                GmmFit refit = GmmEstimator.estimate(world.replication(b), theta, options,
                        GmmEstimator.Detail.WITHOUT_HJ_DISTANCE);
                double[] pValues = new double[2 + p];
                pValues[0] = df > 0 ? refit.overidentification().pValue() : Double.NaN;
                pValues[1] = df > 0 ? refit.pricingErrorsJoint().pValue() : Double.NaN;
                double[] estimates = refit.estimates();
                for (int i = 0; i < p; i++) {
                    double z = (estimates[i] - theta[i] - shifts[i]) / refit.parameters().get(i).stdError();
                    pValues[2 + i] = 2.0 * NORMAL.cumulativeProbability(-Math.abs(z));
                }
                for (int i = df > 0 ? 0 : 2; i < pValues.length; i++) {
                    if (!Double.isFinite(pValues[i])) {
                        return new Draw(null, "a p-value of the fit is not finite");
                    }
                }
                return new Draw(pValues, null);
            } catch (EstimationException | IllegalArgumentException e) {
                return new Draw(null, BootstrapFailures.reason(e));
            }
        }, progress);
        List<String> reasons = new ArrayList<>();
        List<double[]> good = new ArrayList<>();
        for (Draw draw : draws) {
            if (draw.failure() != null) {
                reasons.add(draw.failure());
            } else {
                good.add(draw.pValues());
            }
        }
        Map<String, Integer> tally = BootstrapFailures.tally(reasons);
        BootstrapFailures.refuseIfTooMany(reasons.size(), plan.replications(), tally, "Monte Carlo");
        boolean nullOfErrors = alternative.pricingErrors().isEmpty();
        List<Rates> rates = new ArrayList<>();
        if (df > 0) {
            rates.add(rates(fit.overidentification().kind(), good, 0, nullOfErrors));
            if (efficient) {
                rates.add(rates("pricing-errors-joint", good, 1, nullOfErrors));
            }
        }
        for (int i = 0; i < p; i++) {
            rates.add(rates("t:" + model.parameterNames().get(i), good, 2 + i, shifts[i] == 0.0));
        }
        return new Result(plan.replications(), length, plan.automaticBlockLength(), plan.scheme(), plan.seed(), t, k,
                model.parameterNames(), theta, alternative, rates, reasons.size(), tally);
    }

    private static Rates rates(String test, List<double[]> draws, int column, boolean underNull) {
        double[] rates = new double[LEVELS.length];
        double[] errors = new double[LEVELS.length];
        int n = draws.size();
        for (int l = 0; l < LEVELS.length; l++) {
            int rejections = 0;
            for (double[] pValues : draws) {
                if (pValues[column] < LEVELS[l]) {
                    rejections++;
                }
            }
            rates[l] = n == 0 ? Double.NaN : rejections / (double) n;
            errors[l] = n == 0 ? Double.NaN : Math.sqrt(rates[l] * (1.0 - rates[l]) / n);
        }
        return new Rates(test, rates, errors, underNull);
    }
}
