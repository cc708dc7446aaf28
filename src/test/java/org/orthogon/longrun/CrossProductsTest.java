package org.orthogon.longrun;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;

/**
 * The symmetric product kernel against EJML's general product A'B (the reference library's own
 * multTransA), for shapes that fit one cache block and shapes split into several, and a row count that
 * leaves a remainder after the four-row passes; and the bits of every element against the same sums
 * taken in the unblocked order (each element summed over t four rows at a time, then row by row), which
 * the blocking must not change.
 */
class CrossProductsTest {
    @Test
    void upperTriangleIsEjmlsProductForOneBlockAndForMany() {
        for (int cols : new int[] {1, 3, 25, 100, 157}) {
            for (int rows : new int[] {1, 7, 120, 1203}) {
                Random random = new Random(31L * cols + rows);
                DMatrixRMaj a = random(rows, cols, random);
                DMatrixRMaj b = random(rows, cols, random);
                double[] s = new double[cols * cols];
                s[0] = 0.5; // addUpper adds to what is there
                CrossProducts.addUpper(a.data, b.data, rows, cols, s);
                DMatrixRMaj reference = new DMatrixRMaj(cols, cols);
                CommonOps_DDRM.multTransA(a, b, reference);
                for (int p = 0; p < cols; p++) {
                    for (int q = 0; q < cols; q++) {
                        double expected = q < p ? 0.0 : reference.get(p, q) + (p == 0 && q == 0 ? 0.5 : 0.0);
                        // 1e-12 relative: sums of up to 1203 products of unit normals in another order differ
                        // by a few hundred rounding units at most (common practice, no source)
                        assertThat(s[p * cols + q]).as("cols %d rows %d (%d, %d)", cols, rows, p, q)
                                .isCloseTo(expected, within(1e-12 * Math.max(1.0, Math.abs(expected))));
                    }
                }
                assertThat(s).as("cols %d rows %d", cols, rows).isEqualTo(unblocked(a.data, b.data, rows, cols));
            }
        }
    }

    /** The sums in the kernel's order without blocks: Σ over passes of (a0 b0 + a1 b1 + a2 b2 + a3 b3), then single rows. */
    private static double[] unblocked(double[] a, double[] b, int rows, int cols) {
        double[] s = new double[cols * cols];
        for (int p = 0; p < cols; p++) {
            for (int q = p; q < cols; q++) {
                double sum = 0.0;
                int t = 0;
                for (; t + 4 <= rows; t += 4) {
                    int o = t * cols;
                    sum += a[o + p] * b[o + q] + a[o + cols + p] * b[o + cols + q]
                            + a[o + 2 * cols + p] * b[o + 2 * cols + q] + a[o + 3 * cols + p] * b[o + 3 * cols + q];
                }
                for (; t < rows; t++) {
                    sum += a[t * cols + p] * b[t * cols + q];
                }
                s[p * cols + q] = sum;
            }
        }
        s[0] += 0.5;
        return s;
    }

    private static DMatrixRMaj random(int rows, int cols, Random random) {
        DMatrixRMaj m = new DMatrixRMaj(rows, cols);
        for (int i = 0; i < m.data.length; i++) {
            m.data[i] = random.nextGaussian();
        }
        return m;
    }
}
