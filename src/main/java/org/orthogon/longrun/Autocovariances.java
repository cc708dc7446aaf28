package org.orthogon.longrun;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;

/**
 * The sample autocovariances Γ_j = (1/T) Σ_{t=j+1..T} u_t u_{t-j}' of a series u_t (rows of a
 * T x K matrix), computed once and kept, so that several kernels and bandwidths can be applied to
 * the same series without recomputing them (the quadratic spectral kernel needs all T - 1 lags).
 *
 * <p>The divisor is T, not T - j (DESIGN.md section 3). Not thread-safe.
 */
public final class Autocovariances {

    private final double[] u;
    private final int rows;
    private final int cols;
    private final double divisor;
    private final boolean centered;
    /** Γ_0..Γ_computed, each K x K row-major, back to back. */
    private double[] gammas = new double[0];
    private int computed = -1;

    private Autocovariances(double[] u, int rows, int cols, double divisor, boolean centered) {
        this.centered = centered;
        this.u = u;
        this.rows = rows;
        this.cols = cols;
        this.divisor = divisor;
    }

    /**
     * Autocovariances of the moment matrix F (T x K), centered (u_t = f_t - mean f) or not
     * (u_t = f_t).
     *
     * @throws IllegalArgumentException if T &lt; 2, K &lt; 1 or F holds NaN or infinite values
     */
    public static Autocovariances of(DMatrixRMaj moments, boolean centered) {
        LongRunCovariance.validate(moments);
        int t = moments.numRows;
        int k = moments.numCols;
        double[] u = Arrays.copyOf(moments.data, t * k);
        if (centered) {
            double[] mean = new double[k];
            for (int r = 0; r < t; r++) {
                for (int c = 0; c < k; c++) {
                    mean[c] += u[r * k + c];
                }
            }
            for (int c = 0; c < k; c++) {
                mean[c] /= t;
            }
            for (int r = 0; r < t; r++) {
                for (int c = 0; c < k; c++) {
                    u[r * k + c] -= mean[c];
                }
            }
        }
        return new Autocovariances(u, t, k, t, centered);
    }

    /** Autocovariances of a row-major series that divide by {@code divisor} instead of its length. */
    static Autocovariances ofSeries(double[] u, int rows, int cols, double divisor, boolean centered) {
        return new Autocovariances(u, rows, cols, divisor, centered);
    }

    /** Whether the column means were removed from the moments. */
    public boolean centered() {
        return centered;
    }

    /** Number of rows of the series. */
    public int observations() {
        return rows;
    }

    /** Number of columns K. */
    public int columns() {
        return cols;
    }

    /** The largest lag with data, T - 1. */
    public int maxLag() {
        return rows - 1;
    }

    /** The series u_t as a row-major array (shared, not copied: package use only). */
    double[] series() {
        return u;
    }

    /**
     * Γ_j = (1/T) Σ_{t=j+1..T} u_t u_{t-j}', a new K x K matrix.
     *
     * @throws IllegalArgumentException unless 0 ≤ j ≤ T - 1
     */
    public DMatrixRMaj gamma(int j) {
        if (j < 0 || j > maxLag()) {
            throw new IllegalArgumentException("lag must be in 0.." + maxLag() + ", got " + j);
        }
        ensure(j);
        DMatrixRMaj g = new DMatrixRMaj(cols, cols);
        System.arraycopy(gammas, j * cols * cols, g.data, 0, cols * cols);
        return g;
    }

    /**
     * S = Γ_0 + Σ_{j=1..T-1} k(j/b)(Γ_j + Γ_j'), the kernel estimate of Andrews (1991), eq. (2.4)
     * without the small-sample factor; with the Bartlett kernel and b = L + 1 it is the estimator
     * of Newey and West (1987). b = 0 keeps Γ_0 only.
     *
     * @param kernel the lag window
     * @param bandwidth b ≥ 0 (ignored by {@link Kernel#NONE})
     * @return a new K x K symmetric matrix
     * @throws IllegalArgumentException if the bandwidth is negative, NaN or infinite
     */
    public DMatrixRMaj longRun(Kernel kernel, double bandwidth) {
        DMatrixRMaj out = new DMatrixRMaj(cols, cols);
        longRun(kernel, bandwidth, out);
        return out;
    }

    /** As {@link #longRun(Kernel, double)}, writing into {@code out} (reshaped to K x K). */
    public void longRun(Kernel kernel, double bandwidth, DMatrixRMaj out) {
        if (!(bandwidth >= 0.0) || Double.isInfinite(bandwidth)) {
            throw new IllegalArgumentException("bandwidth must be a finite number >= 0, got " + bandwidth);
        }
        int last = lastLag(kernel, bandwidth);
        ensure(last);
        out.reshape(cols, cols);
        int kk = cols * cols;
        System.arraycopy(gammas, 0, out.data, 0, kk);
        double[] s = out.data;
        for (int j = 1; j <= last; j++) {
            double w = kernel.weight(j / bandwidth);
            if (w == 0.0) {
                continue;
            }
            int off = j * kk;
            for (int p = 0; p < cols; p++) {
                for (int q = 0; q < cols; q++) {
                    s[p * cols + q] += w * (gammas[off + p * cols + q] + gammas[off + q * cols + p]);
                }
            }
        }
    }

    /** The last lag that can carry weight: floor(b) for truncated kernels, every lag for QS. */
    int lastLag(Kernel kernel, double bandwidth) {
        if (kernel == Kernel.NONE || bandwidth == 0.0) {
            return 0;
        }
        if (!kernel.isTruncated()) {
            return maxLag();
        }
        return (int) Math.min(maxLag(), Math.floor(bandwidth));
    }

    /** Computes Γ_j up to lag {@code last}, growing the store once so the lag loop never allocates. */
    private void ensure(int last) {
        if (last <= computed) {
            return;
        }
        int kk = cols * cols;
        gammas = Arrays.copyOf(gammas, (last + 1) * kk);
        for (int j = computed + 1; j <= last; j++) {
            int off = j * kk;
            for (int t = j; t < rows; t++) {
                int a = t * cols;
                int b = (t - j) * cols;
                for (int p = 0; p < cols; p++) {
                    double up = u[a + p];
                    int o = off + p * cols;
                    for (int q = 0; q < cols; q++) {
                        gammas[o + q] += up * u[b + q];
                    }
                }
            }
            for (int i = off; i < off + kk; i++) {
                gammas[i] /= divisor;
            }
        }
        computed = last;
    }
}
