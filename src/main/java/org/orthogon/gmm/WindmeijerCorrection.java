package org.orthogon.gmm;

import java.util.Optional;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunDerivative;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.RowJacobians;

/**
 * The finite-sample corrected covariance of the two-step GMM estimator of Windmeijer (2005, "A finite
 * sample correction for the variance of linear efficient two-step GMM estimators", Journal of
 * Econometrics 126, 25-51), written for non-linear moments and a kernel long-run covariance.
 *
 * <p>The two-step estimate θ̂2 minimises g(θ)' W(θ̂1) g(θ) with W(θ) = S(θ)^{-1}, so it depends on the
 * first-step estimate θ̂1 through the weight. Expanding in θ̂1 (Windmeijer 2005, section 3):
 * θ̂2 - θ0 ≈ -A2^{-1} G' W g(θ0) + 𝒟 (θ̂1 - θ0) with column j of the P x P matrix
 * <pre>
 *   𝒟_j = ∂θ̂2/∂θ1_j = A2^{-1} G2' W2 (∂S/∂θ_j)(θ̂1) W2 g(θ̂2),   A2 = G2' W2 G2,
 * </pre>
 * G2 = D(θ̂2), W2 = S(θ̂1)^{-1}; differentiating the first-order condition G(θ̂2)' S(θ1)^{-1} g(θ̂2) = 0 in
 * θ1 gives it (terms in the derivative of G times g are of smaller order; for moments linear in θ there are
 * none and 𝒟 is the exact derivative). The corrected covariance is
 * <pre>
 *   V_c = V2 + 𝒟 V2 + V2 𝒟' + 𝒟 V1 𝒟',   V2 = A2^{-1}/T,
 *   V1 = (G1'W0G1)^{-1} G1'W0 S(θ̂1) W0 G1 (G1'W0G1)^{-1}/T
 * </pre>
 * (Windmeijer 2005, equation (3.13) in his notation), V1 the robust covariance of the first step with its
 * weight W0 and G1 = D(θ̂1). As in the paper, V2 uses the weight actually used, S(θ̂1)^{-1}; the usual
 * two-step standard errors Orthogon reports re-estimate S at θ̂2, so the two columns differ by that too.
 * ∂S/∂θ_j comes from the per-observation derivatives ∂f_t/∂θ_j through {@link LongRunDerivative}, the
 * bandwidth held at the value selected at θ̂1 (an automatic rule's own dependence on θ is left out). With
 * the small-sample factor c = T/(T - P) every S is scaled by c, 𝒟 is unchanged and V_c grows by c.
 */
public final class WindmeijerCorrection {
    private WindmeijerCorrection() {
    }

    /**
     * The corrected covariance and standard errors, with the first-step estimate and the bandwidth at it.
     *
     * @param covariance   V_c, P x P, divided by T
     * @param stdErrors    sqrt of its diagonal
     * @param firstStep    θ̂1
     * @param bandwidth    the bandwidth of S(θ̂1), held fixed in ∂S/∂θ
     * @param derivative   𝒟 = ∂θ̂2/∂θ1', P x P
     */
    public record Result(DMatrixRMaj covariance, double[] stdErrors, double[] firstStep, double bandwidth,
            DMatrixRMaj derivative) {
        public Result {
            covariance = covariance.copy();
            stdErrors = stdErrors.clone();
            firstStep = firstStep.clone();
            derivative = derivative.copy();
        }

        @Override
        public DMatrixRMaj covariance() {
            return covariance.copy();
        }

        @Override
        public double[] stdErrors() {
            return stdErrors.clone();
        }

        @Override
        public double[] firstStep() {
            return firstStep.clone();
        }

        @Override
        public DMatrixRMaj derivative() {
            return derivative.copy();
        }
    }

    /**
     * Why a fit has no corrected standard errors, or empty when it has them: the correction is for the
     * two-step estimator of an overidentified model (one-step GMM has no estimated weight; iterated and
     * continuously-updated GMM depend on no single first step; with K = P the weight does not matter).
     */
    public static Optional<String> notApplicable(GmmFit fit) {
        if (fit.method() != EstimationMethod.TWO_STEP) {
            return Optional.of("the correction is for two-step GMM; this fit is " + fit.method().id());
        }
        if (fit.overidentifyingRestrictions() == 0) {
            return Optional.of("exactly identified (K = P): the weight does not affect the estimate");
        }
        return Optional.empty();
    }

    /**
     * The correction of a two-step fit made by {@link GmmEstimator#estimate} from {@code start} with
     * {@code options}. The fit's own first step ({@link GmmFit#firstStepKept()}) is used when it kept one;
     * otherwise the first step is repeated (it is deterministic, so θ̂1 is the estimator's own).
     * Empty when {@link #notApplicable(GmmFit)} says so.
     *
     * @throws EstimationException when S at the first step, G2'W2G2 or G1'W0G1 is singular
     */
    public static Optional<Result> of(MomentModel model, double[] start, GmmOptions options, GmmFit fit) {
        if (notApplicable(fit).isPresent()) {
            return Optional.empty();
        }
        try {
            return Optional.of(corrected(model, start, options, fit));
        } catch (Matrices.SingularMatrixException e) {
            throw GmmEstimator.refusal(e, model);
        }
    }

