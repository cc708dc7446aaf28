package org.orthogon.longrun;

/** How the bandwidth b in k(j/b) is chosen. */
public sealed interface BandwidthRule {

    /** A bandwidth given directly: b > 0, a real number. */
    record Fixed(double bandwidth) implements BandwidthRule {
        public Fixed {
            if (!(bandwidth > 0.0) || Double.isInfinite(bandwidth)) {
                throw new IllegalArgumentException("bandwidth must be a finite number > 0, got " + bandwidth);
            }
        }
    }

    /** A lag count L, turned into b by {@link Kernel#bandwidthForLags(int)}. */
    record Lags(int lags) implements BandwidthRule {
        public Lags {
            if (lags < 0) {
                throw new IllegalArgumentException("lag count must be >= 0, got " + lags);
            }
        }
    }

    /** Andrews (1991) plug-in bandwidth from AR(1) fits per moment column, equal weights. */
    record Andrews() implements BandwidthRule {}

    /** Newey-West (1994) nonparametric bandwidth, equal weights across moment columns. */
    record NeweyWest() implements BandwidthRule {}
}
