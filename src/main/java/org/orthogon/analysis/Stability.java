package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.Inference;
import org.orthogon.moments.FixedSelection;
import org.orthogon.moments.MomentModel;

/**
 * Does one model's verdict hold across sample periods? Each period is fitted separately with the same
 * moment conditions and estimator, and the estimates are compared by Wald statistics (Andrews and Fair
 * 1988, "Inference in nonlinear econometric models with structural change", Review of Economic
 * Studies 55): for two periods W = (θ_1 - θ_2)' (V_1 + V_2)^{-1} (θ_1 - θ_2) ~ χ²(P), V_i the reported
 * covariance of θ_i. An unknown break date is handled by the largest such W over the trimmed middle
 * of the sample (Andrews 1993), compared with {@link SupWaldDistribution}.
 */
public final class Stability {
    /** Default trimming: each side of a break holds at least 15% of the sample (Andrews 1993). */
    public static final double DEFAULT_TRIMMING = 0.15;

    private Stability() {
    }

    /** One period's fit: rows [from, to) of the full sample, labelled by their first and last dates. */
    public record PeriodFit(String start, String end, int from, int to, GmmFit fit) {
    }

    /** The Wald statistic at one candidate break date (the first date of the second period). */
    public record BreakPoint(String date, double statistic) {
    }

    /**
     * The sup-Wald test of a one-time change at an unknown date.
     *
     * @param statistic      the largest Wald statistic over the candidate dates
     * @param breakDate      the date at which it is reached (first date of the later period)
     * @param trimming       π0
     * @param distribution   the simulated null distribution used for critical values and the p-value
     * @param sequence       the Wald statistic at every candidate date, in date order
     * @param failedDates    candidate dates where a side's fit failed (left out of the supremum)
     */
    public record SupWald(double statistic, String breakDate, double trimming, SupWaldDistribution distribution,
            List<BreakPoint> sequence, List<String> failedDates) {
        public SupWald {
            sequence = List.copyOf(sequence);
            failedDates = List.copyOf(failedDates);
        }

        public double pValue() {
            return distribution.pValue(statistic);
        }
    }

    /**
     * Fits each period between consecutive split points.
     *
     * @param dates        labels of the sample's observations
     * @param splitIndices row indices where a new period starts, increasing, strictly inside (0, T)
     */
    public static List<PeriodFit> periods(MomentModel model, double[] start, List<String> dates,
            List<Integer> splitIndices, GmmOptions options) {
        List<Integer> bounds = new ArrayList<>();
        bounds.add(0);
        bounds.addAll(splitIndices);
        bounds.add(model.observations());
        List<PeriodFit> fits = new ArrayList<>();
        for (int i = 0; i + 1 < bounds.size(); i++) {
            int from = bounds.get(i);
            int to = bounds.get(i + 1);
            if (to <= from) {
                throw new IllegalArgumentException("split points must increase strictly inside the sample: " + splitIndices);
            }
            GmmFit fit;
            try {
                fit = GmmEstimator.estimate(model.rows(from, to), start, options);
            } catch (EstimationException e) {
                List<String> diagnostics = new ArrayList<>(e.diagnostics());
                diagnostics.add(0, "period " + dates.get(from) + " to " + dates.get(to - 1));
                throw new EstimationException(e.getMessage() + " in the period " + dates.get(from) + " to "
                        + dates.get(to - 1), diagnostics, e.fix());
            }
            fits.add(new PeriodFit(dates.get(from), dates.get(to - 1), from, to, fit));
        }
        return fits;
    }

    /**
     * Wald test that the parameters are equal in all periods: θ stacked over the m periods, R the
     * (m-1)P x mP matrix of consecutive differences, V block-diagonal in the periods' covariances;
     * W = (Rθ)' (R V R')^{-1} (Rθ) ~ χ²((m-1)P) (Andrews and Fair 1988, equation 3.6 for m = 2).
     */
    public static ChiSquareTest equalityTest(List<PeriodFit> periods) {
        return equalityTest(periods, periods.get(0).fit().parameters().size());
    }

