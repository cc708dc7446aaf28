package org.orthogon.longrun;

import java.util.Arrays;
import java.util.Optional;
import java.util.stream.Collectors;

/**
 * Lag-window kernels k(x) for long-run covariance estimation, as defined in
 * D. W. K. Andrews (1991), "Heteroskedasticity and Autocorrelation Consistent Covariance Matrix
 * Estimation", Econometrica 59(3), 817-858, section 2.
 *
 * <p>The estimate is S = Γ_0 + Σ_{j≥1} k(j/b) (Γ_j + Γ_j'), with b the bandwidth.
 *
 * <p>Each kernel is data: its support (k(x) = 0 beyond it), whether every estimate is positive
 * semidefinite, how a lag count L becomes a bandwidth, the constants of the Andrews (1991) and
 * Newey-West (1994) automatic bandwidth rules, and its default bandwidth rule. Everything else in
 * Orthogon (which lags are summed, which rules a kernel accepts, the help texts and the model-file
 * choices) is derived from these fields, so a new kernel is one constant here plus its case in
 * {@link #weight(double)}, which the compiler asks for.
 */
public enum Kernel {
    /** No lags: the heteroskedasticity-consistent S = Γ_0 (k(0) = 1, k(x) = 0 otherwise). */
    NONE("none", "no kernel: S = Γ_0, heteroskedasticity-consistent", 0.0, true, 0, null, null,
            new BandwidthRule.Lags(0)),
    /**
     * Truncated (White-Domowitz): k(x) = 1 for |x| ≤ 1, 0 otherwise. With b = L it is the
     * equal-weight estimator of Hansen and Hodrick (1980) for moments built from overlapping
     * returns; not guaranteed positive semidefinite.
     */
    TRUNCATED("truncated", "equal weights up to lag b (Hansen-Hodrick 1980); not always PSD", 1.0, false, 0,
            new AutomaticConstants(2, 0.6611, Double.NaN), null, new BandwidthRule.Lags(4)),
    /** Bartlett (Newey-West 1987): k(x) = 1 - |x| for |x| ≤ 1, 0 otherwise. */
    BARTLETT("bartlett", "1 - |x| (Newey-West 1987)", 1.0, true, 1,
            new AutomaticConstants(1, 1.1447, Double.NaN), new AutomaticConstants(1, 1.1447, 2.0 / 9.0),
            new BandwidthRule.Lags(4)),
    /** Parzen: 1 - 6x² + 6|x|³ for |x| ≤ 1/2, 2(1 - |x|)³ for 1/2 ≤ |x| ≤ 1, 0 otherwise. */
    PARZEN("parzen", "Parzen, a cubic spline", 1.0, true, 1,
            new AutomaticConstants(2, 2.6614, Double.NaN), new AutomaticConstants(2, 2.6614, 4.0 / 25.0),
            new BandwidthRule.Lags(4)),
    /** Tukey-Hanning: k(x) = (1 + cos(πx))/2 for |x| ≤ 1, 0 otherwise. */
    TUKEY_HANNING("tukey-hanning", "(1 + cos πx)/2; not always PSD", 1.0, false, 1,
            new AutomaticConstants(2, 1.7462, Double.NaN), null, new BandwidthRule.Lags(4)),
    /**
     * Quadratic spectral: k(x) = 25/(12π²x²) [sin(6πx/5)/(6πx/5) - cos(6πx/5)], k(0) = 1.
     * Not truncated: every lag gets a weight.
     */
    QUADRATIC_SPECTRAL("quadratic-spectral", "weights every lag; optimal among PSD kernels (Andrews 1991)",
            Double.POSITIVE_INFINITY, true, 0,
            new AutomaticConstants(2, 1.3221, Double.NaN), new AutomaticConstants(2, 1.3221, 2.0 / 25.0),
            new BandwidthRule.Andrews());

    /**
     * The constants of an automatic bandwidth rule for one kernel: b = c (α(q) n)^{1/(2q+1)} in
     * Andrews (1991), eq. (6.2) and Table I; b = c ((s⁽q⁾/s⁽⁰⁾)²)^{1/(2q+1)} T^{1/(2q+1)} with the
     * truncation lag m = floor(4 (T/100)^rate) in Newey and West (1994), section 3 and Table I.
     *
     * @param q        the kernel's characteristic exponent (1 for Bartlett, 2 for the smooth kernels)
     * @param constant c
     * @param rate     Newey-West only: the exponent of the truncation-lag rule (NaN for Andrews)
     */
    public record AutomaticConstants(int q, double constant, double rate) {
        /** 1/(2q + 1), the rate at which b grows with the sample. */
        public double exponent() {
            return 1.0 / (2.0 * q + 1.0);
        }
    }

    private final String id;
    private final String summary;
    private final double support;
    private final boolean positiveSemidefinite;
    private final int lagOffset;
    private final AutomaticConstants andrews;
    private final AutomaticConstants neweyWest;
    private final BandwidthRule defaultBandwidth;

