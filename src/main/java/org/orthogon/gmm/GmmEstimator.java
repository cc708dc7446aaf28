package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * GMM estimation (Hansen 1982, "Large sample properties of generalized method of moments estimators",
 * Econometrica 50) as docs/methods.md states it, with W0 the initial weight of the options (identity,
 * the inverse second-moment matrix G^{-1} of the payoffs, or a user diagonal):
 * <ul>
 *   <li>one-step: θ̂ = argmin T g' W0 g; covariance by the sandwich
 *       (D'W0D)^{-1} D'W0 S W0 D (D'W0D)^{-1} / T; the overidentification test is the joint pricing-error
 *       test g' Var(g)^+ g, because T g' W0 g is not chi-square;</li>
 *   <li>two-step: θ̂1 with W0, W2 = S(θ̂1)^{-1}, θ̂2 = argmin T g' W2 g; J = T g(θ̂2)' W2 g(θ̂2);</li>
 *   <li>iterated (Hansen, Heaton and Yaron 1996): W_i = S(θ̂_{i-1})^{-1} until max|Δθ| &lt; tolerance or the
 *       cap; J with the last weight;</li>
 *   <li>continuously updated (Hansen, Heaton and Yaron 1996): θ̂ = argmin T g(θ)' S(θ)^{-1} g(θ) started
 *       from the two-step estimate, J the minimum.</li>
 * </ul>
 * The efficient estimators' covariance is (D' S^{-1} D)^{-1} / T with S re-estimated at θ̂ with the same
 * kernel and bandwidth rule (an automatic bandwidth is re-selected at every evaluation of S; the final
 * one is reported). When K = P the estimate solves g_T(θ) = 0 whatever W, and the covariance is
 * D^{-1} S D^{-1}' / T, computed without forming D'WD.
 *
 * <p>Moments that carry a {@link MomentModel#fixedSelection()} (the beta-pricing system, whose S is
 * singular) are estimated by {@link FixedSelectionEstimator} instead: θ̂ solves a_T g_T = 0.
 *
 * <p>Never a clean estimate: a solver that did not converge or a singular D'WD raises
 * {@link EstimationException}; iterated GMM at its cap and parameters on a bound leave a warning that
 * starts with "NOT A CLEAN ESTIMATE" and {@link GmmDiagnostics#clean()} false.
 */
public final class GmmEstimator {
    private static final NormalDistribution STANDARD_NORMAL = new NormalDistribution(null, 0.0, 1.0);
    /** Reciprocal condition number of the unit-diagonal S below which estimates are flagged as fragile. */
    static final double NEAR_SINGULAR_RCOND = 1e-10;
    /** Prefix of every warning that disqualifies the estimate, so tables and JSON can make it loud. */
    public static final String NOT_CLEAN = "NOT A CLEAN ESTIMATE: ";

    private GmmEstimator() {
    }

    /**
     * How much of a fit to compute. Repeated subsample fits pay only for what they show: a sup-Wald
     * statistic needs θ̂ and its covariance, a rolling window its tests too, and neither needs the
     * Hansen-Jagannathan distance, which costs another minimisation and another S.
     */
    public enum Detail {
        /** Everything of {@link GmmFit}. */
        FULL,
        /** Everything but the Hansen-Jagannathan distance ({@link GmmFit#hjDistance()} is null, without a warning). */
        WITHOUT_HJ_DISTANCE,
        /**
         * θ̂, its covariance and, for the efficient estimators, the J test; the pricing errors are empty,
         * the joint test and one-step's overidentification test are NaN with 0 degrees of freedom, there
         * is no Hansen-Jagannathan distance, and the condition numbers of the diagnostics are NaN.
         */
        ESTIMATES
    }

    /**
     * Estimates θ and everything reported with it.
     *
     * @throws EstimationException when the solver fails, the parameters are not identified or S is
     *                             singular
     */
    public static GmmFit estimate(MomentModel model, double[] start, GmmOptions options) {
        return estimate(model, start, options, Detail.FULL);
    }

    /**
     * Estimates θ and as much of the rest as {@code detail} asks for; the numbers computed are the
     * same at every level of detail.
     *
     * @throws EstimationException when the solver fails, the parameters are not identified or S is
     *                             singular
     */
    public static GmmFit estimate(MomentModel model, double[] start, GmmOptions options, Detail detail) {
        int k = model.momentCount();
        int p = model.parameterCount();
        int t = model.observations();
        if (start.length != p) {
            throw new IllegalArgumentException("start has " + start.length + " values, the model has parameters "
                    + model.parameterNames());
        }
        if (model.fixedSelection().isPresent()) {
            return FixedSelectionEstimator.estimate(model, model.fixedSelection().get(), options);
        }
        if (k < p) {
            throw new EstimationException("the model has " + p + " parameters but only " + k + " moments",
                    List.of("K = " + k, "P = " + p), "add test assets or instruments so that K >= P");
        }
        if (t <= k) {
            throw new EstimationException("the sample has " + t + " observations for " + k
                    + " moments, so S cannot be inverted", List.of("T = " + t, "K = " + k),
                    "use a longer sample, fewer test assets or fewer instruments");
        }
        try {
            GmmFit fit = estimateChecked(model.isLinear() ? new LinearModelView(model) : model, start, options,
                    detail);
            return options.smallSample() ? SmallSampleCorrection.apply(fit) : fit;
        } catch (Matrices.SingularMatrixException e) {
            throw refusal(e, model);
        }
    }

    /** The estimation failure a singular matrix means, with the sizes and the fix it calls for. */
    static EstimationException refusal(Matrices.SingularMatrixException e, MomentModel model) {
        return new EstimationException(e.getMessage(),
                List.of("reciprocal condition number " + e.reciprocalCondition, "K = " + model.momentCount(),
                        "P = " + model.parameterCount(), "T = " + model.observations()),
                e.what.startsWith("D") ? "the parameters are not identified by these moments: "
                        + "drop a parameter or add moments that move with it"
                        : "some test assets (or scaled moments) are nearly linear combinations of others: "
                                + "drop one of them or use fewer instruments");
    }

    private static GmmFit estimateChecked(MomentModel model, double[] start, GmmOptions options, Detail detail) {
        int k = model.momentCount();
        int p = model.parameterCount();
        int t = model.observations();
        List<String> warnings = new ArrayList<>();
        ParameterBounds bounds = options.bounds().forParameters(p);
        double[] origin = bounds.clamp(start);
        if (!Arrays.equals(origin, start)) {
            warnings.add("the start values " + Arrays.toString(start) + " lie outside the parameter bounds; the "
                    + "search started from " + Arrays.toString(origin));
        }
        LongRunOptions longRunOptions = options.longRun();

        DMatrixRMaj initial = options.initialWeight().matrix(model);
        WeightedMinimizer.Minimum first = WeightedMinimizer.minimize(model, initial, origin, bounds);
        requireConverged(first, "first step (" + options.initialWeight().id() + " weight)");

        WeightedMinimizer.Minimum last = first;
        DMatrixRMaj weight = initial;
        int weightUpdates = 0;
        boolean converged = true;
        List<String> atBounds = first.atBounds();
        double[] theta = first.theta();
        FirstStep firstStep = null;
        switch (options.method()) {
            case ONE_STEP -> {
            }
            case TWO_STEP -> {
                LongRunEstimate firstS = longRun(model, theta, longRunOptions);
                weight = efficientWeight(model, firstS, "S at the first-step estimate");
                last = WeightedMinimizer.minimize(model, weight, theta, bounds);
                requireConverged(last, "second step (W = S^{-1})");
                weightUpdates = 1;
                if (detail == Detail.FULL) {
                    firstStep = new FirstStep(theta, firstS, weight);
                }
            }
            case ITERATED -> {
                double change = Double.POSITIVE_INFINITY;
                while (weightUpdates < options.maxIterations() && !(change < options.iterationTolerance())) {
                    weight = efficientWeight(model, last.theta(), longRunOptions,
                            "S at iteration " + weightUpdates + " of iterated GMM");
                    WeightedMinimizer.Minimum next = WeightedMinimizer.minimize(model, weight, last.theta(), bounds);
                    weightUpdates++;
                    requireConverged(next, "minimisation at iteration " + weightUpdates + " of iterated GMM");
                    change = maxAbsDifference(next.theta(), last.theta());
                    last = next;
                }
                if (!(change < options.iterationTolerance())) {
                    converged = false;
                    warnings.add(NOT_CLEAN + String.format("iterated GMM stopped at its cap of %d weight updates "
                            + "with max|Δθ| = %.3g above the tolerance %.1g; the estimate is the last iterate. "
                            + "Raise the cap, or use two-step or continuously-updated GMM", options.maxIterations(),
                            change, options.iterationTolerance()));
                }
            }
            case CONTINUOUSLY_UPDATED -> {
                if (k == p) {
                    // g(θ̂) = 0 already, so Q = 0 there whatever S(θ): the first step is the estimate.
                    weight = efficientWeight(model, theta, longRunOptions, "S at the estimate");
                    break;
                }
                weight = efficientWeight(model, theta, longRunOptions, "S at the first-step estimate");
                WeightedMinimizer.Minimum secondStep = WeightedMinimizer.minimize(model, weight, theta, bounds);
                requireConverged(secondStep, "two-step estimate that starts the continuously-updated search");
                double[] scales = standardErrorScales(model, secondStep.theta(), longRunOptions);
                ContinuouslyUpdated.Result cue = ContinuouslyUpdated.minimize(model, longRunOptions, secondStep.theta(),
                        scales, bounds);
                warnings.addAll(cue.notes());
                if (!cue.converged() && cue.atBounds().isEmpty()) {
                    List<String> diagnostics = new ArrayList<>(cue.notes());
                    diagnostics.add("objective " + cue.objective());
                    diagnostics.add("θ " + Arrays.toString(cue.theta()));
                    diagnostics.add("two-step estimate " + Arrays.toString(secondStep.theta()));
                    throw new EstimationException("the continuously-updated search did not reach a minimum with a "
                            + "positive-definite curvature", diagnostics,
                            "use iterated or two-step GMM, or fewer moments: the continuously-updated objective "
                                    + "is flat or irregular here");
                }
                weight = efficientWeight(model, cue.theta(), longRunOptions, "S at the continuously-updated estimate");
                last = new WeightedMinimizer.Minimum(cue.theta(), cue.objective(), cue.converged(), cue.evaluations(),
                        1 + 2 * p, List.of(), cue.atBounds());
                weightUpdates = 0;
            }
            default -> throw new AssertionError(options.method());
        }
        warnings.addAll(last.notes());
        theta = last.theta();
        int solverIterations = last.iterations();
        if (options.method() != EstimationMethod.ONE_STEP) {
            atBounds = last.atBounds();
        }
        for (String bound : atBounds) {
            warnings.add(NOT_CLEAN + "the parameter " + bound + " ended on its bound: the optimum may lie beyond "
                    + "it, so the standard errors and tests, which assume an interior optimum, do not apply. "
                    + "Check the bound and the start values, or re-specify the model");
        }

        LongRunEstimate finalS = longRun(model, theta, longRunOptions);
        warnings.addAll(finalS.warnings());
        DMatrixRMaj s = finalS.covariance();
        boolean complete = detail != Detail.ESTIMATES;
        double rcondS = Double.NaN;
        if (complete) {
            rcondS = Matrices.scaledReciprocalCondition(s);
            if (rcondS < NEAR_SINGULAR_RCOND) {
                warnings.add(String.format("S is nearly singular (condition number %.2e after scaling to a unit "
                        + "diagonal): standard errors and tests are unreliable; drop redundant assets or instruments, "
                        + "or use a fixed (one-step) weight", 1.0 / rcondS));
            }
        }
        ManyMoments.warning(k, t, finalS.kernel(), finalS.bandwidth()).ifPresent(warnings::add);

        DMatrixRMaj jacobian = model.meanJacobian(theta);
        DMatrixRMaj covariance;
        DMatrixRMaj errorCovariance = null;
        double rcondDwd = Double.NaN;
        if (k == p) {
            if (complete) {
                rcondDwd = Matrices.equilibratedReciprocalCondition(jacobian);
            }
            covariance = exactlyIdentifiedCovariance(jacobian, s, t);
            errorCovariance = new DMatrixRMaj(k, k);
        } else {
            if (complete) {
                rcondDwd = Matrices.scaledReciprocalCondition(Matrices.quadraticForm(jacobian, weight));
            }
            covariance = options.method().isEfficient() ? Inference.efficientCovariance(jacobian, s, t)
                    : Inference.sandwichCovariance(jacobian, weight, s, t);
            if (complete) {
                errorCovariance = Inference.pricingErrorCovariance(jacobian, weight, s, t);
            }
        }
        if (rcondDwd < 1e-10) {
            warnings.add(String.format("D'WD is nearly singular (condition number %.2e after scaling): some "
                    + "parameters are close to unidentified; drop one or add moments that move with it",
                    1.0 / rcondDwd));
        }

        List<ParameterEstimate> parameters = new ArrayList<>(p);
        for (int i = 0; i < p; i++) {
            double se = Math.sqrt(covariance.get(i, i));
            double tStat = theta[i] / se;
            parameters.add(new ParameterEstimate(model.parameterNames().get(i), theta[i], se, tStat,
                    twoSidedNormalP(tStat)));
        }

        DMatrixRMaj g = model.meanMoments(theta);
        int df = k - p;
        List<PricingError> errors = new ArrayList<>(k);
        ChiSquareTest joint;
        if (complete) {
            for (int i = 0; i < k; i++) {
                double se = Math.sqrt(Math.max(errorCovariance.get(i, i), 0.0));
                errors.add(new PricingError(model.momentNames().get(i), g.get(i), se, g.get(i) / se));
            }
            joint = df == 0 ? new ChiSquareTest("pricing-errors-joint", 0.0, 0, Double.NaN)
                    : ChiSquareTest.of("pricing-errors-joint",
                            Inference.jointPricingStatistic(g, errorCovariance, df, jacobian, weight), df);
        } else {
            joint = new ChiSquareTest("pricing-errors-joint", Double.NaN, 0, Double.NaN);
        }
        double objective = options.method() == EstimationMethod.CONTINUOUSLY_UPDATED ? last.objective()
                : Inference.quadraticStatistic(g, weight, t);
        ChiSquareTest overidentification;
        if (options.method().isEfficient()) {
            overidentification = df == 0 ? new ChiSquareTest("hansen-j", objective, 0, Double.NaN)
                    : ChiSquareTest.of("hansen-j", objective, df);
        } else {
            overidentification = joint;
        }
        if (df == 0) {
            warnings.add("the model is exactly identified (K = P): there are no overidentifying restrictions to test");
        }

        HjDistance hj = null;
        if (detail == Detail.FULL) {
            try {
                hj = distance(model, theta, longRunOptions, bounds, options.hjSeed(), options.hjDraws());
            } catch (EstimationException e) {
                warnings.add("the Hansen-Jagannathan distance is not reported: " + e.getMessage());
            }
        }
        GmmDiagnostics diagnostics = new GmmDiagnostics(1.0 / rcondS, 1.0 / rcondDwd, k, t, p, solverIterations,
                weightUpdates, converged && last.converged(), atBounds);
        return new GmmFit(options.method(), parameters, covariance, t, k, objective, overidentification, errors, joint,
                finalS, solverIterations, warnings, weight, diagnostics, hj, options.confidenceLevel(), firstStep);
    }

    /**
     * The Hansen-Jagannathan distance over the model's {@link MomentModel#distanceMoments()}, started at
     * the estimate's values of their parameters and bounded like them; null when the moments price no
     * payoff with an SDF.
     */
    static HjDistance distance(MomentModel model, double[] theta, LongRunOptions longRun, ParameterBounds bounds,
            long seed, int draws) {
        java.util.Optional<MomentModel> priced = model.distanceMoments();
        if (priced.isEmpty()) {
            return null;
        }
        MomentModel moments = priced.get();
        List<String> names = model.parameterNames();
        int q = moments.parameterCount();
        double[] start = new double[q];
        double[] lower = new double[q];
        double[] upper = new double[q];
        double[] allLower = bounds.lower();
        double[] allUpper = bounds.upper();
        for (int j = 0; j < q; j++) {
            int at = names.indexOf(moments.parameterNames().get(j));
            start[j] = theta[at];
            lower[j] = allLower[at];
            upper[j] = allUpper[at];
        }
        return HansenJagannathan.distance(moments, start, longRun, new ParameterBounds(lower, upper), seed, draws);
    }

    /** S at θ: the long-run covariance of the contributions f_t(θ). */
    public static LongRunEstimate longRun(MomentModel model, double[] theta, LongRunOptions options) {
        // the contributions are written into this thread's work matrix: nothing keeps them past the estimate
        DMatrixRMaj f = CONTRIBUTIONS.get();
        model.contributions(theta, f);
        return LongRunCovariance.estimate(f, options);
    }

    /** Each thread's matrix for the contributions of {@link #longRun}, reused from one S to the next. */
    private static final ThreadLocal<DMatrixRMaj> CONTRIBUTIONS = ThreadLocal.withInitial(() -> new DMatrixRMaj(1, 1));

    /** S(θ)^{-1}; K = P needs no weight (the estimate solves g = 0), so the identity stands in when S is singular. */
    private static DMatrixRMaj efficientWeight(MomentModel model, double[] theta, LongRunOptions options,
            String what) {
        return efficientWeight(model, longRun(model, theta, options), what);
    }

    /** S^{-1} of an S already estimated, with the identity for K = P as above. */
    private static DMatrixRMaj efficientWeight(MomentModel model, LongRunEstimate s, String what) {
        try {
            return Matrices.invertSymmetric(s.covariance(), what);
        } catch (Matrices.SingularMatrixException e) {
            if (model.momentCount() == model.parameterCount()) {
                return CommonOps_DDRM.identity(model.momentCount());
            }
            throw e;
        }
    }

    /** V = D^{-1} S D^{-1}' / T for K = P, both the efficient and the sandwich formula reduced. */
    private static DMatrixRMaj exactlyIdentifiedCovariance(DMatrixRMaj jacobian, DMatrixRMaj s, int t) {
        DMatrixRMaj dInvS = Matrices.solveSquare(jacobian, s, "D (K = P)");
        DMatrixRMaj transposed = new DMatrixRMaj(dInvS.numCols, dInvS.numRows);
        CommonOps_DDRM.transpose(dInvS, transposed);
        DMatrixRMaj v = Matrices.solveSquare(jacobian, transposed, "D (K = P)");
        CommonOps_DDRM.divide(v, t);
        return Matrices.symmetrize(v);
    }

    /** Two-step standard errors, used as the unit of the continuously-updated search; |θ|/10 or 0.1 if not finite. */
    private static double[] standardErrorScales(MomentModel model, double[] theta, LongRunOptions options) {
        double[] scales = new double[theta.length];
        DMatrixRMaj v;
        try {
            v = Inference.efficientCovariance(model.meanJacobian(theta), longRun(model, theta, options).covariance(),
                    model.observations());
        } catch (Matrices.SingularMatrixException e) {
            v = null;
        }
        for (int j = 0; j < theta.length; j++) {
            double se = v == null ? Double.NaN : Math.sqrt(v.get(j, j));
            scales[j] = Double.isFinite(se) && se > 0.0 ? se : Math.max(0.1 * Math.abs(theta[j]), 0.1);
        }
        return scales;
    }

    private static double maxAbsDifference(double[] a, double[] b) {
        double max = 0.0;
        for (int i = 0; i < a.length; i++) {
            max = Math.max(max, Math.abs(a[i] - b[i]));
        }
        return max;
    }

    private static void requireConverged(WeightedMinimizer.Minimum minimum, String step) {
        if (!minimum.converged()) {
            List<String> diagnostics = new ArrayList<>(minimum.notes());
            diagnostics.add("objective " + minimum.objective());
            diagnostics.add("θ " + Arrays.toString(minimum.theta()));
            throw new EstimationException("the " + step + " did not converge", diagnostics,
                    "try other start_values in the model file, or check that the moments identify the parameters");
        }
    }

    static double twoSidedNormalP(double z) {
        if (!Double.isFinite(z)) {
            return Double.NaN;
        }
        return 2.0 * STANDARD_NORMAL.cumulativeProbability(-Math.abs(z));
    }

    /** The standard normal quantile z with P(Z ≤ z) = probability. */
    static double normalQuantile(double probability) {
        return STANDARD_NORMAL.inverseCumulativeProbability(probability);
    }
}