    /**
     * The same test over the first {@code p} parameters only (the risk premia of the beta-pricing system,
     * {@link #testedParameters}): their covariance blocks, (m-1)p degrees of freedom.
     */
    public static ChiSquareTest equalityTest(List<PeriodFit> periods, int p) {
        int m = periods.size();
        int rows = (m - 1) * p;
        DMatrixRMaj difference = new DMatrixRMaj(rows, 1);
        DMatrixRMaj covariance = new DMatrixRMaj(rows, rows);
        for (int j = 0; j + 1 < m; j++) {
            double[] earlier = periods.get(j).fit().estimates();
            double[] later = periods.get(j + 1).fit().estimates();
            DMatrixRMaj vEarlier = periods.get(j).fit().covariance();
            DMatrixRMaj vLater = periods.get(j + 1).fit().covariance();
            for (int a = 0; a < p; a++) {
                difference.set(j * p + a, later[a] - earlier[a]);
                for (int b = 0; b < p; b++) {
                    covariance.add(j * p + a, j * p + b, vLater.get(a, b) + vEarlier.get(a, b));
                    if (j + 1 < m - 1) {
                        covariance.add(j * p + a, (j + 1) * p + b, -vLater.get(a, b));
                        covariance.add((j + 1) * p + a, j * p + b, -vLater.get(a, b));
                    }
                }
            }
        }
        DMatrixRMaj inverse = Inference.efficientWeight(covariance);
        DMatrixRMaj weighted = new DMatrixRMaj(rows, 1);
        CommonOps_DDRM.mult(inverse, difference, weighted);
        return ChiSquareTest.of("andrews-fair-wald", CommonOps_DDRM.dot(difference, weighted), rows);
    }

    /**
     * The parameters whose stability the tests compare: all of them, or for moments estimated by a fixed
     * selection its focal ones ({@link FixedSelection#focalParameters()}: the risk premia of the
     * beta-pricing system, not the N(K + 1) first-pass intercepts and betas, which would swamp a Wald test in
     * subsamples).
     */
    public static int testedParameters(MomentModel model) {
        return model.fixedSelection().map(FixedSelection::focalParameters).orElse(model.parameterCount());
    }

    /**
     * The sup-Wald test over every break index whose both sides hold at least {@code trimming} of the
     * sample. {@code progress} is told each finished candidate (for a progress bar).
     */
    public static SupWald supWald(MomentModel model, double[] start, List<String> dates, GmmOptions options,
            double trimming, long seed, int draws, IntConsumer progress) {
        return supWald(model, start, dates, options, trimming, seed, draws, 1, progress);
    }

    /**
     * As {@link #supWald(MomentModel, double[], List, GmmOptions, double, long, int, IntConsumer)}, the
     * candidate dates and the null simulation shared among {@code threads} threads; the result is the
     * same for every thread count. Each side of a break is fitted on its own rows (from running sums
     * for a model linear in θ) and only θ̂ and its covariance are computed there, which is all the
     * Wald statistic uses.
     */
    public static SupWald supWald(MomentModel model, double[] start, List<String> dates, GmmOptions options,
            double trimming, long seed, int draws, int threads, IntConsumer progress) {
        int t = model.observations();
        List<Integer> candidates = candidateBreaks(t, trimming);
        if (candidates.isEmpty()) {
            throw new IllegalArgumentException("no break date leaves " + Math.round(100 * trimming)
                    + "% of the " + t + " observations on each side");
        }
        Subsamples subsamples = Subsamples.of(model);
        List<Double> statistics = ParallelRunner.map(candidates.size(), threads,
                i -> waldAtBreak(subsamples, start, options, candidates.get(i), t, testedParameters(model)),
                i -> progress.accept(candidates.get(i)));
        List<BreakPoint> sequence = new ArrayList<>();
        List<String> failed = new ArrayList<>();
        double best = Double.NEGATIVE_INFINITY;
        String bestDate = null;
        for (int i = 0; i < candidates.size(); i++) {
            String date = dates.get(candidates.get(i));
            double statistic = statistics.get(i);
            if (Double.isNaN(statistic)) {
                failed.add(date);
                continue;
            }
            sequence.add(new BreakPoint(date, statistic));
            if (statistic > best) {
                best = statistic;
                bestDate = date;
            }
        }
        if (bestDate == null) {
            throw new EstimationException("no candidate break date could be fitted on both sides",
                    List.of(failed.size() + " candidate dates failed"), "use a longer sample or a larger trimming");
        }
        int parameters = testedParameters(model);
        return new SupWald(best, bestDate, trimming,
                SupWaldDistribution.simulate(parameters, trimming, seed, draws, threads), sequence, failed);
    }

