package org.orthogon.bootstrap;

/**
 * What a bootstrap run draws.
 *
 * @param replications B, the number of resamples
 * @param blockLength  L, or 0 to choose it by {@link BlockLengthRule}
 * @param scheme       moving or circular blocks
 * @param seed         the seed every replication's stream derives from ({@link ReplicationStreams})
 */
public record BootstrapPlan(int replications, int blockLength, BlockScheme scheme, long seed) {
    /** The seed used when none is given. */
    public static final long DEFAULT_SEED = 19960701L;
    /** The block scheme used when none is given. */
    public static final BlockScheme DEFAULT_SCHEME = BlockScheme.MOVING;
    /** Fewest replications accepted: below 19 no p-value can fall below 5%. */
    public static final int MIN_REPLICATIONS = 19;
    /** Most replications accepted, a guard against a typo that would run for days. */
    public static final int MAX_REPLICATIONS = 1_000_000;
    /** The share of failed replications above which a run is refused rather than reported. */
    public static final double MAX_FAILED_SHARE = 0.10;

    public BootstrapPlan {
        if (replications < 1) {
            throw new IllegalArgumentException("replications must be at least 1, got " + replications);
        }
        if (blockLength < 0) {
            throw new IllegalArgumentException("block length must be 0 (automatic) or positive, got " + blockLength);
        }
        java.util.Objects.requireNonNull(scheme, "scheme");
    }

    /** Whether the block length is chosen by the automatic rule. */
    public boolean automaticBlockLength() {
        return blockLength == 0;
    }

    /** The block length for the given contributions: the plan's, or the rule's. */
    public int blockLengthFor(org.ejml.data.DMatrixRMaj contributions) {
        return automaticBlockLength() ? BlockLengthRule.choose(contributions) : blockLength;
    }
}
