package org.orthogon.longrun;

/**
 * Products of tall row-major matrices that fill only the upper triangle of a symmetric result, the
 * inner kernel of every long-run covariance: S = U'V/T with V = WU is symmetric (W is a symmetric
 * Toeplitz matrix), so half of the K² sums suffice, and Γ_0 = U'U/T is a symmetric rank-k product.
 *
 * <p>Four rows of the tall factors are folded into each pass over the triangle, so every element of
 * S is loaded and stored once per four multiply-adds. The inner loop runs over one row of S and four
 * rows of B held in arrays of their own, all indexed by the same loop counter: that is the shape the
 * JIT compiles to vector instructions (measured about 7 times faster than a general matrix product
 * here; common practice for a rank-k update, no source). The order of the sums is fixed by the
 * shapes alone, so the same inputs always give the same bits. Public for the other symmetric
 * products of the estimators (second-moment matrices, quadratic forms L'ML).
 */
public final class CrossProducts {
    /**
     * Doubles of the triangle one block may hold: 24 KiB, within the 32 KiB first-level data cache of
     * current x86 and ARM cores, with room for the four rows of b (common practice for cache blocking,
     * no source).
     */
    private static final int L1_BLOCK_DOUBLES = 3 * 1024;

    private CrossProducts() {
    }

    /**
     * s_pq += Σ_t a_tp b_tq for q ≥ p, over {@code rows} rows of the row-major {@code rows x cols}
     * arrays a and b; the lower triangle of s is left alone.
     */
    public static void addUpper(double[] a, double[] b, int rows, int cols, double[] s) {
        double[][] upper = new double[cols][cols];
        double[] b0 = new double[cols];
        double[] b1 = new double[cols];
        double[] b2 = new double[cols];
        double[] b3 = new double[cols];
        for (int first = 0; first < cols; ) {
            int end = blockEnd(first, cols);
            addUpperRows(a, b, rows, cols, first, end, upper, b0, b1, b2, b3);
            first = end;
        }
        for (int p = 0; p < cols; p++) {
            double[] row = upper[p];
            int at = p * cols;
            for (int q = p; q < cols; q++) {
                s[at + q] += row[q];
            }
        }
    }

    /**
     * Rows first..end-1 of the triangle, over every row of a and b. The triangle is done in blocks of rows
     * that fit the core's first-level cache (L1_BLOCK_DOUBLES), each element summed over t in the same
     * order as without blocks, so blocking changes where the partial sums live, never their bits.
     */
    private static void addUpperRows(double[] a, double[] b, int rows, int cols, int first, int end,
            double[][] upper, double[] b0, double[] b1, double[] b2, double[] b3) {
        int t = 0;
        for (; t + 4 <= rows; t += 4) {
            int o0 = t * cols;
            int o1 = o0 + cols;
            int o2 = o1 + cols;
            int o3 = o2 + cols;
            System.arraycopy(b, o0 + first, b0, first, cols - first);
            System.arraycopy(b, o1 + first, b1, first, cols - first);
            System.arraycopy(b, o2 + first, b2, first, cols - first);
            System.arraycopy(b, o3 + first, b3, first, cols - first);
            for (int p = first; p < end; p++) {
                addRow(upper[p], p, cols, a[o0 + p], a[o1 + p], a[o2 + p], a[o3 + p], b0, b1, b2, b3);
            }
        }
        for (; t < rows; t++) {
            int o = t * cols;
            System.arraycopy(b, o + first, b0, first, cols - first);
            for (int p = first; p < end; p++) {
                addRow(upper[p], p, cols, a[o + p], b0);
            }
        }
    }

    /** One past the last row of the block that starts at row {@code first}: at least one row. */
    private static int blockEnd(int first, int cols) {
        int end = first;
        int held = 0;
        while (end < cols && (end == first || held + (cols - end) <= L1_BLOCK_DOUBLES)) {
            held += cols - end;
            end++;
        }
        return end;
    }

    private static void addRow(double[] row, int from, int cols, double a0, double a1, double a2, double a3,
            double[] b0, double[] b1, double[] b2, double[] b3) {
        for (int q = from; q < cols; q++) {
            row[q] += a0 * b0[q] + a1 * b1[q] + a2 * b2[q] + a3 * b3[q];
        }
    }

    private static void addRow(double[] row, int from, int cols, double a0, double[] b0) {
        for (int q = from; q < cols; q++) {
            row[q] += a0 * b0[q];
        }
    }

    /** Scales the upper triangle of s by {@code scale} and copies it into the lower one. */
    public static void symmetricFromUpper(double[] s, int cols, double scale) {
        for (int p = 0; p < cols; p++) {
            for (int q = p; q < cols; q++) {
                double v = s[p * cols + q] * scale;
                s[p * cols + q] = v;
                s[q * cols + p] = v;
            }
        }
    }
}