    /**
     * The sup-Wald statistic alone, on the calling thread, without its null simulation: the largest
     * Andrews-Fair Wald statistic over the trimmed candidate dates, dates whose sides cannot be fitted left
     * out as in {@link #supWald}; NaN when no date can be fitted. For bootstrap replications, which run
     * in parallel among themselves.
     */
    public static double supWaldStatistic(MomentModel model, double[] start, GmmOptions options, double trimming) {
        int t = model.observations();
        Subsamples subsamples = Subsamples.of(model);
        int tested = testedParameters(model);
        double best = Double.NaN;
        for (int index : candidateBreaks(t, trimming)) {
            double statistic = waldAtBreak(subsamples, start, options, index, t, tested);
            if (!Double.isNaN(statistic) && !(statistic <= best)) {
                best = statistic;
            }
        }
        return best;
    }

    /** The Andrews-Fair Wald statistic for a break at {@code index}, or NaN when a side cannot be fitted. */
    private static double waldAtBreak(Subsamples subsamples, double[] start, GmmOptions options, int index, int t,
            int tested) {
        try {
            GmmFit before = GmmEstimator.estimate(subsamples.rows(0, index), start, options,
                    GmmEstimator.Detail.ESTIMATES);
            GmmFit after = GmmEstimator.estimate(subsamples.rows(index, t), start, options,
                    GmmEstimator.Detail.ESTIMATES);
            return equalityTest(List.of(new PeriodFit("", "", 0, index, before),
                    new PeriodFit("", "", index, t, after)), tested).statistic();
        } catch (EstimationException | IllegalArgumentException e) {
            return Double.NaN;
        }
    }

    /**
     * Cuts a model into consecutive rows: from running sums for a model linear in θ with per-row
     * Jacobians ({@link LinearWindows}), otherwise through {@link MomentModel#rows(int, int)}.
     */
    @FunctionalInterface
    private interface Subsamples {
        MomentModel rows(int from, int to);

        static Subsamples of(MomentModel model) {
            LinearWindows linear = LinearWindows.of(model);
            return linear != null ? linear::window : model::rows;
        }
    }

    /** Break indices i with i >= ceil(π0 T) and T - i >= ceil(π0 T). */
    public static List<Integer> candidateBreaks(int observations, double trimming) {
        int minimum = (int) Math.ceil(trimming * observations);
        List<Integer> indices = new ArrayList<>();
        for (int i = minimum; i <= observations - minimum; i++) {
            indices.add(i);
        }
        return indices;
    }

    /**
     * Rolling (fixed length {@code window}) or expanding (from the first observation) windows whose end
     * moves by {@code step} observations; a window whose fit fails is reported with a null fit.
     */
    public static List<PeriodFit> windows(MomentModel model, double[] start, List<String> dates, GmmOptions options,
            int window, int step, boolean expanding, IntConsumer progress) {
        return windows(model, start, dates, options, window, step, expanding, 1, progress);
    }

    /**
     * As {@link #windows(MomentModel, double[], List, GmmOptions, int, int, boolean, IntConsumer)}, the
     * windows shared among {@code threads} threads, with the same result for every thread count. A
     * window's fit has everything but the Hansen-Jagannathan distance, which rolling output does not show.
     */
    public static List<PeriodFit> windows(MomentModel model, double[] start, List<String> dates, GmmOptions options,
            int window, int step, boolean expanding, int threads, IntConsumer progress) {
        int t = model.observations();
        if (window < 2 || window > t || step < 1) {
            throw new IllegalArgumentException("need 2 <= window <= " + t + " and step >= 1; got window " + window
                    + ", step " + step);
        }
        Subsamples subsamples = Subsamples.of(model);
        int count = (t - window) / step + 1;
        return ParallelRunner.map(count, threads, i -> {
            int end = window + i * step;
            int from = expanding ? 0 : end - window;
            GmmFit fit;
            try {
                fit = GmmEstimator.estimate(subsamples.rows(from, end), start, options,
                        GmmEstimator.Detail.WITHOUT_HJ_DISTANCE);
            } catch (EstimationException | IllegalArgumentException e) {
                fit = null;
            }
            return new PeriodFit(dates.get(from), dates.get(end - 1), from, end, fit);
        }, i -> progress.accept(window + i * step));
    }
}
