package org.orthogon.longrun;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.jtransforms.fft.DoubleFFT_1D;

/**
 * The sample autocovariances Γ_j = (1/T) Σ_{t=j+1..T} u_t u_{t-j}' of a series u_t (rows of a
 * T x K matrix) and the kernel sums over them, with what is costly to form (stored Γ_j, the
 * columns' Fourier transforms) kept, so that several kernels and bandwidths can be applied to the
 * same series without recomputing it. The quadratic spectral kernel weights all T - 1 lags; its
 * sum is formed in the Toeplitz form U'WU/T by FFT, never lag by lag (see
 * {@link #longRun(Kernel, double, DMatrixRMaj)}); Γ_0 and whole-number Bartlett bandwidths are symmetric
 * rank-k products of the series or of its moving sums.
 *
 * <p>The divisor is T, not T - j, as in Newey and West (1987) and Andrews (1991); it keeps S positive
 * semidefinite for kernels with a non-negative spectral window. Not thread-safe.
 */
public final class Autocovariances {

    private final double[] u;
    /** The thread's work arrays when this object lives only inside one estimate, else null. */
    private final Workspace workspace;
    private final int rows;
    private final int cols;
    private final double divisor;
    private final boolean centered;
    /** Γ_0..Γ_computed, each K x K row-major, back to back. */
    private double[] gammas = new double[0];
    private int computed = -1;

    private Autocovariances(double[] u, int rows, int cols, double divisor, boolean centered, Workspace workspace) {
        this.centered = centered;
        this.u = u;
        this.workspace = workspace;
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
        double[] u = Arrays.copyOf(moments.data, moments.numRows * moments.numCols);
        return centeredIn(u, moments.numRows, moments.numCols, centered, null);
    }

    /**
     * As {@link #of(DMatrixRMaj, boolean)}, with the series and V = WU in the thread's work arrays: for
     * an object that does not outlive the estimate that made it.
     */
    static Autocovariances inWorkspace(DMatrixRMaj moments, boolean centered) {
        LongRunCovariance.validate(moments);
        Workspace workspace = Workspace.current();
        int n = moments.numRows * moments.numCols;
        double[] u = workspace.series(n);
        System.arraycopy(moments.data, 0, u, 0, n);
        return centeredIn(u, moments.numRows, moments.numCols, centered, workspace);
    }

    private static Autocovariances centeredIn(double[] u, int t, int k, boolean centered, Workspace workspace) {
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
        return new Autocovariances(u, t, k, t, centered, workspace);
    }

