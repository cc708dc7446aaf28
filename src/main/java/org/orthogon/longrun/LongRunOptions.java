package org.orthogon.longrun;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * The choices that define a long-run covariance estimate. Only combinations that can be estimated
 * exist: the rules that pair a kernel with a bandwidth rule live here, once, and everything that
 * builds options (the model file, the command line, the sensitivity grid) goes through them.
 *
 * @param kernel the lag window
 * @param bandwidth how b is chosen (ignored by {@link Kernel#NONE})
 * @param centered subtract the column means before forming autocovariances (the default)
 * @param prewhiten VAR(1) prewhitening of Andrews and Monahan (1992)
 */
public record LongRunOptions(Kernel kernel, BandwidthRule bandwidth, boolean centered, boolean prewhiten) {

    /**
     * @throws IllegalArgumentException when the kernel cannot use the bandwidth rule (see
     *     {@link #conflict(Kernel, BandwidthRule)})
     */
    public LongRunOptions {
        Objects.requireNonNull(kernel, "kernel");
        Objects.requireNonNull(bandwidth, "bandwidth");
        Optional<String> conflict = conflict(kernel, bandwidth);
        if (conflict.isPresent()) {
            throw new IllegalArgumentException(conflict.get());
        }
    }

    /**
     * Why {@code kernel} cannot use {@code rule}, or empty when it can. A lag count needs a kernel
     * with finite support (the quadratic spectral kernel weights every lag, so "L lags" says nothing
     * about its b); an automatic rule needs the kernel's constants, which Newey and West (1994) give
     * for three kernels only. {@link Kernel#NONE} ignores the rule.
     */
    public static Optional<String> conflict(Kernel kernel, BandwidthRule rule) {
        if (!kernel.usesBandwidth()) {
            return Optional.empty();
        }
        if (rule instanceof BandwidthRule.Lags && !kernel.acceptsLagCount()) {
            return Optional.of("kernel " + kernel.id() + " weights every lag, so a lag count cannot set its bandwidth");
        }
        if (rule instanceof BandwidthRule.NeweyWest && kernel.neweyWest().isEmpty()) {
            return Optional.of("the Newey-West (1994) bandwidth rule has constants for " + kernelsWith(true)
                    + " only, not for kernel " + kernel.id());
        }
        if (rule instanceof BandwidthRule.Andrews && kernel.andrews().isEmpty()) {
            return Optional.of("the Andrews (1991) bandwidth rule has no constants for kernel " + kernel.id());
        }
        return Optional.empty();
    }

    /**
     * The bandwidth choices {@code kernel} accepts, in model-file words ("lags = L", "bandwidth = b",
     * "bandwidth = \"andrews\"", "bandwidth = \"newey-west\""), for the fix of a refusal.
     */
    public static List<String> acceptedChoices(Kernel kernel) {
        List<String> choices = new ArrayList<>();
        if (!kernel.usesBandwidth()) {
            return choices;
        }
        if (kernel.acceptsLagCount()) {
            choices.add("lags = L");
        }
        choices.add("bandwidth = b");
        kernel.andrews().ifPresent(c -> choices.add("bandwidth = \"andrews\""));
        kernel.neweyWest().ifPresent(c -> choices.add("bandwidth = \"newey-west\""));
        return choices;
    }

    private static String kernelsWith(boolean neweyWest) {
        List<String> ids = Arrays.stream(Kernel.values())
                .filter(k -> k.usesBandwidth() && k.neweyWest().isPresent() == neweyWest).map(Kernel::id).toList();
        return ids.size() < 2 ? String.join("", ids)
                : String.join(", ", ids.subList(0, ids.size() - 1)) + " and " + ids.get(ids.size() - 1);
    }

    /**
     * The fewest observations T at which these options give an estimate from K moment columns:
     * 2 for any autocovariance; K + 2 with prewhitening (the VAR(1) of K columns on T - 1 rows keeps a
     * residual degree of freedom); 3 rows for the AR(1) fits of an automatic bandwidth (4 observations
     * after prewhitening, which costs one).
     */
    public int minimumObservations(int moments) {
        int minimum = 2;
        if (prewhiten) {
            minimum = Math.max(minimum, moments + 2);
        }
        boolean automatic = kernel.usesBandwidth()
                && (bandwidth instanceof BandwidthRule.Andrews || bandwidth instanceof BandwidthRule.NeweyWest);
        if (automatic) {
            minimum = Math.max(minimum, prewhiten ? 4 : 3);
        }
        return minimum;
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
