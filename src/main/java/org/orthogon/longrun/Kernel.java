package org.orthogon.longrun;

import java.util.Arrays;
import java.util.stream.Collectors;

/**
 * Lag-window kernels k(x) for long-run covariance estimation, as defined in
 * D. W. K. Andrews (1991), "Heteroskedasticity and Autocorrelation Consistent Covariance Matrix
 * Estimation", Econometrica 59(3), 817-858, section 2.
 *
 * <p>The estimate is S = Γ_0 + Σ_{j≥1} k(j/b) (Γ_j + Γ_j'), with b the bandwidth.
 */
public enum Kernel {
    /** No lags: the heteroskedasticity-consistent S = Γ_0 (k(0) = 1, k(x) = 0 otherwise). */
    NONE("none"),
    /**
     * Truncated (White-Domowitz): k(x) = 1 for |x| ≤ 1, 0 otherwise. With b = L it is the
     * equal-weight estimator of Hansen and Hodrick (1980) for moments built from overlapping
     * returns; not guaranteed positive semidefinite.
     */
    TRUNCATED("truncated"),
    /** Bartlett (Newey-West 1987): k(x) = 1 - |x| for |x| ≤ 1, 0 otherwise. */
    BARTLETT("bartlett"),
    /** Parzen: 1 - 6x² + 6|x|³ for |x| ≤ 1/2, 2(1 - |x|)³ for 1/2 ≤ |x| ≤ 1, 0 otherwise. */
    PARZEN("parzen"),
    /** Tukey-Hanning: k(x) = (1 + cos(πx))/2 for |x| ≤ 1, 0 otherwise. */
    TUKEY_HANNING("tukey-hanning"),
    /**
     * Quadratic spectral: k(x) = 25/(12π²x²) [sin(6πx/5)/(6πx/5) - cos(6πx/5)], k(0) = 1.
     * Not truncated: every lag gets a weight.
     */
    QUADRATIC_SPECTRAL("quadratic-spectral");

    private final String id;

    Kernel(String id) {
        this.id = id;
    }

    /**
     * The kernel weight k(x) of Andrews (1991), section 2 (definitions listed on each constant).
     *
     * @param x the scaled lag j/b; any real number, the kernels are even functions
     * @return k(x); 0 for non-finite |x| (an infinite lag ratio carries no weight)
     * @throws IllegalArgumentException if x is NaN
     */
    public double weight(double x) {
        if (Double.isNaN(x)) {
            throw new IllegalArgumentException("kernel " + id + ": weight of NaN is undefined");
        }
        double a = Math.abs(x);
        if (Double.isInfinite(a)) {
            return 0.0;
        }
        switch (this) {
            case NONE:
                return a == 0.0 ? 1.0 : 0.0;
            case TRUNCATED:
                return a <= 1.0 ? 1.0 : 0.0;
            case BARTLETT:
                return a <= 1.0 ? 1.0 - a : 0.0;
            case PARZEN:
                if (a <= 0.5) {
                    return 1.0 - 6.0 * a * a + 6.0 * a * a * a;
                }
                if (a <= 1.0) {
                    double r = 1.0 - a;
                    return 2.0 * r * r * r;
                }
                return 0.0;
            case TUKEY_HANNING:
                return a <= 1.0 ? (1.0 + Math.cos(Math.PI * a)) / 2.0 : 0.0;
            case QUADRATIC_SPECTRAL:
                return quadraticSpectral(a);
            default:
                throw new AssertionError(this);
        }
    }

    private static double quadraticSpectral(double a) {
        double y = 6.0 * Math.PI * a / 5.0;
        if (y < 1e-3) {
            // sin(y)/y - cos(y) loses all digits to cancellation near 0; the Taylor series
            // 1 - y²/10 + y⁴/280 is exact to double precision here.
            double y2 = y * y;
            return 1.0 - y2 / 10.0 + y2 * y2 / 280.0;
        }
        return 3.0 / (y * y) * (Math.sin(y) / y - Math.cos(y));
    }

    /** The identifier used in model files and reports, e.g. "tukey-hanning". */
    public String id() {
        return id;
    }

    /**
     * Whether k(x) = 0 for |x| > 1, so that only lags j ≤ b carry weight. False for the quadratic
     * spectral kernel, which uses every lag.
     */
    public boolean isTruncated() {
        return this != QUADRATIC_SPECTRAL;
    }

    /**
     * Whether every estimate S with this kernel is positive semidefinite whatever the data: true
     * when k's Fourier transform (the spectral window) is nowhere negative, which holds for the
     * Bartlett, Parzen and quadratic spectral kernels (and trivially for {@link #NONE}), and fails
     * for the truncated and Tukey-Hanning kernels (Andrews 1991, section 2; Newey and West 1987 for
     * Bartlett). Then S = U'WU/T with W_ts = k((t-s)/b) a positive semidefinite Toeplitz matrix.
     */
    public boolean guaranteesPositiveSemidefinite() {
        return this != TRUNCATED && this != TUKEY_HANNING;
    }

    /**
     * The kernel with the given identifier.
     *
     * @throws IllegalArgumentException listing the valid identifiers if {@code id} is unknown
     */
    public static Kernel fromId(String id) {
        for (Kernel k : values()) {
            if (k.id.equals(id)) {
                return k;
            }
        }
        throw new IllegalArgumentException("unknown kernel \"" + id + "\"; valid kernels: "
                + Arrays.stream(values()).map(Kernel::id).collect(Collectors.joining(", ")));
    }

    /**
     * The bandwidth b that puts weight on lags 1..L and none beyond: b = L + 1 for Bartlett, Parzen
     * and Tukey-Hanning (so Bartlett weights are 1 - j/(L+1), Newey-West 1987), b = L for the
     * truncated kernel (k(1) = 1 still counts lag L), and 0 for {@link #NONE}.
     *
     * @throws IllegalArgumentException if lags is negative, or for the quadratic spectral kernel,
     *     which weights every lag, so a lag count does not determine its bandwidth
     */
    public double bandwidthForLags(int lags) {
        if (lags < 0) {
            throw new IllegalArgumentException("lag count must be >= 0, got " + lags);
        }
        switch (this) {
            case NONE:
                return 0.0;
            case TRUNCATED:
                return lags;
            case BARTLETT:
            case PARZEN:
            case TUKEY_HANNING:
                return lags + 1.0;
            case QUADRATIC_SPECTRAL:
                throw new IllegalArgumentException("kernel quadratic-spectral puts weight on every lag,"
                        + " so a lag count (" + lags + ") does not fix its bandwidth; give a bandwidth");
            default:
                throw new AssertionError(this);
        }
    }
}
