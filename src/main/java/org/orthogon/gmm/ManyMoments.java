package org.orthogon.gmm;

import java.util.Locale;
import java.util.Optional;
import org.orthogon.longrun.Kernel;

/**
 * When the asymptotic J test (and the efficient weight behind it) cannot be trusted because there are too
 * many moments for the sample: the rule of the many-moments warning, calibrated by Monte Carlo.
 *
 * <p>The estimation error of Ŝ^{-1} enters J at the order K²/T, and a kernel estimate of S is noisier than
 * the heteroskedasticity-consistent one by the kernel's variance factor v = 1 + 2 Σ_{j≥1} k(j/b)² (Andrews 1991,
 * Econometrica 59, section 3: the variance of a kernel estimate is proportional to Σ_j k(j/b)²; v = 1 for HC,
 * 3.4 for Bartlett with 4 lags). The warning fires when K² v / T &gt; {@value #THRESHOLD}. The evidence is the
 * seeded Monte Carlo of {@code ManyMomentsSizeTest} (docs/methods.md, "Many moments"; serially independent null
 * data, 2000 replications a cell): the two-step J's rejection rate at 5% grows with K² v / T; it stays within 7%
 * up to 0.6, lies between 8% and 10% from 0.8 to 1.8, and exceeds 10%, twice the nominal size, in every cell
 * from 1.9 on (up to 74%). N = 12 at T = 132: Bartlett 4 lags 20.9% (K² v / T = 3.7), HC 8.7% (1.1); at T = 252:
 * 10.9% (1.9) and 6.3% (0.6); N = 25 at T = 600: 16.1% (3.5) and 9.0% (1.0).
 */
public final class ManyMoments {
    /** K² v / T above which the warning fires. */
    public static final double THRESHOLD = 1.5;

    private ManyMoments() {
    }

    /** v = 1 + 2 Σ_{j=1..T-1} k(j/b)², 1 for the heteroskedasticity-consistent S (b = 0 or no kernel). */
    public static double varianceFactor(Kernel kernel, double bandwidth, int observations) {
        if (kernel == Kernel.NONE || !(bandwidth > 0)) {
            return 1.0;
        }
        double sum = 0.0;
        for (int j = 1; j < observations; j++) {
            double w = kernel.weight(j / bandwidth);
            sum += w * w;
        }
        return 1.0 + 2.0 * sum;
    }

    /** True when a warning text is this rule's warning. */
    public static boolean describes(String warning) {
        return warning.contains(" moments against T = ") && warning.contains("(K² v / T = ");
    }

    /** K² v / T. */
    public static double load(int moments, int observations, Kernel kernel, double bandwidth) {
        return (double) moments * moments * varianceFactor(kernel, bandwidth, observations) / observations;
    }

    /**
     * The warning before any S is estimated, from the long-run choices: the bandwidth of a lag count or a fixed
     * number; an automatic bandwidth is only chosen at estimation, so it counts as the HC factor v = 1, the least
     * a fit can have.
     */
    public static Optional<String> warning(int moments, int observations, org.orthogon.longrun.LongRunOptions options) {
        org.orthogon.longrun.BandwidthRule rule = options.bandwidth();
        double bandwidth = rule instanceof org.orthogon.longrun.BandwidthRule.Lags l
                ? options.kernel().bandwidthForLags(l.lags())
                : rule instanceof org.orthogon.longrun.BandwidthRule.Fixed f ? f.bandwidth() : 0.0;
        return warning(moments, observations, options.kernel(), bandwidth);
    }

    /** The warning for K moments, T observations and this S, or empty when K² v / T ≤ {@value #THRESHOLD}. */
    public static Optional<String> warning(int moments, int observations, Kernel kernel, double bandwidth) {
        double load = load(moments, observations, kernel, bandwidth);
        if (!(load > THRESHOLD)) {
            return Optional.empty();
        }
        String lags = kernel == Kernel.NONE || !(bandwidth > 0) ? ""
                : ", or the heteroskedasticity-consistent S when the moments are one-period pricing errors";
        return Optional.of(String.format(Locale.ROOT, "K = %d moments against T = %d observations (K² v / T = %.2f "
                + "above %.1f, v = %.2f the noise factor of this S): the efficient weight is estimated imprecisely and "
                + "the J test rejects true models far more often than its nominal size in samples like this one; "
                + "prefer fewer assets or instruments%s, or a fixed (one-step) weight", moments, observations, load,
                THRESHOLD, varianceFactor(kernel, bandwidth, observations), lags));
    }
}
