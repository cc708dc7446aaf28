package org.orthogon.robust;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * How the weak-identification-robust sets are searched for.
 *
 * @param level        the confidence level of the sets, in (0, 1)
 * @param points       grid points per parameter of the concentrated profiles (at least 11)
 * @param jointPoints  grid points per axis of the joint set when P = 2 (at least 11)
 * @param width        half-width of the default search range in Wald standard errors: θ̂ ± width·se,
 *                     cut at the parameter bounds
 * @param ranges       search ranges given by name, [low, high], replacing the default for that parameter
 */
public record RobustSetOptions(double level, int points, int jointPoints, double width, Map<String, double[]> ranges) {
    public static final int DEFAULT_POINTS = 201;
    public static final int DEFAULT_JOINT_POINTS = 61;
    public static final double DEFAULT_WIDTH = 20.0;

    public RobustSetOptions {
        if (!(level > 0.0 && level < 1.0)) {
            throw new IllegalArgumentException("level must lie strictly between 0 and 1, got " + level);
        }
        if (points < 11 || jointPoints < 11) {
            throw new IllegalArgumentException("a search grid needs at least 11 points, got " + points + " and "
                    + jointPoints);
        }
        if (!(width > 0.0) || Double.isInfinite(width)) {
            throw new IllegalArgumentException("width must be a positive number, got " + width);
        }
        Map<String, double[]> copy = new LinkedHashMap<>();
        for (Map.Entry<String, double[]> e : ranges.entrySet()) {
            double[] r = e.getValue();
            if (r.length != 2 || !(r[0] < r[1]) || !Double.isFinite(r[0]) || !Double.isFinite(r[1])) {
                throw new IllegalArgumentException("the search range of " + e.getKey() + " must be two finite numbers "
                        + "low < high");
            }
            copy.put(e.getKey(), r.clone());
        }
        ranges = java.util.Collections.unmodifiableMap(copy);
    }

    /** The defaults at a level: 201 profile points, a 61 x 61 joint grid, θ̂ ± 20 se. */
    public static RobustSetOptions defaults(double level) {
        return new RobustSetOptions(level, DEFAULT_POINTS, DEFAULT_JOINT_POINTS, DEFAULT_WIDTH, Map.of());
    }

    public RobustSetOptions withRanges(Map<String, double[]> given) {
        return new RobustSetOptions(level, points, jointPoints, width, given);
    }

    public RobustSetOptions withPoints(int profile, int joint) {
        return new RobustSetOptions(level, profile, joint, width, ranges);
    }
}