    private static Result corrected(MomentModel model, double[] start, GmmOptions options, GmmFit fit) {
        DMatrixRMaj initial = options.initialWeight().matrix(model);
        Result raw;
        if (fit.firstStepKept().isPresent()) {
            FirstStep first = fit.firstStepKept().get();
            raw = correct(model, first.estimate(), fit.estimates(), initial, options.longRun(), first.longRun(),
                    first.weight());
        } else {
            ParameterBounds bounds = options.bounds().forParameters(model.parameterCount());
            WeightedMinimizer.Minimum first = WeightedMinimizer.minimize(model, initial, bounds.clamp(start), bounds);
            raw = correct(model, first.theta(), fit.estimates(), initial, options.longRun());
        }
        if (!options.smallSample()) {
            return raw;
        }
        double c = LongRunCovariance.smallSampleFactor(model.observations(), model.parameterCount());
        DMatrixRMaj scaled = raw.covariance();
        CommonOps_DDRM.scale(c, scaled);
        return new Result(scaled, standardErrors(scaled), raw.firstStep(), raw.bandwidth(), raw.derivative());
    }

    /**
     * V_c of the class comment for given θ̂1, θ̂2 and first-step weight W0.
     *
     * @throws Matrices.SingularMatrixException when S(θ̂1), A2 or G1'W0G1 cannot be inverted
     */
    public static Result correct(MomentModel model, double[] firstStep, double[] secondStep, DMatrixRMaj initialWeight,
            LongRunOptions longRun) {
        LongRunEstimate s1 = LongRunCovariance.estimate(model.contributions(firstStep), longRun);
        DMatrixRMaj w2 = Matrices.invertSymmetric(s1.covariance(), "S at the first-step estimate");
        return correct(model, firstStep, secondStep, initialWeight, longRun, s1, w2);
    }

    /**
     * V_c with S(θ̂1) and W2 = S(θ̂1)^{-1} already formed. Column j of 𝒟 needs only the vector
     * (∂S/∂θ_j) W2 g2, which {@link LongRunDerivative#derivativeTimes} forms in O(T K) without the K x K
     * matrix ∂S/∂θ_j (O(T K²)) when the moments are not prewhitened.
     */
    private static Result correct(MomentModel model, double[] firstStep, double[] secondStep,
            DMatrixRMaj initialWeight, LongRunOptions longRun, LongRunEstimate s1, DMatrixRMaj w2) {
        int t = model.observations();
        int k = model.momentCount();
        int p = model.parameterCount();
        if (model.isLinear()) {
            model = new LinearModelView(model); // D formed once for both steps
        }
        DMatrixRMaj g2 = model.meanMoments(secondStep);
        DMatrixRMaj jacobian2 = model.meanJacobian(secondStep);
        DMatrixRMaj a2Inverse = Matrices.invertSymmetric(Matrices.quadraticForm(jacobian2, w2), "D'WD at θ̂2");
        DMatrixRMaj v2 = a2Inverse.copy();
        CommonOps_DDRM.divide(v2, t);
        DMatrixRMaj v1 = Inference.sandwichCovariance(model.meanJacobian(firstStep), initialWeight,
                s1.covariance(), t);

        // A2^{-1} G2' W2 is P x K; W2 g2 is K x 1.
        DMatrixRMaj gw = new DMatrixRMaj(p, k);
        CommonOps_DDRM.multTransA(jacobian2, w2, gw);
        DMatrixRMaj projector = new DMatrixRMaj(p, k);
        CommonOps_DDRM.mult(a2Inverse, gw, projector);
        DMatrixRMaj weightedMoments = new DMatrixRMaj(k, 1);
        CommonOps_DDRM.mult(w2, g2, weightedMoments);

        LongRunDerivative at = LongRunDerivative.at(model.contributions(firstStep), longRun, s1.bandwidth());
        DMatrixRMaj rows = RowJacobians.of(model, firstStep);
        DMatrixRMaj derivative = new DMatrixRMaj(p, p);
        DMatrixRMaj column = new DMatrixRMaj(p, 1);
        for (int j = 0; j < p; j++) {
            double[] moved = at.derivativeTimes(rows, p, j, weightedMoments.data);
            CommonOps_DDRM.mult(projector, DMatrixRMaj.wrap(k, 1, moved), column);
            for (int i = 0; i < p; i++) {
                derivative.set(i, j, column.get(i));
            }
        }

        DMatrixRMaj corrected = v2.copy();
        DMatrixRMaj dv2 = new DMatrixRMaj(p, p);
        CommonOps_DDRM.mult(derivative, v2, dv2);
        DMatrixRMaj dv1d = Matrices.quadraticForm(CommonOps_DDRM.transpose(derivative, null), v1);
        for (int a = 0; a < p; a++) {
            for (int b = 0; b < p; b++) {
                corrected.add(a, b, dv2.get(a, b) + dv2.get(b, a) + dv1d.get(a, b));
            }
        }
        corrected = Matrices.symmetrize(corrected);
        return new Result(corrected, standardErrors(corrected), firstStep, s1.bandwidth(), derivative);
    }

    private static double[] standardErrors(DMatrixRMaj covariance) {
        double[] se = new double[covariance.numRows];
        for (int i = 0; i < se.length; i++) {
            se[i] = Math.sqrt(covariance.get(i, i));
        }
        return se;
    }
}
