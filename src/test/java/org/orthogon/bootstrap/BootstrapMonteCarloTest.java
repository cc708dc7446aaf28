package org.orthogon.bootstrap;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.orthogon.TestLog;
import org.orthogon.analysis.ParallelRunner;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * Size of the J test on serially independent null data at N = 25 assets, T = 300 months (the Lumen
 * setting of the issue): the asymptotic two-step J with Bartlett 4 lags over-rejects, the recentred
 * block bootstrap's J (Hall and Horowitz 1996) rejects near 5%. Seeded; R samples, each with B
 * bootstrap replications. The bootstrap p-value is p = (1 + #{J* ≥ J})/(B + 1), so it takes only the values
 * j/(B + 1): with B + 1 = 40 the test "p ≤ 0.05" rejects when J exceeds at least 38 of the 39 J*, which
 * has exact level 2/40 when the statistic is pivotal, while "p &lt; 0.05" would have level 1/40 (Davison
 * and Hinkley 1997, section 4.2: choose B with α(B + 1) whole and reject when p ≤ α).
 *
 * <p>Tolerances are binomial: with R = 300 the standard error of a 5% rate is √(0.05·0.95/300) = 1.26
 * points, so the bootstrap rate must lie within 5% ± 3 standard errors, [1.2%, 8.8%]; the asymptotic rate
 * must be at least 10%, 4 standard errors above 5%.
 * The larger run is the command in docs/benchmarks.md:
 * {@code mvn -q test -Dtest=BootstrapMonteCarloTest -Dorthogon.mc.samples=1000 -Dorthogon.mc.bootstrap=199
 * -Dorthogon.test.verbose=true}, with {@code -Dorthogon.mc.block=L} and {@code -Dorthogon.mc.scheme=circular} for
 * other block choices.
 */
class BootstrapMonteCarloTest {
    private static final int ASSETS = 25;
    private static final int MONTHS = 300;
    private static final long FIRST_SEED = 300_000L;

    @Test
    void bootstrapJRejectsNearFivePercentWhereTheAsymptoticOneOverRejects() {
        int samples = Integer.getInteger("orthogon.mc.samples", 300);
        int replications = Integer.getInteger("orthogon.mc.bootstrap", 39);
        int threads = Integer.getInteger("orthogon.mc.threads", ParallelRunner.defaultThreads());
        int blockLength = Integer.getInteger("orthogon.mc.block", 0); // 0: the automatic rule
        BlockScheme scheme = BlockScheme.valueOf(System.getProperty("orthogon.mc.scheme", "moving").toUpperCase(
                java.util.Locale.ROOT));
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.bartlettLags(4));
        List<boolean[]> rejections = ParallelRunner.map(samples, threads, r -> {
            MomentModel model = NullSamples.linearSdf(ASSETS, MONTHS, FIRST_SEED + r);
            GmmFit fit = GmmEstimator.estimate(model, new double[3], options, GmmEstimator.Detail.WITHOUT_HJ_DISTANCE);
            FitBootstrap.Result bootstrap = FitBootstrap.run(model, fit, options,
                    new BootstrapPlan(replications, blockLength, scheme, FIRST_SEED + r), 1, i -> {
                    });
            return new boolean[] {fit.overidentification().pValue() < 0.05,
                bootstrap.overidentification().pValue() <= 0.05};
        });
        double asymptotic = rejections.stream().filter(r -> r[0]).count() / (double) samples;
        double resampled = rejections.stream().filter(r -> r[1]).count() / (double) samples;
        double standardError = Math.sqrt(0.05 * 0.95 / samples);
        TestLog.printf(BootstrapMonteCarloTest.class, "N = %d, T = %d, %d samples x %d bootstrap replications, "
                + "two-step, Bartlett 4 lags, %s blocks of %s: J rejects at 5%% in %.1f%% (asymptotic) and %.1f%% "
                + "(bootstrap); binomial standard error of a 5%% rate %.1f points%n", ASSETS, MONTHS, samples,
                replications, scheme.name().toLowerCase(java.util.Locale.ROOT),
                blockLength == 0 ? "the automatic length" : blockLength + " rows", 100 * asymptotic, 100 * resampled,
                100 * standardError);
        assertThat(asymptotic).as("asymptotic J over-rejects").isGreaterThanOrEqualTo(0.10);
        assertThat(resampled).as("bootstrap J near 5%").isBetween(0.05 - 3 * standardError, 0.05 + 3 * standardError);
        assertThat(resampled).isLessThan(asymptotic);
    }
}
