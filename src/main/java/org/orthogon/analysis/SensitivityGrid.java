package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * Refits one model under many long-run covariance choices, so a reader can see whether the verdict
 * of the J test and the standard errors hinge on the kernel or the bandwidth (the sensitivity that
 * Andrews 1991 and Newey-West 1994 document for HAC estimators).
 *
 * <p>The grid: the heteroskedasticity-consistent S; then for Bartlett, Parzen and Tukey-Hanning the lag
 * counts 0..12, for the Quadratic Spectral kernel (which has no lag truncation) the bandwidths 1..13,
 * and for every kernel the Andrews (1991) rule and, where defined, the Newey-West (1994) rule; each
 * with and without VAR(1) prewhitening. Every row is an ordinary fit with the same estimator, so a
 * row equals a separate {@code fit} run with those options.
 */
public final class SensitivityGrid {
    /** Largest lag count of the fixed-lag rows. */
    public static final int MAX_LAGS = 12;
    /** Significance level at which verdicts are compared with the main specification. */
    public static final double LEVEL = 0.05;

    private SensitivityGrid() {
    }

    /** The long-run covariance choices of the grid, in the order they are reported. */
    public static List<LongRunOptions> choices(boolean centered) {
        List<LongRunOptions> choices = new ArrayList<>();
        choices.add(new LongRunOptions(Kernel.NONE, new BandwidthRule.Lags(0), centered, false));
        for (boolean prewhiten : new boolean[] {false, true}) {
            for (Kernel kernel : List.of(Kernel.BARTLETT, Kernel.PARZEN, Kernel.TUKEY_HANNING, Kernel.QUADRATIC_SPECTRAL)) {
                for (int lags = 0; lags <= MAX_LAGS; lags++) {
                    BandwidthRule rule = kernel == Kernel.QUADRATIC_SPECTRAL ? new BandwidthRule.Fixed(lags + 1.0)
                            : new BandwidthRule.Lags(lags);
                    choices.add(new LongRunOptions(kernel, rule, centered, prewhiten));
                }
                choices.add(new LongRunOptions(kernel, new BandwidthRule.Andrews(), centered, prewhiten));
                if (kernel != Kernel.TUKEY_HANNING) {
                    choices.add(new LongRunOptions(kernel, new BandwidthRule.NeweyWest(), centered, prewhiten));
                }
            }
        }
        return List.copyOf(choices);
    }

    /**
     * Fits every choice of {@link #choices} with the main fit's estimation method and flags the rows
     * whose 5% verdict on the overidentifying restrictions differs from the main fit's.
     *
     * @param estimate how one fit is run for given long-run options (the caller's estimator settings)
     */
    public static List<SensitivityRow> run(MomentModel model, double[] start, GmmFit main, boolean centered,
            Function<LongRunOptions, GmmOptions> estimate) {
        return run(model, start, main, centered, estimate, ParallelRunner.defaultThreads());
    }

    /**
     * As {@link #run(MomentModel, double[], GmmFit, boolean, Function)}, the rows shared among
     * {@code threads} threads, with the same rows for every thread count. A row's fit leaves out the
     * Hansen-Jagannathan distance, which the grid does not show.
     */
    public static List<SensitivityRow> run(MomentModel model, double[] start, GmmFit main, boolean centered,
            Function<LongRunOptions, GmmOptions> estimate, int threads) {
        boolean mainRejects = rejects(main.overidentification());
        List<LongRunOptions> choices = choices(centered);
        List<GmmOptions> options = choices.stream().map(estimate).toList();
        return List.copyOf(ParallelRunner.map(choices.size(), threads,
                i -> row(model, start, choices.get(i), options.get(i), mainRejects)));
    }

    private static SensitivityRow row(MomentModel model, double[] start, LongRunOptions choice, GmmOptions options,
            boolean mainRejects) {
        try {
            GmmFit fit = GmmEstimator.estimate(model, start, options, GmmEstimator.Detail.WITHOUT_HJ_DISTANCE);
            ChiSquareTest test = fit.overidentification();
            List<Double> errors = fit.parameters().stream().map(ParameterEstimate::stdError).toList();
            boolean differs = test.df() > 0 && rejects(test) != mainRejects;
            return new SensitivityRow(choice, fit.longRun().bandwidth(), test.statistic(), test.df(), test.pValue(),
                    errors, differs, fit.warnings(), null);
        } catch (EstimationException | IllegalArgumentException e) {
            return new SensitivityRow(choice, Double.NaN, Double.NaN, 0, Double.NaN, List.of(), false, List.of(),
                    e.getMessage());
        }
    }

    private static boolean rejects(ChiSquareTest test) {
        return test.pValue() < LEVEL;
    }

    /** A readable name of a bandwidth choice: "lags 4", "b = 5", "andrews", "newey-west", "-" for none. */
    public static String bandwidthLabel(LongRunOptions options) {
        if (options.kernel() == Kernel.NONE) {
            return "-";
        }
        BandwidthRule rule = options.bandwidth();
        if (rule instanceof BandwidthRule.Lags lags) {
            return "lags " + lags.lags();
        }
        if (rule instanceof BandwidthRule.Fixed fixed) {
            double b = fixed.bandwidth();
            return "b = " + (b == Math.rint(b) ? Long.toString((long) b) : Double.toString(b));
        }
        return rule instanceof BandwidthRule.Andrews ? "andrews" : "newey-west";
    }

    /**
     * One row of the grid.
     *
     * @param choice          the long-run covariance options of this row
     * @param bandwidth       the bandwidth used in the final S (NaN when the fit failed)
     * @param statistic       the overidentification statistic (J for two-step)
     * @param df              its degrees of freedom
     * @param pValue          its p-value
     * @param standardErrors  one per parameter, in parameter order
     * @param verdictDiffers  the 5% verdict differs from the main specification's
     * @param warnings        the fit's warnings
     * @param failure         why the fit failed, or null
     */
    public record SensitivityRow(LongRunOptions choice, double bandwidth, double statistic, int df, double pValue,
            List<Double> standardErrors, boolean verdictDiffers, List<String> warnings, String failure) {
        public SensitivityRow {
            standardErrors = List.copyOf(standardErrors);
            warnings = List.copyOf(warnings);
        }
    }
}
