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
        check();
        if (replications == null) {
            return null;
        }
        return new BootstrapPlan(replications, blockLength(blockLength, observations), scheme(scheme),
                seed == null ? BootstrapPlan.DEFAULT_SEED : seed);
    }

    /** The block length given (0 for the automatic rule), refused when below one or above T/2. */
    static int blockLength(Integer given, int observations) {
        if (given == null) {
            return 0;
        }
        if (given < 1) {
            throw InputException.general().problem("--block-length " + given + " is below one",
                    "give a whole number of rows per block of at least 1, or leave it out for the automatic rule");
        }
        if (given > observations / 2) {
            throw InputException.general().problem("--block-length " + given + " leaves fewer than two blocks "
                    + "in the " + observations + " observations", "give a block length of at most " + observations / 2
                    + ", or leave it out for the automatic rule");
        }
        return given;
    }

    /** The block scheme named (moving when none is), refused when unknown. */
    static BlockScheme scheme(String given) {
        if (given == null) {
            return BootstrapPlan.DEFAULT_SCHEME;
        }
        try {
            return BlockScheme.fromId(given);
        } catch (IllegalArgumentException e) {
            throw InputException.general().problem("--block-scheme \"" + given + "\" is not a block scheme",
                    "use one of " + BlockScheme.ids());
        }
    }

    /** The checks that need no data: run before any file is read. */
    void check() {
        if (replications == null) {
            if (blockLength != null || scheme != null) {
                throw InputException.general().problem((blockLength != null ? "--block-length" : "--block-scheme")
                        + " was given without --bootstrap", "add --bootstrap B (e.g. --bootstrap 999), or drop the "
                        + "block option");
            }
            return;
        }
        if (replications < BootstrapPlan.MIN_REPLICATIONS || replications > BootstrapPlan.MAX_REPLICATIONS) {
            throw InputException.general().problem("--bootstrap " + replications + " is outside "
                    + BootstrapPlan.MIN_REPLICATIONS + ".." + BootstrapPlan.MAX_REPLICATIONS, "give at least "
                    + BootstrapPlan.MIN_REPLICATIONS + " replications (below that no p-value can fall under 5%), "
                    + "e.g. --bootstrap 999");
        }
        blockLength(blockLength, Integer.MAX_VALUE);
        scheme(scheme);
    }
}
