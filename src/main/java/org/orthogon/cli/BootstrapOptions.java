package org.orthogon.cli;

import org.orthogon.bootstrap.BlockScheme;
import org.orthogon.bootstrap.BootstrapPlan;
import org.orthogon.data.InputException;
import picocli.CommandLine.Option;

/**
 * {@code --bootstrap B [--block-length L] [--block-scheme moving|circular]}: the recentred block
 * bootstrap's choices, shared by {@code fit} and {@code stability}; the seed is the verb's own
 * {@code --seed}.
 */
final class BootstrapOptions {
    @Option(names = "--bootstrap", paramLabel = "B", description = "recentred block bootstrap with B replications "
            + "(Hall-Horowitz 1996; at least " + BootstrapPlan.MIN_REPLICATIONS + ", 999 or more for intervals)")
    Integer replications;

    @Option(names = "--block-length", paramLabel = "L", description = "rows per bootstrap block (default: the "
            + "Politis-White 2004 rule on the moment contributions)")
    Integer blockLength;

    @Option(names = "--block-scheme", paramLabel = "SCHEME", description = "moving (Künsch 1989, the default) or "
            + "circular (Politis-Romano 1992) blocks")
    String scheme;

    /** Whether a bootstrap was asked for. */
    boolean requested() {
        return replications != null;
    }

    /**
     * The plan for a sample of {@code observations} rows, or null when no bootstrap was asked for;
     * refuses a bad B, block length or scheme, and block options without --bootstrap.
     */
    BootstrapPlan plan(int observations, Long seed) {
        if (replications == null) {
            if (blockLength != null || scheme != null) {
                throw InputException.general().problem((blockLength != null ? "--block-length" : "--block-scheme")
                        + " was given without --bootstrap", "add --bootstrap B (e.g. --bootstrap 999), or drop the "
                        + "block option");
            }
            return null;
        }
        check();
        if (blockLength != null && blockLength > observations / 2) {
            throw InputException.general().problem("--block-length " + blockLength + " leaves fewer than two blocks "
                    + "in the " + observations + " observations", "give a block length of at most " + observations / 2
                    + ", or leave it out for the automatic rule");
        }
        BlockScheme blocks = scheme == null ? BootstrapPlan.DEFAULT_SCHEME : BlockScheme.fromId(scheme);
        return new BootstrapPlan(replications, blockLength == null ? 0 : blockLength, blocks,
                seed == null ? BootstrapPlan.DEFAULT_SEED : seed);
    }

    /** The checks that need no data: run before any file is read. */
    void check() {
        if (replications == null) {
            return;
        }
        if (replications < BootstrapPlan.MIN_REPLICATIONS || replications > BootstrapPlan.MAX_REPLICATIONS) {
            throw InputException.general().problem("--bootstrap " + replications + " is outside "
                    + BootstrapPlan.MIN_REPLICATIONS + ".." + BootstrapPlan.MAX_REPLICATIONS, "give at least "
                    + BootstrapPlan.MIN_REPLICATIONS + " replications (below that no p-value can fall under 5%), "
                    + "e.g. --bootstrap 999");
        }
        if (blockLength != null && blockLength < 1) {
            throw InputException.general().problem("--block-length " + blockLength + " is below one",
                    "give a whole number of rows per block of at least 1, or leave it out for the automatic rule");
        }
        if (scheme != null) {
            try {
                BlockScheme.fromId(scheme);
            } catch (IllegalArgumentException e) {
                throw InputException.general().problem("--block-scheme \"" + scheme + "\" is not a block scheme",
                        "use one of " + BlockScheme.ids());
            }
        }
    }
}
