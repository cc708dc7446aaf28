package org.orthogon.bootstrap;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.apache.commons.math3.random.MersenneTwister;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.orthogon.longrun.Kernel;

/**
 * Block resampling and the moments of its bootstrap world, checked against exhaustive enumeration of
 * every possible resample of a small series (the definition of the bootstrap expectation: each block
 * start equally likely, blocks independent; Künsch 1989, Politis and Romano 1992).
 */
class BlockResamplerTest {
    private static DMatrixRMaj series(int t, int k, long seed) {
        MersenneTwister random = new MersenneTwister(seed);
        DMatrixRMaj f = new DMatrixRMaj(t, k);
        for (int i = 0; i < f.data.length; i++) {
            f.data[i] = random.nextGaussian() + 0.3 * (i / k);
        }
        return f;
    }

    @ParameterizedTest
    @EnumSource(BlockScheme.class)
    void resamplesAreBlocksOfConsecutiveRows(BlockScheme scheme) {
        BlockResampler resampler = new BlockResampler(23, 5, scheme);
        int[] rows = resampler.draw(new MersenneTwister(3L));
        assertThat(rows).hasSize(23);
        for (int r = 0; r < rows.length; r++) {
            assertThat(rows[r]).isBetween(0, 22);
            if (r % 5 != 0) {
                assertThat(rows[r]).isEqualTo((rows[r - 1] + 1) % 23);
            } else if (scheme == BlockScheme.MOVING) {
                assertThat(rows[r]).as("a moving block starts where 5 rows remain").isLessThanOrEqualTo(18);
            }
        }
        assertThat(resampler.draw(new MersenneTwister(3L))).isEqualTo(rows);
    }

    /** Every combination of block starts, each equally likely: the exact bootstrap mean and covariance. */
    private static double[][] enumerate(DMatrixRMaj f, BlockResampler resampler) {
        int t = f.numRows;
        int k = f.numCols;
        int l = resampler.blockLength();
        int blocks = (t + l - 1) / l;
        int starts = resampler.blockCount();
        int combinations = (int) Math.pow(starts, blocks);
        double[] mean = new double[k];
        double[] second = new double[k * k];
        for (int c = 0; c < combinations; c++) {
            int code = c;
            double[] g = new double[k];
            int filled = 0;
            for (int b = 0; b < blocks; b++) {
                int start = code % starts;
                code /= starts;
                for (int i = 0; i < l && filled < t; i++, filled++) {
                    int row = (start + i) % t;
                    for (int j = 0; j < k; j++) {
                        g[j] += f.get(row, j) / t;
                    }
                }
            }
            for (int a = 0; a < k; a++) {
                mean[a] += g[a] / combinations;
                for (int b = 0; b < k; b++) {
                    second[a * k + b] += t * g[a] * g[b] / combinations;
                }
            }
        }
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                second[a * k + b] -= t * mean[a] * mean[b];
            }
        }
        return new double[][] {mean, second};
    }

    @ParameterizedTest
    @EnumSource(BlockScheme.class)
    void expectedMeanIsTheAverageOverEveryResample(BlockScheme scheme) {
        DMatrixRMaj f = series(7, 2, 11L);
        BlockResampler resampler = new BlockResampler(7, 3, scheme);
        double[] exact = enumerate(f, resampler)[0];
        assertThat(resampler.expectedMean(f)).containsExactly(exact, within(1e-12));
        if (scheme == BlockScheme.CIRCULAR) {
            // every row equally likely: the sample mean
            double mean = 0.0;
            for (int t = 0; t < 7; t++) {
                mean += f.get(t, 0) / 7;
            }
            assertThat(exact[0]).isCloseTo(mean, within(1e-12));
        }
    }

    @ParameterizedTest
    @EnumSource(BlockScheme.class)
    void blockCovarianceIsTheExactBootstrapCovarianceOfTheMean(BlockScheme scheme) {
        // T a multiple of L, so every block is whole and Σ̃ = T Var*(ḡ*) exactly
        DMatrixRMaj f = series(8, 2, 5L);
        BlockResampler resampler = new BlockResampler(8, 4, scheme);
        double[] exact = enumerate(f, resampler)[1];
        DMatrixRMaj[] world = resampler.worldCovariances(f, Kernel.BARTLETT, 3.0);
        assertThat(world[0].data).containsExactly(exact, within(1e-12));
    }

    @Test
    void kernelCovarianceWeighsWithinBlockLagsByTheKernelAndTheShareInsideABlock() {
        DMatrixRMaj f = series(40, 1, 9L);
        BlockResampler resampler = new BlockResampler(40, 4, BlockScheme.CIRCULAR);
        DMatrixRMaj[] world = resampler.worldCovariances(f, Kernel.BARTLETT, 3.0);
        // circular autocovariances around the sample mean; Bartlett k(j/3) = 1 - j/3
        double mean = 0.0;
        for (int t = 0; t < 40; t++) {
            mean += f.get(t, 0) / 40;
        }
        double block = 0.0;
        double kernel = 0.0;
        for (int j = 0; j < 4; j++) {
            double gamma = 0.0;
            for (int t = 0; t < 40; t++) {
                gamma += (f.get(t, 0) - mean) * (f.get((t + j) % 40, 0) - mean) / 40;
            }
            double share = 1.0 - j / 4.0;
            double weight = Math.max(0.0, 1.0 - j / 3.0);
            block += (j == 0 ? 1 : 2) * share * gamma;
            kernel += (j == 0 ? 1 : 2) * weight * share * gamma;
        }
        assertThat(world[0].get(0, 0)).isCloseTo(block, within(1e-12));
        assertThat(world[1].get(0, 0)).isCloseTo(kernel, within(1e-12));
        // blocks of one row: both are Γ_0
        DMatrixRMaj[] single = new BlockResampler(40, 1, BlockScheme.MOVING).worldCovariances(f, Kernel.BARTLETT, 3.0);
        assertThat(single[0].get(0, 0)).isCloseTo(single[1].get(0, 0), within(1e-15));
    }

    @Test
    void replicationStreamsArePureFunctionsOfSeedAndIndex() {
        assertThat(ReplicationStreams.stream(7L, 3).nextLong()).isEqualTo(ReplicationStreams.stream(7L, 3).nextLong());
        assertThat(ReplicationStreams.replicationSeed(7L, 3)).isNotEqualTo(ReplicationStreams.replicationSeed(7L, 4));
        assertThat(ReplicationStreams.replicationSeed(7L, 3)).isNotEqualTo(ReplicationStreams.replicationSeed(8L, 3));
    }
}
