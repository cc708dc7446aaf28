package org.orthogon.longrun;

/**
 * Products of tall row-major matrices that fill only the upper triangle of a symmetric result, the
 * inner kernel of every long-run covariance: S = U'V/T with V = WU is symmetric (W is a symmetric
 * Toeplitz matrix), so half of the K² sums suffice, and Γ_0 = U'U/T is a symmetric rank-k product.
 *
 * <p>Eight rows of the tall factors are folded into each pass over the triangle, so every element of
 * S is loaded and stored once per eight multiply-adds and the inner loop over a row of S runs over
 * contiguous memory, which the JIT compiles to vector instructions (common practice for a rank-k
 * update, no source). The order of the sums is fixed by the shapes alone, so the same inputs always
 * give the same bits.
 */
final class CrossProducts {
    private static final int BLOCK = 8;

    private CrossProducts() {
    }

    /**
     * s_pq += Σ_t a_tp b_tq for q ≥ p, over {@code rows} rows of the row-major {@code rows x cols}
     * arrays a and b; the lower triangle of s is left alone.
     */
    static void addUpper(double[] a, double[] b, int rows, int cols, double[] s) {
        int t = 0;
        for (; t + BLOCK <= rows; t += BLOCK) {
            int o0 = t * cols;
            int o1 = o0 + cols;
            int o2 = o1 + cols;
            int o3 = o2 + cols;
            int o4 = o3 + cols;
            int o5 = o4 + cols;
            int o6 = o5 + cols;
            int o7 = o6 + cols;
            for (int p = 0; p < cols; p++) {
                double a0 = a[o0 + p];
                double a1 = a[o1 + p];
                double a2 = a[o2 + p];
                double a3 = a[o3 + p];
                double a4 = a[o4 + p];
                double a5 = a[o5 + p];
                double a6 = a[o6 + p];
                double a7 = a[o7 + p];
                int row = p * cols;
                for (int q = p; q < cols; q++) {
                    s[row + q] += a0 * b[o0 + q] + a1 * b[o1 + q] + a2 * b[o2 + q] + a3 * b[o3 + q]
                            + a4 * b[o4 + q] + a5 * b[o5 + q] + a6 * b[o6 + q] + a7 * b[o7 + q];
                }
            }
        }
        for (; t < rows; t++) {
            int o = t * cols;
            for (int p = 0; p < cols; p++) {
                double ap = a[o + p];
                int row = p * cols;
                for (int q = p; q < cols; q++) {
                    s[row + q] += ap * b[o + q];
                }
            }
        }
    }

    /** Scales the upper triangle of s by {@code scale} and copies it into the lower one. */
    static void symmetricFromUpper(double[] s, int cols, double scale) {
        for (int p = 0; p < cols; p++) {
            for (int q = p; q < cols; q++) {
                double v = s[p * cols + q] * scale;
                s[p * cols + q] = v;
                s[q * cols + p] = v;
            }
        }
    }
}
