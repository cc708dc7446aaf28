package org.orthogon.longrun;

import java.util.Objects;

/**
 * The choices that define a long-run covariance estimate.
 *
 * @param kernel the lag window
 * @param bandwidth how b is chosen (ignored by {@link Kernel#NONE})
 * @param centered subtract the column means before forming autocovariances (the default)
 * @param prewhiten VAR(1) prewhitening of Andrews and Monahan (1992)
 */
public record LongRunOptions(Kernel kernel, BandwidthRule bandwidth, boolean centered, boolean prewhiten) {

    public LongRunOptions {
        Objects.requireNonNull(kernel, "kernel");
        Objects.requireNonNull(bandwidth, "bandwidth");
    }

    /** Heteroskedasticity-consistent S = Γ_0, centered, no prewhitening. */
    public static LongRunOptions heteroskedasticityConsistent() {
        return new LongRunOptions(Kernel.NONE, new BandwidthRule.Lags(0), true, false);
    }

    /** Bartlett kernel with L lags (b = L + 1, Newey-West 1987), centered, no prewhitening. */
    public static LongRunOptions bartlettLags(int lags) {
        return new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.Lags(lags), true, false);
    }

    /**
     * The equal-weight truncated estimator of L. P. Hansen and R. J. Hodrick (1980), "Forward
     * Exchange Rates as Optimal Predictors of Future Spot Rates", Journal of Political Economy
     * 88(5), 829-853: S = Γ_0 + Σ_{j=1..L} (Γ_j + Γ_j'), the truncated kernel with b = L. For
     * moments built from h-period returns that overlap (sampled every period) the errors are
     * MA(h - 1) under the null, so L = h - 1. Centered, no prewhitening. The estimate need not be
     * positive semidefinite; {@link LongRunCovariance#estimate} warns when it is not.
     *
     * @param lags L ≥ 0, the number of overlapping periods minus one
     * @throws IllegalArgumentException if lags is negative
     */
    public static LongRunOptions hansenHodrick(int lags) {
        return new LongRunOptions(Kernel.TRUNCATED, new BandwidthRule.Lags(lags), true, false);
    }

    /** The same options with another centering choice. */
    public LongRunOptions withCentered(boolean c) {
        return new LongRunOptions(kernel, bandwidth, c, prewhiten);
    }

    /** The same options with another prewhitening choice. */
    public LongRunOptions withPrewhiten(boolean p) {
        return new LongRunOptions(kernel, bandwidth, centered, p);
    }
}