    /** Autocovariances of a row-major series that divide by {@code divisor} instead of its length. */
    static Autocovariances ofSeries(double[] u, int rows, int cols, double divisor, boolean centered) {
        return new Autocovariances(u, rows, cols, divisor, centered, null);
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

    /**
     * As {@link #longRun(Kernel, double)}, writing into {@code out} (reshaped to K x K).
     *
     * <p>Four exact routes, chosen from T, K, the kernel and the bandwidth only (never from what
     * was computed before, so a reused object gives bit for bit what a fresh one gives):
     * <ul>
     *   <li>symmetric rank-k product: Γ_0 = U'U/T when no lag carries weight, and for the Bartlett
     *       kernel with a whole-number bandwidth b, whose weights 1 - |j|/b are the overlap of two
     *       windows of b observations, S = V'V/(bT) with v_r = u_r + ... + u_{r-b+1} the moving sums
     *       of the zero-padded series (r = 1..T+b-1); only the upper triangle of V'V is summed,
     *       (T + b - 1) K²/2 multiply-adds, and S is positive semidefinite by construction;</li>
     *   <li>stored lags: Γ_0..Γ_L formed once (T K² (L+1) multiply-adds) and summed with the
     *       weights; cheapest only for K ≤ 2, and then reused by every later kernel and bandwidth
     *       that needs no more lags;</li>
     *   <li>Toeplitz form: S = U'(WU)/T with W_ts = k((t-s)/b), the T x T symmetric Toeplitz matrix
     *       of the weights (algebraically the same sum over lags). WU costs 2TKL for a short
     *       window, or K real FFTs of length N ≥ 2T - 1 for a long one (the quadratic spectral
     *       kernel weights all T - 1 lags); the column spectra are kept and reused across kernels
     *       and bandwidths. U'(WU) is symmetric, so only its upper triangle is summed: T K²/2
     *       multiply-adds whatever L is, instead of T K² (L+1), or T² K²/2 for every lag.</li>
     * </ul>
     */
    public void longRun(Kernel kernel, double bandwidth, DMatrixRMaj out) {
        if (!(bandwidth >= 0.0) || Double.isInfinite(bandwidth)) {
            throw new IllegalArgumentException("bandwidth must be a finite number >= 0, got " + bandwidth);
        }
        int last = lastLag(kernel, bandwidth);
        out.reshape(cols, cols);
        switch (route(kernel, bandwidth)) {
            case STORED_LAGS:
                fromStoredLags(kernel, bandwidth, last, out);
                break;
            case RANK_K:
                movingSumProduct(last == 0 ? 1 : (int) bandwidth, out);
                break;
            case BANDED:
                weightedSeriesBanded(kernel, bandwidth, last);
                crossProduct(out);
                break;
            case FFT:
                weightedSeriesFft(kernel, bandwidth, last);
                crossProduct(out);
                break;
            default:
                throw new AssertionError();
        }
    }

    /** How {@link #longRun(Kernel, double, DMatrixRMaj)} forms S. */
    enum Route { STORED_LAGS, RANK_K, BANDED, FFT }

    /**
     * The cheapest route by multiply-add count. The FFT count, 1.25 N log2 N per column for one
     * inverse real transform of length N plus N for the product with the kernel's spectrum, is an
     * estimate (common practice, no source); the column transforms are paid once per object and
     * not counted.
     */
    Route route(Kernel kernel, double bandwidth) {
        int last = lastLag(kernel, bandwidth);
        double t = rows;
        double k = cols;
        double stored = t * k * k * (last + 1);
        double triangle = t * k * k / 2.0;
        double best = Double.POSITIVE_INFINITY;
        Route route = null;
        if (isMovingSum(kernel, bandwidth, last)) {
            double width = last == 0 ? 1 : bandwidth;
            best = (t + width - 1) * k * k / 2.0 + (width > 1 ? t * k * width : 0.0);
            route = Route.RANK_K;
        }
        if (stored < best) {
            best = stored;
            route = Route.STORED_LAGS;
        }
        double banded = triangle + 2.0 * t * k * last;
        if (banded < best) {
            best = banded;
            route = Route.BANDED;
        }
        int n = fftLength();
        double fft = triangle + k * (1.25 * n * (Math.log(n) / Math.log(2)) + n);
        if (fft < best) {
            route = Route.FFT;
        }
        return route;
    }

    /** No weighted lag (Γ_0 alone), or Bartlett weights that are the overlap of two windows of b ≤ T rows. */
    private boolean isMovingSum(Kernel kernel, double bandwidth, int last) {
        return last == 0 || kernel == Kernel.BARTLETT && bandwidth == Math.rint(bandwidth) && bandwidth <= rows;
    }

    /**
     * S = V'V/(bT), v_r = Σ_{i=0..b-1} u_{r-i} over the zero-padded series, r = 0..T+b-2: the
     * weight of u_s u_s'' in V'V is the number of windows holding both, (b - |s - s'|)_+.
     */
    private void movingSumProduct(int width, DMatrixRMaj out) {
        double[] s = out.data;
        Arrays.fill(s, 0, cols * cols, 0.0);
        if (width == 1) {
            CrossProducts.addUpper(u, u, rows, cols, s);
            CrossProducts.symmetricFromUpper(s, cols, 1.0 / divisor);
            return;
        }
        int sums = rows + width - 1;
        double[] v = workspace == null ? new double[sums * cols] : workspace.sums(sums * cols);
        Arrays.fill(v, 0, sums * cols, 0.0);
        int n = rows * cols;
        // v_r gets u_{r-i} for i = 0..b-1: one contiguous add of the whole series per shift i
        for (int i = 0; i < width; i++) {
            int shift = i * cols;
            for (int j = 0; j < n; j++) {
                v[shift + j] += u[j];
            }
        }
        CrossProducts.addUpper(v, v, sums, cols, s);
        CrossProducts.symmetricFromUpper(s, cols, 1.0 / (width * divisor));
    }

    private void fromStoredLags(Kernel kernel, double bandwidth, int last, DMatrixRMaj out) {
        ensure(last);
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

    // Work space of the Toeplitz route, kept between calls so the lag loops never allocate.
    private double[] weighted;
    private double[][] spectra;
    private double[] kernelSpectrum;
    private double[] column;
    private DoubleFFT_1D fft;

    private void prepareWeighted() {
        if (weighted == null) {
            weighted = workspace == null ? new double[rows * cols] : workspace.weighted(rows * cols);
        }
    }

    /** V = WU for a window of {@code last} lags: V_t = u_t + Σ_j w_j (u_{t-j} + u_{t+j}). */
    private void weightedSeriesBanded(Kernel kernel, double bandwidth, int last) {
        prepareWeighted();
        double[] v = weighted;
        int n = rows * cols;
        System.arraycopy(u, 0, v, 0, n);
        for (int j = 1; j <= last; j++) {
            double w = kernel.weight(j / bandwidth);
            if (w == 0.0) {
                continue;
            }
            // rows t ≥ j get w u_{t-j}, rows t < T - j get w u_{t+j}: two contiguous axpys
            int shift = j * cols;
            int len = n - shift;
            for (int i = 0; i < len; i++) {
                v[shift + i] += w * u[i];
            }
            for (int i = 0; i < len; i++) {
                v[i] += w * u[shift + i];
            }
        }
    }

    /**
     * V = WU by circular convolution of each zero-padded column with the weights c_m = w_|m|
     * (N ≥ T + last keeps the wrap-around out of rows 0..T-1). c is real and even, so its
     * transform is real and the product with a column spectrum is a scaling of each frequency.
     */
    private void weightedSeriesFft(Kernel kernel, double bandwidth, int last) {
        prepareWeighted();
        int n = fftLength();
        if (spectra == null) {
            fft = workspace == null ? new DoubleFFT_1D(n) : workspace.fft(n);
            kernelSpectrum = new double[n];
            column = new double[n];
            spectra = new double[cols][];
            for (int c = 0; c < cols; c++) {
                double[] x = new double[n];
                for (int t = 0; t < rows; t++) {
                    x[t] = u[t * cols + c];
                }
                fft.realForward(x);
                spectra[c] = x;
            }
        }
        double[] w = kernelSpectrum;
        Arrays.fill(w, 0.0);
        w[0] = 1.0;
        for (int j = 1; j <= last; j++) {
            double kj = kernel.weight(j / bandwidth);
            w[j] = kj;
            w[n - j] = kj;
        }
        fft.realForward(w);
        // realForward packs (Re 0, Re N/2, Re 1, Im 1, ...); for an even c every Im is rounding only
        double[] v = weighted;
        for (int c = 0; c < cols; c++) {
            double[] x = spectra[c];
            column[0] = x[0] * w[0];
            column[1] = x[1] * w[1];
            for (int i = 2; i < n; i += 2) {
                double g = w[i];
                column[i] = x[i] * g;
                column[i + 1] = x[i + 1] * g;
            }
            fft.realInverse(column, true);
            for (int t = 0; t < rows; t++) {
                v[t * cols + c] = column[t];
            }
        }
    }

    /** S = U'V/T from the upper triangle: U'WU is symmetric, so the lower triangle is its mirror image. */
    private void crossProduct(DMatrixRMaj out) {
        double[] s = out.data;
        Arrays.fill(s, 0, cols * cols, 0.0);
        CrossProducts.addUpper(u, weighted, rows, cols, s);
        CrossProducts.symmetricFromUpper(s, cols, 1.0 / divisor);
    }

    /** Smallest even N ≥ 2T - 1 with no prime factor above 5, so every weighted lag fits and the FFT is fast. */
    int fftLength() {
        int n = Math.max(2, 2 * rows - 1);
        while (!isEvenFiveSmooth(n)) {
            n++;
        }
        return n;
    }

    private static boolean isEvenFiveSmooth(int n) {
        if (n % 2 != 0) {
            return false;
        }
        for (int p : new int[] {2, 3, 5}) {
            while (n % p == 0) {
                n /= p;
            }
        }
        return n == 1;
    }

    /** The last lag that can carry weight, from the kernel's support (every lag for QS). */
    int lastLag(Kernel kernel, double bandwidth) {
        return kernel.lastWeightedLag(bandwidth, maxLag());
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
