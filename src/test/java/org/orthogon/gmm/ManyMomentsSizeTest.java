package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.ScaledMoments;

/**
 * Size of the asymptotic two-step J test with many moments, on serially independent data where a linear SDF
 * prices every asset exactly: the evidence behind the many-moments warning (docs/methods.md, "Many moments").
 *
 * <p>Design: three factors F_t ~ N(μ, diag(σ²)) independent over time, μ = (0.006, 0.003, 0.004),
 * σ = (0.045, 0.030, 0.035); N excess returns R_t = B μ + B (F_t - μ) + ε_t, ε_t ~ N(0, 0.02² I), loadings B
 * drawn once per N from a fixed seed. The factors are traded, so their premia equal their means, and
 * m = 1 - b'F with b = E[FF']^{-1} μ prices every R exactly: E[m R] = Bμ - (Bμμ' + BΣ)E[FF']^{-1}μ = 0
 * (Cochrane 2005, "Asset Pricing", section 6.3; the algebra is common practice). K = N moments, P = 3.
 * Each replication fits two-step GMM (identity first step) twice on the same data: S by Bartlett with 4 lags,
 * the model file's default, and by the heteroskedasticity-consistent S, which is consistent here because
 * m_t R_t is a martingale difference.
 *
 * <p>In the build: one cell (N = 25, T = 600, 300 replications, seeded). The full table of docs/methods.md:
 * <pre>
 *   mvn -q test -Dtest=ManyMomentsSizeTest -Dorthogon.montecarlo.replications=2000
 * </pre>
 * prints rejection rates at 1, 5 and 10% for N = 6, 12, 25 and T = 132, 252, 600, 1200 (about ten minutes on two
 * busy cores).
 */
class ManyMomentsSizeTest {
    private static final double[] MEANS = {0.006, 0.003, 0.004};
    private static final double[] VOLATILITIES = {0.045, 0.030, 0.035};
    private static final double IDIOSYNCRATIC = 0.02;
    private static final double[] LEVELS = {0.01, 0.05, 0.10};

    /** Rejection rates at {@link #LEVELS} for Bartlett 4 lags (first three) and HC S (last three). */
    static double[] rejectionRates(int assets, int observations, int replications, long seed) {
        Random loadings = new Random(1000L + assets);
        double[][] beta = new double[assets][3];
        for (int i = 0; i < assets; i++) {
            beta[i][0] = 0.6 + 0.8 * loadings.nextDouble();
            beta[i][1] = -0.5 + 1.5 * loadings.nextDouble();
            beta[i][2] = -0.5 + 1.5 * loadings.nextDouble();
        }
        List<String> names = new ArrayList<>();
        for (int i = 0; i < assets; i++) {
            names.add("R" + i);
        }
        GmmOptions bartlett = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.bartlettLags(4))
                .withHjSimulation(1L, 10);
        GmmOptions hc = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.heteroskedasticityConsistent())
                .withHjSimulation(1L, 10);
        int[] rejected = new int[6];
        Random random = new Random(seed);
        for (int r = 0; r < replications; r++) {
            double[][] factors = new double[observations][3];
            double[][] excess = new double[observations][assets];
            for (int t = 0; t < observations; t++) {
                for (int k = 0; k < 3; k++) {
                    factors[t][k] = MEANS[k] + VOLATILITIES[k] * random.nextGaussian();
                }
                for (int i = 0; i < assets; i++) {
                    double value = IDIOSYNCRATIC * random.nextGaussian();
                    for (int k = 0; k < 3; k++) {
                        value += beta[i][k] * factors[t][k];
                    }
                    excess[t][i] = value;
                }
            }
            var model = ScaledMoments.unscaled(new LinearFactorErrors(excess, factors, names,
                    List.of("F1", "F2", "F3")));
            double[] p = {GmmEstimator.estimate(model, new double[3], bartlett).overidentification().pValue(),
                GmmEstimator.estimate(model, new double[3], hc).overidentification().pValue()};
            for (int s = 0; s < 2; s++) {
                for (int l = 0; l < LEVELS.length; l++) {
                    if (p[s] < LEVELS[l]) {
                        rejected[3 * s + l]++;
                    }
                }
            }
        }
        double[] rates = new double[6];
        for (int i = 0; i < 6; i++) {
            rates[i] = rejected[i] / (double) replications;
        }
        return rates;
    }

    @Test
    void manyMomentsMakeTheAsymptoticJTestOverRejectAndHeteroskedasticityConsistentSLessSo() {
        String full = System.getProperty("orthogon.montecarlo.replications");
        if (full != null) {
            printTable(Integer.parseInt(full));
            return;
        }
        // K = 25 against T = 600 (K = T/24): with 300 replications the 5% rate's standard error is at most 0.025.
        double[] rates = rejectionRates(25, 600, 300, 20250101L);
        assertThat(rates[1]).as("Bartlett 4 lags, 5%%").isGreaterThan(0.10);
        assertThat(rates[4]).as("HC, 5%%").isLessThan(rates[1]);
    }

    private static void printTable(int replications) {
        StringBuilder out = new StringBuilder(String.format(Locale.ROOT, "%d replications per cell%n"
                + "| N = K | T | T/K | Bartlett 4: 1%% | 5%% | 10%% | HC: 1%% | 5%% | 10%% |%n"
                + "|---|---|---|---|---|---|---|---|---|%n", replications));
        long seed = 20250101L;
        for (int assets : new int[] {6, 12, 25}) {
            for (int t : new int[] {132, 252, 600, 1200}) {
                double[] r = rejectionRates(assets, t, replications, seed++);
                out.append(String.format(Locale.ROOT, "| %d | %d | %.1f | %.3f | %.3f | %.3f | %.3f | %.3f | %.3f |%n",
                        assets, t, t / (double) assets, r[0], r[1], r[2], r[3], r[4], r[5]));
            }
        }
        System.out.print(out);
    }
}
