package org.orthogon.bootstrap;

import java.util.Arrays;
import java.util.stream.Collectors;

/**
 * How a block bootstrap cuts the sample into blocks of L consecutive rows.
 * <ul>
 *   <li>moving blocks (Künsch 1989, "The jackknife and the bootstrap for general stationary
 *       observations", Annals of Statistics 17): a block starts at any of the T - L + 1 rows from which
 *       L rows remain;</li>
 *   <li>circular blocks (Politis and Romano 1992, "A circular block-resampling procedure for stationary
 *       data", in Exploring the Limits of Bootstrap): the sample is wrapped on a circle, a block starts at
 *       any of the T rows and runs past the last row into the first, so every row is equally likely to
 *       be drawn and the bootstrap mean of any series is its sample mean.</li>
 * </ul>
 */
public enum BlockScheme {
    MOVING("moving"),
    CIRCULAR("circular");

    private final String id;

    BlockScheme(String id) {
        this.id = id;
    }

    /** The word used on the command line, in the model file and in the JSON. */
    public String id() {
        return id;
    }

    /** The scheme named {@code id}; IllegalArgumentException naming the choices otherwise. */
    public static BlockScheme fromId(String id) {
        for (BlockScheme scheme : values()) {
            if (scheme.id.equals(id)) {
                return scheme;
            }
        }
        throw new IllegalArgumentException("block scheme \"" + id + "\" is not one of " + ids());
    }

    /** The ids joined for messages: "moving, circular". */
    public static String ids() {
        return Arrays.stream(values()).map(BlockScheme::id).collect(Collectors.joining(", "));
    }
}
