package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.moments.FixedSelection;
import org.orthogon.moments.MomentModel;

/**
 * GMM with a fixed selection matrix (Hansen 1982, section 3; Cochrane 2005, "Asset Pricing", revised
 * edition, sections 11.2 and 12.2): θ̂ solves a_T g_T(θ̂) = 0 for the P x K matrix a_T the family
 * chooses ({@link FixedSelection}), and
 * <pre>
 *   Var(θ̂)   = (aD)^{-1} a S a' (aD)^{-1}' / T
 *   Var(g_T) = (I - D(aD)^{-1}a) S (I - D(aD)^{-1}a)' / T,     rank K - P
 *   test     = g_T' Var(g_T)^+ g_T  ~  χ²(K - P)
 * </pre>
 * with D = ∂g_T/∂θ' and S the long-run covariance at θ̂ (the model file's kernel, bandwidth,
 * prewhitening and centring). It is one-step GMM whose first-order conditions D'W g = 0 are replaced by
 * a g = 0; with a = D'W the formulas are the one-step sandwich. S is never inverted, which is the point:
 * for the beta-pricing system S is singular by construction, so two-step, iterated and
 * continuously-updated GMM (W = S^{-1}) do not exist and are refused here as in the model file.
 */
final class FixedSelectionEstimator {
    /** a_T g_T(θ̂) must vanish to this relative accuracy, or the family's closed form is wrong. */
    private static final double SOLVED = 1e-8;

    private FixedSelectionEstimator() {
    }

    static GmmFit estimate(MomentModel model, FixedSelection selection, GmmOptions options) {
        int k = model.momentCount();
        int p = model.parameterCount();
        int t = model.observations();
        if (options.method() != EstimationMethod.ONE_STEP) {
            throw new EstimationException(options.method().id() + " GMM needs the inverse of S, which does not "
                    + "exist for these moments: S is singular by construction", List.of("K = " + k, "P = " + p),
                    "estimate them one-step with their fixed selection (method = \"one-step\")");
        }
        double[] theta;
        try {
            theta = selection.solve();
        } catch (FixedSelection.Unsolvable e) {
            throw new EstimationException(e.getMessage(), List.of("K = " + k, "P = " + p, "T = " + t), e.fix());
        }
        DMatrixRMaj a = selection.matrix(theta);
        DMatrixRMaj g = model.meanMoments(theta);
        requireSolved(model, theta, a, g);
        List<String> warnings = new ArrayList<>();
        LongRunEstimate finalS = GmmEstimator.longRun(model, theta, options.longRun());
        warnings.addAll(finalS.warnings());
        DMatrixRMaj s = finalS.covariance();
        DMatrixRMaj jacobian = model.meanJacobian(theta);
        DMatrixRMaj ad = new DMatrixRMaj(p, p);
        CommonOps_DDRM.mult(a, jacobian, ad);
        double rcondAd = Matrices.equilibratedReciprocalCondition(ad);
        DMatrixRMaj covariance;
        DMatrixRMaj errorCovariance;
        try {
            covariance = Inference.selectionCovariance(jacobian, a, s, t);
            errorCovariance = Inference.selectionErrorCovariance(jacobian, a, s, t);
        } catch (Matrices.SingularMatrixException e) {
            throw GmmEstimator.refusal(e, model);
        }
        if (rcondAd < 1e-10) {
            warnings.add(String.format(java.util.Locale.ROOT, "aD is nearly singular (condition number %.2e after "
                    + "scaling): some parameters are close to unidentified", 1.0 / rcondAd));
        }
        List<ParameterEstimate> parameters = new ArrayList<>(p);
        for (int i = 0; i < p; i++) {
            double se = Math.sqrt(Math.max(covariance.get(i, i), 0.0));
            double z = theta[i] / se;
            parameters.add(new ParameterEstimate(model.parameterNames().get(i), theta[i], se, z,
                    GmmEstimator.twoSidedNormalP(z)));
        }
        for (int c : selectedWhole(a)) {
            // a takes this moment alone, so g_c(θ̂) = 0 exactly and its rounding noise is no sampling error.
            g.set(c, 0.0);
            for (int j = 0; j < k; j++) {
                errorCovariance.set(c, j, 0.0);
                errorCovariance.set(j, c, 0.0);
            }
        }
        List<PricingError> errors = new ArrayList<>(k);
        for (int i = 0; i < k; i++) {
            double se = Math.sqrt(Math.max(errorCovariance.get(i, i), 0.0));
            errors.add(new PricingError(model.momentNames().get(i), g.get(i), se, g.get(i) / se));
        }
        int df = k - p;
        ChiSquareTest joint = df == 0 ? new ChiSquareTest("pricing-errors-joint", 0.0, 0, Double.NaN)
                : ChiSquareTest.of("pricing-errors-joint", Inference.jointPricingStatistic(g, errorCovariance, df), df);
        // a'a stands for the weight: T g' a'a g is zero at θ̂, the selected combinations solved exactly.
        DMatrixRMaj weight = new DMatrixRMaj(k, k);
        CommonOps_DDRM.multTransA(a, a, weight);
        GmmDiagnostics diagnostics = new GmmDiagnostics(1.0 / Matrices.scaledReciprocalCondition(s), 1.0 / rcondAd, k,
                t, p, 0, 0, true, List.of());
        GmmFit fit = new GmmFit(EstimationMethod.ONE_STEP, parameters, covariance, t, k,
                Inference.quadraticStatistic(g, weight, t), joint, errors, joint, finalS, 0, warnings, weight,
                diagnostics, null, options.confidenceLevel(), null);
        return options.smallSample() ? SmallSampleCorrection.apply(fit) : fit;
    }

    /** The moments c that a row of a selects alone (a_r = e_c'), which the estimate sets to zero exactly. */
    private static List<Integer> selectedWhole(DMatrixRMaj a) {
        List<Integer> whole = new ArrayList<>();
        for (int r = 0; r < a.numRows; r++) {
            int only = -1;
            int nonzero = 0;
            for (int c = 0; c < a.numCols; c++) {
                if (a.get(r, c) != 0.0) {
                    nonzero++;
                    only = c;
                }
            }
            if (nonzero == 1) {
                whole.add(only);
            }
        }
        return whole;
    }

    /**
     * The family's closed form must solve the moments it selects; anything else is a defect in Orthogon.
     * Each a_r g_T is compared with Σ_c |a_rc| mean_t |f_tc|, the size rounding errors scale with.
     */
    private static void requireSolved(MomentModel model, double[] theta, DMatrixRMaj a, DMatrixRMaj g) {
        DMatrixRMaj contributions = model.contributions(theta);
        int t = contributions.numRows;
        double[] magnitude = new double[contributions.numCols];
        for (int s = 0; s < t; s++) {
            for (int c = 0; c < magnitude.length; c++) {
                magnitude[c] += Math.abs(contributions.get(s, c)) / t;
            }
        }
        for (int r = 0; r < a.numRows; r++) {
            double value = 0.0;
            double scale = 0.0;
            for (int c = 0; c < a.numCols; c++) {
                value += a.get(r, c) * g.get(c);
                scale += Math.abs(a.get(r, c)) * magnitude[c];
            }
            if (!(Math.abs(value) <= SOLVED * scale)) {
                throw new IllegalStateException("the closed-form estimate leaves a_T g_T = " + value + " in row " + r
                        + " against a scale of " + scale);
            }
        }
    }
}
