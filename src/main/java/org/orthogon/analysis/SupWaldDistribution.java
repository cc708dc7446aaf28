package org.orthogon.analysis;

import java.util.Arrays;
import java.util.List;
import org.apache.commons.math3.util.FastMath;

/**
 * The limiting null distribution of the sup-Wald statistic for a one-time parameter change at an
 * unknown date (Andrews 1993, "Tests for parameter instability and structural change with unknown
 * change point", Econometrica 61, Theorem 3): sup over λ in [π0, 1 - π0] of
 * Σ_{k=1..p} B_k(λ)² / (λ(1 - λ)), with B_k independent Brownian bridges on [0, 1].
 *
 * <p>Drawn by simulation: each Brownian motion is a scaled random walk on a grid of {@code steps}
 * points, B(λ) = W(λ) - λ W(1), and the supremum is taken over the grid points inside the trimmed
 * range. A grid of 2000 points understates the continuous supremum by about 1% at the usual
 * quantiles. Deterministic for a given seed, whatever the number of threads.
 *
 * @param parameters p, the number of parameters tested for a change
 * @param trimming   π0, the share of the sample excluded at each end
 * @param seed       the seed of the Mersenne Twister that drew the sample
 * @param draws      number of simulated suprema
 * @param sorted     the simulated suprema, ascending
 */
public record SupWaldDistribution(int parameters, double trimming, long seed, int draws, double[] sorted) {
    /** Default seed of the simulation, reported with every p-value. */
    public static final long DEFAULT_SEED = 19930701L;
    /** Default number of draws. */
    public static final int DEFAULT_DRAWS = 10_000;
    private static final int STEPS = 2000;
    /** Simulations already drawn in this process: a pure function of its arguments, so safe to reuse. */
    private static final java.util.Map<String, SupWaldDistribution> DRAWN = new java.util.concurrent.ConcurrentHashMap<>();

    public SupWaldDistribution {
        sorted = sorted.clone();
    }

    /**
     * Simulates the distribution for p parameters and trimming π0 (drawn once per process for each
     * argument set; the default seed and draws at trimming 0.15 come from {@link SupWaldTables}).
     */
    public static SupWaldDistribution simulate(int parameters, double trimming, long seed, int draws) {
        return simulate(parameters, trimming, seed, draws, 1);
    }

    /**
     * As {@link #simulate(int, double, long, int)}, the draws shared among {@code threads} threads; the
     * result is the same for every thread count.
     */
    public static SupWaldDistribution simulate(int parameters, double trimming, long seed, int draws, int threads) {
        return DRAWN.computeIfAbsent(parameters + "/" + trimming + "/" + seed + "/" + draws,
                key -> SupWaldTables.stored(parameters, trimming, seed, draws)
                        .orElseGet(() -> draw(parameters, trimming, seed, draws, threads)));
    }

    /** 32-bit generator words per batch of draws handed to the threads (16 MB). */
    private static final int BATCH_WORDS = 1 << 22;

    /**
     * The draws in batches: one thread takes the generator's words for a batch in sequence, then the
     * threads turn them into Gaussians and suprema, draw by draw. The Gaussians are those of Commons
     * Math's {@code MersenneTwister(seed).nextGaussian()} in order (Box-Muller on two 52-bit uniforms,
     * through Commons Math's FastMath), and a draw uses an even number of them, so each draw reads its
     * own block of words and the result does not depend on the thread count.
     */
    static SupWaldDistribution draw(int parameters, double trimming, long seed, int draws, int threads) {
        return draw(parameters, trimming, seed, draws, threads, BATCH_WORDS);
    }

    /** As {@link #draw(int, double, long, int, int)} with batches of at most {@code batchWords} words. */
    static SupWaldDistribution draw(int parameters, double trimming, long seed, int draws, int threads,
            int batchWords) {
        if (parameters < 1 || !(trimming > 0 && trimming < 0.5) || draws < 100) {
            throw new IllegalArgumentException("need p >= 1, 0 < trimming < 0.5 and at least 100 draws; got p = "
                    + parameters + ", trimming = " + trimming + ", draws = " + draws);
        }
        MersenneTwisterWords generator = new MersenneTwisterWords(seed);
        int wordsPerDraw = 2 * parameters * STEPS;
        int batch = Math.max(1, Math.min(draws, batchWords / wordsPerDraw));
        int[] words = new int[batch * wordsPerDraw];
        double[] suprema = new double[draws];
        for (int first = 0; first < draws; first += batch) {
            int count = Math.min(batch, draws - first);
            generator.fill(words, count * wordsPerDraw);
            List<Double> batchSuprema = ParallelRunner.map(count, threads,
                    i -> supremum(words, i * wordsPerDraw, parameters, trimming));
            for (int i = 0; i < count; i++) {
                suprema[first + i] = batchSuprema.get(i);
            }
        }
        Arrays.sort(suprema);
        return new SupWaldDistribution(parameters, trimming, seed, draws, suprema);
    }

    /** One draw: p random walks of {@link #STEPS} steps from the words at {@code offset}, and their supremum. */
    private static double supremum(int[] words, int offset, int parameters, double trimming) {
        double scale = Math.sqrt(1.0 / STEPS);
        int first = (int) Math.ceil(trimming * STEPS);
        int last = (int) Math.floor((1 - trimming) * STEPS);
        double[][] walk = new double[parameters][STEPS + 1];
        int at = offset;
        for (int k = 0; k < parameters; k++) {
            double[] w = walk[k];
            for (int i = 1; i <= STEPS; i += 2) {
                double x = uniform(words[at], words[at + 1]);
                double y = uniform(words[at + 2], words[at + 3]);
                at += 4;
                double alpha = 6.283185307179586 * x;
                double r = FastMath.sqrt(-2.0 * FastMath.log(y));
                w[i] = w[i - 1] + scale * (r * FastMath.cos(alpha));
                w[i + 1] = w[i] + scale * (r * FastMath.sin(alpha));
            }
        }
        double sup = 0.0;
        for (int i = first; i <= last; i++) {
            double lambda = i / (double) STEPS;
            double sum = 0.0;
            for (int k = 0; k < parameters; k++) {
                double bridge = walk[k][i] - lambda * walk[k][STEPS];
                sum += bridge * bridge;
            }
            sup = Math.max(sup, sum / (lambda * (1 - lambda)));
        }
        return sup;
    }

    /** A 52-bit uniform on [0, 1) from two generator words, the top 26 bits of each (Commons Math's nextDouble). */
    private static double uniform(int high, int low) {
        return (((long) (high >>> 6)) << 26 | (low >>> 6)) * 0x1.0p-52;
    }

    /** The critical value at upper-tail probability {@code alpha} (the empirical 1 - alpha quantile). */
    public double criticalValue(double alpha) {
        int index = (int) Math.ceil((1 - alpha) * draws) - 1;
        return sorted[Math.max(0, Math.min(draws - 1, index))];
    }

    /** P(sup-Wald ≥ statistic) under the null, as the share of simulated suprema at least as large. */
    public double pValue(double statistic) {
        int index = Arrays.binarySearch(sorted, statistic);
        int below = index >= 0 ? index : -index - 1;
        while (index >= 0 && below > 0 && sorted[below - 1] == statistic) {
            below--;
        }
        return (draws - below) / (double) draws;
    }

    @Override
    public double[] sorted() {
        return sorted.clone();
    }
}
