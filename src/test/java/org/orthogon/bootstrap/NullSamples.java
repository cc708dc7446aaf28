package org.orthogon.bootstrap;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.random.MersenneTwister;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

/**
 * Seeded samples where a linear SDF m = 1 - b'F prices N excess returns exactly and every series is
 * serially independent: three traded factors F_t ~ N(μ, diag σ²), R^e_t = B F_t + e_t with
 * e_t ~ N(0, 0.02² I) and no intercept, so E[R^e m] = 0 at b = (Σ_F + μμ')^{-1} μ (common practice, no
 * source: a traded factor's excess return is priced by the mean-variance efficient combination).
 * Monthly magnitudes in the range of the Lumen portfolios.
 */
final class NullSamples {
    static final double[] FACTOR_MEANS = {0.006, 0.002, 0.003};
    static final double[] FACTOR_SDS = {0.045, 0.030, 0.030};
    static final double ERROR_SD = 0.02;

    private NullSamples() {
    }

    /** The true b = (Σ_F + μμ')^{-1} μ with Σ_F diagonal, by Sherman-Morrison. */
    static double[] trueB() {
        int k = FACTOR_MEANS.length;
        double[] dinvMu = new double[k];
        double quad = 0.0;
        for (int i = 0; i < k; i++) {
            dinvMu[i] = FACTOR_MEANS[i] / (FACTOR_SDS[i] * FACTOR_SDS[i]);
            quad += FACTOR_MEANS[i] * dinvMu[i];
        }
        double[] b = new double[k];
        for (int i = 0; i < k; i++) {
            b[i] = dinvMu[i] / (1.0 + quad);
        }
        return b;
    }

    /** A sample of {@code assets} portfolios over {@code months} months from {@code seed}. */
    static MomentModel linearSdf(int assets, int months, long seed) {
        MersenneTwister random = new MersenneTwister(seed);
        int k = FACTOR_MEANS.length;
        double[][] loadings = new double[assets][k];
        for (int i = 0; i < assets; i++) {
            loadings[i][0] = 0.7 + 0.6 * i / Math.max(1, assets - 1);
            loadings[i][1] = -0.5 + 1.5 * ((i * 7) % assets) / (double) Math.max(1, assets - 1);
            loadings[i][2] = -0.5 + 1.5 * ((i * 11) % assets) / (double) Math.max(1, assets - 1);
        }
        double[][] factors = new double[months][k];
        double[][] excess = new double[months][assets];
        for (int t = 0; t < months; t++) {
            for (int j = 0; j < k; j++) {
                factors[t][j] = FACTOR_MEANS[j] + FACTOR_SDS[j] * random.nextGaussian();
            }
            for (int i = 0; i < assets; i++) {
                double r = ERROR_SD * random.nextGaussian();
                for (int j = 0; j < k; j++) {
                    r += loadings[i][j] * factors[t][j];
                }
                excess[t][i] = r;
            }
        }
        List<String> names = new ArrayList<>();
        for (int i = 0; i < assets; i++) {
            names.add(String.format("P%02d", i + 1));
        }
        return ScaledMoments.unscaled(new LinearFactorErrors(excess, factors, names, List.of("F1", "F2", "F3")));
    }
}
