package org.orthogon.moments;

/**
 * Per-observation derivatives by central differences, for families whose errors have no analytic
 * derivative (user-written SDF expressions) and as the yardstick the analytic derivatives of the
 * built-in families are tested against.
 *
 * <p>For parameter p the step is h_p = ε^{1/3} max(|θ_p|, 1) with ε the machine epsilon, and
 * ∂e/∂θ_p ≈ (e(θ + h_p u_p) - e(θ - h_p u_p)) / (θ_p^+ - θ_p^-), where the denominator is the
 * difference of the two perturbed values as actually stored. The ε^{1/3} step balances the O(h²)
 * truncation error against the O(ε/h) rounding error, leaving an error of order ε^{2/3}, about 4e-11
 * relative (Nocedal and Wright 2006, "Numerical Optimization", 2nd edition, section 8.1; from memory).
 * Dividing by the stored difference rather than by 2h removes the representation error of θ ± h
 * (the same reference).
 */
public final class CentralDifferences {

    /** ε^{1/3} for doubles, ε = 2^-52. */
    public static final double RELATIVE_STEP = Math.cbrt(Math.ulp(1.0));

    /** Errors e(θ) of one family written into a flat array, as {@link ObservationErrors#errors} does. */
    @FunctionalInterface
    public interface ErrorFunction {
        void errors(double[] theta, double[] out);
    }

    private CentralDifferences() {
    }

    /** The step h_p = ε^{1/3} max(|θ_p|, 1) used for parameter value {@code value}. */
    public static double step(double value) {
        return RELATIVE_STEP * Math.max(Math.abs(value), 1.0);
    }

    /**
     * Fills {@code out[p]} (each of length {@code size}) with the central-difference derivative
     * ∂e_j/∂θ_p of every component j of {@code function}, with the scaled steps described above.
     *
     * @param function the errors; called twice per parameter
     * @param theta    the point, not modified
     * @param size     the number of error components (T*N)
     * @param out      P arrays of length {@code size}
     */
    public static void derivatives(ErrorFunction function, double[] theta, int size, double[][] out) {
        double[] up = new double[size];
        double[] down = new double[size];
        double[] shifted = theta.clone();
        for (int p = 0; p < theta.length; p++) {
            double h = step(theta[p]);
            double plus = theta[p] + h;
            double minus = theta[p] - h;
            shifted[p] = plus;
            function.errors(shifted, up);
            shifted[p] = minus;
            function.errors(shifted, down);
            shifted[p] = theta[p];
            double width = plus - minus;
            double[] column = out[p];
            for (int j = 0; j < size; j++) {
                column[j] = (up[j] - down[j]) / width;
            }
        }
    }

    /**
     * The central-difference derivatives of a family's errors at θ: {@code [p][t*N + i]}, in the layout
     * of {@link ObservationErrors#errorDerivatives}.
     */
    public static double[][] derivatives(ObservationErrors errors, double[] theta) {
        int size = errors.observations() * errors.assetNames().size();
        double[][] out = new double[theta.length][size];
        derivatives(errors::errors, theta, size, out);
        return out;
    }
}
