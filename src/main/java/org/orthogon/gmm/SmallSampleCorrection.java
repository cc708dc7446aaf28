package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunEstimate;

/**
 * The optional small-sample factor c = T/(T - P) applied to S (off by default; docs/methods.md).
 *
 * <p>Scaling S by a constant leaves every estimator's minimiser unchanged (W = (cS)^{-1} is a multiple
 * of S^{-1}; the continuously-updated objective is scaled as a whole), so the correction acts on what
 * is reported: the covariance of θ̂ and of the pricing errors grow by c, standard errors by √c, and
 * the J, joint and Wald-type statistics shrink by 1/c. The Hansen-Jagannathan distance itself is
 * built from G, not S, and keeps its value; the weights of its limiting distribution grow by c.
 */
public final class SmallSampleCorrection {
    private SmallSampleCorrection() {
    }

    /** The fit as it would be reported with S multiplied by T/(T - P). */
    public static GmmFit apply(GmmFit fit) {
        int t = fit.observations();
        int p = fit.parameters().size();
        double c = LongRunCovariance.smallSampleFactor(t, p);
        double root = Math.sqrt(c);
        List<ParameterEstimate> parameters = new ArrayList<>();
        for (ParameterEstimate e : fit.parameters()) {
            double se = e.stdError() * root;
            double z = e.estimate() / se;
            parameters.add(new ParameterEstimate(e.name(), e.estimate(), se, z, GmmEstimator.twoSidedNormalP(z)));
        }
        DMatrixRMaj covariance = fit.covariance();
        CommonOps_DDRM.scale(c, covariance);
        List<PricingError> errors = new ArrayList<>();
        for (PricingError e : fit.pricingErrors()) {
            double se = e.stdError() * root;
            errors.add(new PricingError(e.asset(), e.error(), se, e.error() / se));
        }
        DMatrixRMaj s = fit.longRun().covariance();
        CommonOps_DDRM.scale(c, s);
        LongRunEstimate longRun = new LongRunEstimate(s, fit.longRun().kernel(), fit.longRun().bandwidth(),
                fit.longRun().centered(), fit.longRun().prewhitened(), fit.longRun().warnings());
        DMatrixRMaj weight = fit.weight();
        if (fit.method().isEfficient()) {
            CommonOps_DDRM.scale(1.0 / c, weight);
        }
        HjDistance hj = fit.hjDistance();
        if (hj != null) {
            double[] weights = hj.weights();
            for (int i = 0; i < weights.length; i++) {
                weights[i] *= c;
            }
            double statistic = t * hj.value() * hj.value();
            hj = HansenJagannathan.withPValue(hj.value(), statistic, weights, hj.seed(), hj.draws());
        }
        List<String> warnings = new ArrayList<>(fit.warnings());
        warnings.add(String.format(java.util.Locale.ROOT, "S multiplied by the small-sample factor T/(T-P) = %.6f", c));
        double objective = fit.method().isEfficient() ? fit.objective() / c : fit.objective();
        return new GmmFit(fit.method(), parameters, covariance, t, fit.momentCount(), objective,
                scaled(fit.overidentification(), 1.0 / c),
                errors, scaled(fit.pricingErrorsJoint(), 1.0 / c), longRun, fit.solverIterations(), warnings, weight,
                fit.diagnostics(), hj, fit.confidenceLevel(), fit.firstStep());
    }

    private static ChiSquareTest scaled(ChiSquareTest test, double factor) {
        if (test.df() == 0) {
            return test;
        }
        return ChiSquareTest.of(test.kind(), test.statistic() * factor, test.df());
    }
}
