package org.orthogon.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import org.apache.commons.math3.random.MersenneTwister;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The batched, multi-threaded simulation of the sup-Wald null draws exactly what the plain loop over
 * Commons Math's Mersenne Twister draws, for every thread count.
 */
class SupWaldSimulationTest {

    @ParameterizedTest
    @ValueSource(longs = {0L, 1L, 19930701L, -7L, Long.MAX_VALUE, Long.MIN_VALUE, 0x1234_5678_9abc_def0L})
    void generatorWordsEqualCommonsMathsMersenneTwister(long seed) {
        // Commons Math 3.6.1 MersenneTwister(long): init_by_array of Matsumoto and Nishimura's reference code
        MersenneTwister reference = new MersenneTwister(seed);
        MersenneTwisterWords words = new MersenneTwisterWords(seed);
        int[] block = new int[3000];
        for (int round = 0; round < 4; round++) {
            words.fill(block, round == 2 ? 7 : block.length);
            for (int i = 0; i < (round == 2 ? 7 : block.length); i++) {
                assertThat(block[i]).as("word %d of round %d", i, round).isEqualTo(reference.nextInt());
            }
        }
    }

    /** The simulation as first written: one loop, Gaussians from Commons Math's nextGaussian. */
    private static double[] plainLoop(int parameters, double trimming, long seed, int draws) {
        int steps = 2000;
        MersenneTwister random = new MersenneTwister(seed);
        double scale = Math.sqrt(1.0 / steps);
        int first = (int) Math.ceil(trimming * steps);
        int last = (int) Math.floor((1 - trimming) * steps);
        double[][] walk = new double[parameters][steps + 1];
        double[] suprema = new double[draws];
        for (int d = 0; d < draws; d++) {
            for (int k = 0; k < parameters; k++) {
                for (int i = 1; i <= steps; i++) {
                    walk[k][i] = walk[k][i - 1] + scale * random.nextGaussian();
                }
            }
            double sup = 0.0;
            for (int i = first; i <= last; i++) {
                double lambda = i / (double) steps;
                double sum = 0.0;
                for (int k = 0; k < parameters; k++) {
                    double bridge = walk[k][i] - lambda * walk[k][steps];
                    sum += bridge * bridge;
                }
                sup = Math.max(sup, sum / (lambda * (1 - lambda)));
            }
            suprema[d] = sup;
        }
        Arrays.sort(suprema);
        return suprema;
    }

    @ParameterizedTest(name = "p = {0}, trimming {1}, seed {2}")
    @CsvSource({"1, 0.15, 19930701", "3, 0.15, 5", "2, 0.3, -11"})
    void batchedThreadsDrawWhatThePlainLoopDraws(int parameters, double trimming, long seed) {
        double[] expected = plainLoop(parameters, trimming, seed, 300);
        for (int threads : new int[] {1, 2, 3}) {
            assertThat(SupWaldDistribution.draw(parameters, trimming, seed, 300, threads).sorted())
                    .as("%d threads", threads).containsExactly(expected);
        }
        // batches of 7 draws: the generator's words are taken batch after batch
        assertThat(SupWaldDistribution.draw(parameters, trimming, seed, 300, 2, 7 * 4 * parameters * 2000).sorted())
                .containsExactly(expected);
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 3})
    void storedDefaultTablesAreTheSimulationBitForBit(int parameters) {
        SupWaldDistribution stored = SupWaldTables.stored(parameters, 0.15, SupWaldDistribution.DEFAULT_SEED,
                SupWaldDistribution.DEFAULT_DRAWS).orElseThrow();
        SupWaldDistribution drawn = SupWaldDistribution.draw(parameters, 0.15, SupWaldDistribution.DEFAULT_SEED,
                SupWaldDistribution.DEFAULT_DRAWS, 2);
        assertThat(stored.sorted()).containsExactly(drawn.sorted());
    }

    @org.junit.jupiter.api.Test
    void everyStoredTableIsComplete() {
        for (int p = 1; p <= SupWaldTables.LARGEST_P; p++) {
            double[] sorted = SupWaldTables.stored(p, 0.15, SupWaldDistribution.DEFAULT_SEED,
                    SupWaldDistribution.DEFAULT_DRAWS).orElseThrow().sorted();
            assertThat(sorted).hasSize(SupWaldDistribution.DEFAULT_DRAWS).isSorted();
            assertThat(sorted[0]).isPositive();
        }
        // anything else is simulated
        assertThat(SupWaldTables.stored(3, 0.2, SupWaldDistribution.DEFAULT_SEED, SupWaldDistribution.DEFAULT_DRAWS))
                .isEmpty();
        assertThat(SupWaldTables.stored(3, 0.15, 5L, SupWaldDistribution.DEFAULT_DRAWS)).isEmpty();
        assertThat(SupWaldTables.stored(SupWaldTables.LARGEST_P + 1, 0.15, SupWaldDistribution.DEFAULT_SEED,
                SupWaldDistribution.DEFAULT_DRAWS)).isEmpty();
    }
}
