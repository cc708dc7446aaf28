package org.orthogon.bootstrap;

/** Bootstrap p-values and quantiles from sorted replication statistics. */
public final class Quantiles {
    private Quantiles() {
    }

    /**
     * p = (1 + #{x_b ≥ s}) / (B + 1), the bootstrap p-value of an upper-tail test (Davison and Hinkley
     * 1997, equation 4.11): it counts the sample as one of the B + 1 draws, so it is never 0 and a test
     * at level α rejects with probability α exactly when (B + 1)α is a whole number. NaN without draws.
     */
    public static double upperTailPValue(double[] sorted, double statistic) {
        int b = sorted.length;
        if (b == 0 || !Double.isFinite(statistic)) {
            return Double.NaN;
        }
        int below = lowerBound(sorted, statistic);
        return (1.0 + (b - below)) / (b + 1.0);
    }

    /**
     * The α quantile of B sorted draws as the (B + 1)α-th order statistic (Davison and Hinkley 1997,
     * section 2.4), interpolated linearly between neighbours when (B + 1)α is not whole and clamped to the
     * smallest and largest draw. NaN without draws.
     */
    public static double orderStatistic(double[] sorted, double alpha) {
        int b = sorted.length;
        if (b == 0) {
            return Double.NaN;
        }
        double position = (b + 1) * alpha;
        if (position <= 1.0) {
            return sorted[0];
        }
        if (position >= b) {
            return sorted[b - 1];
        }
        int below = (int) Math.floor(position);
        double fraction = position - below;
        return sorted[below - 1] + fraction * (sorted[below] - sorted[below - 1]);
    }

    /** The first index whose value is ≥ x (sorted ascending). */
    private static int lowerBound(double[] sorted, double x) {
        int lo = 0;
        int hi = sorted.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (sorted[mid] < x) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        return lo;
    }
}
