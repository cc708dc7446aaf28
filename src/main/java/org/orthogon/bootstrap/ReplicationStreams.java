package org.orthogon.bootstrap;

import org.apache.commons.math3.random.MersenneTwister;
import org.apache.commons.math3.random.RandomGenerator;

/**
 * The random stream of each replication, a pure function of the run's seed and the replication's
 * index, so that replications can run on any thread in any order and a run gives the same bytes for
 * every thread count. The stream is the Mersenne Twister (Matsumoto and Nishimura 1998; Commons Math's
 * {@code MersenneTwister(long)}) seeded with SplitMix64's finaliser (Steele, Lea and Flood 2014, "Fast
 * splittable pseudorandom number generators", OOPSLA) applied to seed + (index + 1) γ, γ the 64-bit
 * golden-ratio increment; the finaliser spreads neighbouring indices over unrelated seeds.
 */
public final class ReplicationStreams {
    private static final long GOLDEN_GAMMA = 0x9E3779B97F4A7C15L;

    private ReplicationStreams() {
    }

    /** The generator of replication {@code index} (0, 1, ...) of a run seeded with {@code seed}. */
    public static RandomGenerator stream(long seed, int index) {
        return new MersenneTwister(replicationSeed(seed, index));
    }

    /** The seed of replication {@code index}: SplitMix64's finaliser of seed + (index + 1) γ. */
    static long replicationSeed(long seed, int index) {
        long z = seed + (index + 1L) * GOLDEN_GAMMA;
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
