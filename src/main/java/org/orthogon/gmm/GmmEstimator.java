package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * One-step and two-step GMM (Hansen 1982, "Large sample properties of generalized method of moments
 * estimators", Econometrica 50), following the conventions of DESIGN.md section 3:
 * <ul>
 *   <li>one-step: θ̂ = argmin T g_T(θ)' g_T(θ) (identity weight); covariance by the sandwich
 *       (D'D)^{-1} D'SD (D'D)^{-1} / T; the overidentification test is the joint pricing-error test
 *       g' Var(g)^+ g, because T g'g is not chi-square;</li>
 *   <li>two-step: θ̂1 as above, W2 = S(θ̂1)^{-1}, θ̂2 = argmin T g' W2 g; J = T g(θ̂2)' W2 g(θ̂2);
 *       covariance (D' S^{-1} D)^{-1} / T with S re-evaluated at θ̂2.</li>
 * </ul>
 * S is re-estimated at the final estimate for the reported standard errors and pricing-error
 * covariance, with the same kernel and bandwidth rule; the final bandwidth is the one reported.
 */
public final class GmmEstimator {
    private static final NormalDistribution STANDARD_NORMAL = new NormalDistribution(null, 0.0, 1.0);
    /** Reciprocal condition number of S below which estimates are flagged as fragile. */
    static final double NEAR_SINGULAR_RCOND = 1e-10;

    private GmmEstimator() {
    }

    /**
     * Estimates θ and everything reported with it.
     *
     * @throws EstimationException when the solver fails, the parameters are not identified or S is
     *                             singular
     */
    public static GmmFit estimate(MomentModel model, double[] start, GmmOptions options) {
        int k = model.momentCount();
        int p = model.parameterCount();
        int t = model.observations();
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
            return estimateChecked(model, start, options);
        } catch (Matrices.SingularMatrixException e) {
            throw new EstimationException(e.getMessage(),
                    List.of("reciprocal condition number " + e.reciprocalCondition),
                    e.what.startsWith("D'") ? "the parameters are not identified by these moments: "
                            + "drop a parameter or add moments that move with it"
                            : "some test assets (or scaled moments) are nearly linear combinations of others: "
                                    + "drop one of them or use fewer instruments");
        }
    }

    private static GmmFit estimateChecked(MomentModel model, double[] start, GmmOptions options) {
        int k = model.momentCount();
        int p = model.parameterCount();
        int t = model.observations();
        List<String> warnings = new ArrayList<>();

        DMatrixRMaj identity = CommonOps_DDRM.identity(k);
        WeightedMinimizer.Minimum first = WeightedMinimizer.minimize(model, identity, start);
        requireConverged(first, "first step (identity weight)");

        WeightedMinimizer.Minimum last = first;
        DMatrixRMaj weight = identity;
        if (options.method() == EstimationMethod.TWO_STEP) {
            LongRunEstimate firstStepS = longRun(model, first.theta(), options.longRun());
            weight = Matrices.invertSymmetric(firstStepS.covariance(), "S at the first-step estimate");
            last = WeightedMinimizer.minimize(model, weight, first.theta());
            requireConverged(last, "second step (W = S^{-1})");
        }
        warnings.addAll(last.notes());

        double[] theta = last.theta();
        LongRunEstimate finalS = longRun(model, theta, options.longRun());
        warnings.addAll(finalS.warnings());
        DMatrixRMaj s = finalS.covariance();
        double rcond = Matrices.reciprocalCondition(s);
        if (rcond < NEAR_SINGULAR_RCOND) {
            warnings.add(String.format("S is nearly singular (reciprocal condition number %.2e): "
                    + "standard errors and tests are unreliable; drop redundant assets or instruments", rcond));
        }
        if (k > t / 10.0) {
            warnings.add(String.format("K = %d moments against T = %d observations (K > T/10): the efficient "
                    + "weight is estimated imprecisely and the J test over-rejects in samples this size; "
                    + "prefer fewer assets or a fixed (one-step) weight", k, t));
        }

        DMatrixRMaj jacobian = model.meanJacobian(theta);
        DMatrixRMaj covariance = options.method() == EstimationMethod.TWO_STEP
                ? Inference.efficientCovariance(jacobian, s, t)
                : Inference.sandwichCovariance(jacobian, weight, s, t);

        List<ParameterEstimate> parameters = new ArrayList<>(p);
        for (int i = 0; i < p; i++) {
            double se = Math.sqrt(covariance.get(i, i));
            double tStat = theta[i] / se;
            parameters.add(new ParameterEstimate(model.parameterNames().get(i), theta[i], se, tStat,
                    twoSidedNormalP(tStat)));
        }

        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj errorCovariance = Inference.pricingErrorCovariance(jacobian, weight, s, t);
        List<PricingError> errors = new ArrayList<>(k);
        for (int i = 0; i < k; i++) {
            double se = Math.sqrt(Math.max(errorCovariance.get(i, i), 0.0));
            errors.add(new PricingError(model.momentNames().get(i), g.get(i), se, g.get(i) / se));
        }
        int df = k - p;
        ChiSquareTest joint = df == 0
                ? new ChiSquareTest("pricing-errors-joint", 0.0, 0, Double.NaN)
                : ChiSquareTest.of("pricing-errors-joint", Inference.jointPricingStatistic(g, errorCovariance, df), df);
        double objective = Inference.quadraticStatistic(g, weight, t);
        ChiSquareTest overidentification;
        if (options.method() == EstimationMethod.TWO_STEP) {
            overidentification = df == 0 ? new ChiSquareTest("hansen-j", objective, 0, Double.NaN)
                    : ChiSquareTest.of("hansen-j", objective, df);
        } else {
            overidentification = joint;
        }
        if (df == 0) {
            warnings.add("the model is exactly identified (K = P): there are no overidentifying restrictions to test");
        }
        return new GmmFit(options.method(), parameters, covariance, t, k, objective, overidentification, errors, joint,
                finalS, last.iterations(), warnings);
    }

    /** S at θ: the long-run covariance of the contributions f_t(θ). */
    public static LongRunEstimate longRun(MomentModel model, double[] theta, LongRunOptions options) {
        return LongRunCovariance.estimate(model.contributions(theta), options);
    }

    private static void requireConverged(WeightedMinimizer.Minimum minimum, String step) {
        if (!minimum.converged()) {
            List<String> diagnostics = new ArrayList<>(minimum.notes());
            diagnostics.add("objective " + minimum.objective());
            diagnostics.add("θ " + java.util.Arrays.toString(minimum.theta()));
            throw new EstimationException("the " + step + " did not converge", diagnostics,
                    "try other start_values in the model file, or check that the moments identify the parameters");
        }
    }

    private static double twoSidedNormalP(double z) {
        if (!Double.isFinite(z)) {
            return Double.NaN;
        }
        return 2.0 * STANDARD_NORMAL.cumulativeProbability(-Math.abs(z));
    }
}