    Kernel(String id, String summary, double support, boolean positiveSemidefinite, int lagOffset,
            AutomaticConstants andrews, AutomaticConstants neweyWest, BandwidthRule defaultBandwidth) {
        this.id = id;
        this.summary = summary;
        this.support = support;
        this.positiveSemidefinite = positiveSemidefinite;
        this.lagOffset = lagOffset;
        this.andrews = andrews;
        this.neweyWest = neweyWest;
        this.defaultBandwidth = defaultBandwidth;
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
        return switch (this) {
            case NONE -> a == 0.0 ? 1.0 : 0.0;
            case TRUNCATED -> a <= 1.0 ? 1.0 : 0.0;
            case BARTLETT -> a <= 1.0 ? 1.0 - a : 0.0;
            case PARZEN -> a <= 0.5 ? 1.0 - 6.0 * a * a + 6.0 * a * a * a : a <= 1.0 ? 2.0 * cube(1.0 - a) : 0.0;
            case TUKEY_HANNING -> a <= 1.0 ? (1.0 + Math.cos(Math.PI * a)) / 2.0 : 0.0;
            case QUADRATIC_SPECTRAL -> quadraticSpectral(a);
        };
    }

    private static double cube(double r) {
        return r * r * r;
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

    /** One line for help texts and docs: what the kernel is. */
    public String summary() {
        return summary;
    }

    /**
     * The x beyond which k(x) = 0: 1 for the truncated kernels, 0 for {@link #NONE} and infinity for
     * the quadratic spectral kernel, which weights every lag.
     */
    public double support() {
        return support;
    }

    /** Whether k(x) = 0 beyond a finite support, so that only lags j ≤ support·b carry weight. */
    public boolean isTruncated() {
        return Double.isFinite(support);
    }

    /**
     * The last lag j whose weight k(j/b) can be non-zero with bandwidth b, given that the sample has
     * lags up to {@code maxLag}: floor(support·b) for a kernel with finite support, every lag otherwise.
     * The sum over lags stops here; it is derived from the support, so a kernel is never cut short of
     * the lags it weights.
     *
     * @throws IllegalArgumentException if b is negative or NaN
     */
    public int lastWeightedLag(double bandwidth, int maxLag) {
        if (!(bandwidth >= 0.0)) {
            throw new IllegalArgumentException("bandwidth must be >= 0, got " + bandwidth);
        }
        if (this == NONE || bandwidth == 0.0) {
            return 0;
        }
        double reach = support * bandwidth;
        return reach >= maxLag ? maxLag : (int) Math.floor(reach);
    }

    /**
     * Whether every estimate S with this kernel is positive semidefinite whatever the data: true
     * when k's Fourier transform (the spectral window) is nowhere negative, which holds for the
     * Bartlett, Parzen and quadratic spectral kernels (and trivially for {@link #NONE}), and fails
     * for the truncated and Tukey-Hanning kernels (Andrews 1991, section 2; Newey and West 1987 for
     * Bartlett). Then S = U'WU/T with W_ts = k((t-s)/b) a positive semidefinite Toeplitz matrix.
     */
    public boolean guaranteesPositiveSemidefinite() {
        return positiveSemidefinite;
    }

    /** Whether the kernel uses a bandwidth at all ({@link #NONE} does not). */
    public boolean usesBandwidth() {
        return this != NONE;
    }

    /**
     * Whether a lag count L fixes the bandwidth: only for kernels with finite support, where "lags
     * 1..L carry weight, lag L + 1 none" defines b.
     */
    public boolean acceptsLagCount() {
        return isTruncated();
    }

    /** The constants of the Andrews (1991) plug-in rule, empty for {@link #NONE}. */
    public Optional<AutomaticConstants> andrews() {
        return Optional.ofNullable(andrews);
    }

    /**
     * The constants of the Newey and West (1994) rule, which that paper gives for the Bartlett, Parzen
     * and quadratic spectral kernels only; empty for the others.
     */
    public Optional<AutomaticConstants> neweyWest() {
        return Optional.ofNullable(neweyWest);
    }

    /**
     * The bandwidth rule used when the model file names none, the kernel's own: no lags for
     * {@link #NONE}; an automatic Andrews (1991) bandwidth for the quadratic spectral kernel, which a
     * lag count cannot set; four lags for the kernels with support [-1, 1] (common practice for
     * monthly data, no source).
     */
    public BandwidthRule defaultBandwidth() {
        return defaultBandwidth;
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
        throw new IllegalArgumentException("unknown kernel \"" + id + "\"; valid kernels: " + ids());
    }

    /** Every identifier, comma-separated, in declaration order (for messages and help texts). */
    public static String ids() {
        return Arrays.stream(values()).map(Kernel::id).collect(Collectors.joining(", "));
    }

    /** The identifiers of the kernels that use a bandwidth, comma-separated, in declaration order. */
    public static String idsWithBandwidth() {
        return Arrays.stream(values()).filter(Kernel::usesBandwidth).map(Kernel::id).collect(Collectors.joining(", "));
    }

    /**
     * The bandwidth b that puts weight on lags 1..L and none beyond: b = L + 1 for Bartlett, Parzen
     * and Tukey-Hanning (so Bartlett weights are 1 - j/(L+1), Newey-West 1987), b = L for the
     * truncated kernel (k(1) = 1 still counts lag L), and 0 for {@link #NONE}.
     *
     * @throws IllegalArgumentException if lags is negative, or for a kernel that does not
     *     {@link #acceptsLagCount() accept a lag count} (quadratic spectral weights every lag)
     */
    public double bandwidthForLags(int lags) {
        if (lags < 0) {
            throw new IllegalArgumentException("lag count must be >= 0, got " + lags);
        }
        if (this == NONE) {
            return 0.0;
        }
        if (!acceptsLagCount()) {
            throw new IllegalArgumentException("kernel " + id + " puts weight on every lag,"
                    + " so a lag count (" + lags + ") does not fix its bandwidth; give a bandwidth");
        }
        return (lags + lagOffset) / support;
    }
}
