package org.orthogon.gmm;

import java.util.Arrays;
import java.util.List;
import java.util.Map;

/**
 * Closed bounds lower_p ≤ θ_p ≤ upper_p per parameter, in the model's parameter order; ±∞ for no bound.
 * An estimate that ends on a bound is never reported as clean: the optimum may lie beyond it, so the
 * interior-optimum standard errors and tests do not apply (Andrews 1999, Econometrica 67).
 * {@link #none()} has no entries and means "unbounded" for a model of any size.
 */
public record ParameterBounds(double[] lower, double[] upper) {

    public ParameterBounds {
        lower = lower.clone();
        upper = upper.clone();
        if (lower.length != upper.length) {
            throw new IllegalArgumentException("bounds have " + lower.length + " lower and " + upper.length
                    + " upper values");
        }
        for (int p = 0; p < lower.length; p++) {
            if (Double.isNaN(lower[p]) || Double.isNaN(upper[p]) || !(lower[p] < upper[p])) {
                throw new IllegalArgumentException("parameter " + (p + 1) + " has lower bound " + lower[p]
                        + " and upper bound " + upper[p] + "; the lower must be below the upper");
            }
        }
    }

    /** No bounds on any parameter. */
    public static ParameterBounds none() {
        return new ParameterBounds(new double[0], new double[0]);
    }

    /**
     * Bounds looked up by parameter name, e.g. {@code Map.of("beta", new double[] {0.0, Double.POSITIVE_INFINITY})};
     * unnamed parameters are unbounded, an unknown name is an IllegalArgumentException naming the known ones.
     */
    public static ParameterBounds byName(List<String> parameterNames, Map<String, double[]> bounds) {
        double[] lower = new double[parameterNames.size()];
        double[] upper = new double[parameterNames.size()];
        Arrays.fill(lower, Double.NEGATIVE_INFINITY);
        Arrays.fill(upper, Double.POSITIVE_INFINITY);
        for (Map.Entry<String, double[]> entry : bounds.entrySet()) {
            int p = parameterNames.indexOf(entry.getKey());
            if (p < 0) {
                throw new IllegalArgumentException("bound for unknown parameter \"" + entry.getKey()
                        + "\"; the model has " + parameterNames);
            }
            if (entry.getValue().length != 2) {
                throw new IllegalArgumentException("bound for \"" + entry.getKey() + "\" needs {lower, upper}");
            }
            lower[p] = entry.getValue()[0];
            upper[p] = entry.getValue()[1];
        }
        return new ParameterBounds(lower, upper);
    }

    @Override
    public double[] lower() {
        return lower.clone();
    }

    @Override
    public double[] upper() {
        return upper.clone();
    }

    /** True when no parameter is bounded. */
    public boolean isUnbounded() {
        for (int p = 0; p < lower.length; p++) {
            if (lower[p] != Double.NEGATIVE_INFINITY || upper[p] != Double.POSITIVE_INFINITY) {
                return false;
            }
        }
        return true;
    }

    /** These bounds for a model with {@code parameters} parameters ({@link #none()} expands to ±∞). */
    public ParameterBounds forParameters(int parameters) {
        if (lower.length == parameters) {
            return this;
        }
        if (lower.length == 0) {
            double[] lo = new double[parameters];
            double[] hi = new double[parameters];
            Arrays.fill(lo, Double.NEGATIVE_INFINITY);
            Arrays.fill(hi, Double.POSITIVE_INFINITY);
            return new ParameterBounds(lo, hi);
        }
        throw new IllegalArgumentException("bounds for " + lower.length + " parameters given to a model with "
                + parameters);
    }

    /** θ moved into the box, a new array. */
    double[] clamp(double[] theta) {
        double[] out = theta.clone();
        for (int p = 0; p < out.length; p++) {
            out[p] = Math.min(upper[p], Math.max(lower[p], out[p]));
        }
        return out;
    }

    /**
     * The parameters within a relative 1e-7 of a bound, described for a reader, e.g.
     * "beta = 0 (its lower bound)".
     */
    List<String> atBounds(double[] theta, List<String> names) {
        List<String> out = new java.util.ArrayList<>();
        boolean[] free = freeParameters(theta);
        for (int p = 0; p < theta.length; p++) {
            if (!free[p]) {
                boolean low = theta[p] - lower[p] <= upper[p] - theta[p];
                out.add(names.get(p) + " = " + (low ? lower[p] : upper[p])
                        + (low ? " (its lower bound)" : " (its upper bound)"));
            }
        }
        return out;
    }

    /** False for the parameters within a relative 1e-7 of a bound, true for the others. */
    boolean[] freeParameters(double[] theta) {
        boolean[] free = new boolean[theta.length];
        for (int p = 0; p < theta.length; p++) {
            double tolerance = 1e-7 * Math.max(1.0, Math.abs(theta[p]));
            free[p] = theta[p] - lower[p] > tolerance && upper[p] - theta[p] > tolerance;
        }
        return free;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof ParameterBounds b && Arrays.equals(lower, b.lower) && Arrays.equals(upper, b.upper);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(lower) + Arrays.hashCode(upper);
    }

    @Override
    public String toString() {
        return "ParameterBounds[lower=" + Arrays.toString(lower) + ", upper=" + Arrays.toString(upper) + "]";
    }
}
