package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.MomentAlgebra;

/**
 * How well a fitted SDF explains the cross-section of mean returns, in expected-return units.
 *
 * <p>Each moment is g_i = E_T[m x_i] - p_i. Dividing by the mean discount factor turns it into the
 * pricing error α_i = g_i / E_T[m], the gap between the realised mean payoff x̄_i and the mean the
 * model implies, x̂_i = x̄_i - α_i (for excess returns E[R^e] = -Cov(m, R^e)/E[m]; Cochrane 2005,
 * "Asset Pricing", section 1.4 and 12.2). The cross-sectional R² is 1 - Var_c(α)/Var_c(x̄), with
 * Var_c the variance across assets (Jagannathan and Wang 1996, Journal of Finance 51, section III),
 * so 1 means the model explains all the spread in mean returns and values below 0 are possible.
 *
 * @param assets        the names of the moments (the test assets)
 * @param realised      x̄_i, the sample mean payoff of each asset
 * @param implied       x̂_i = x̄_i - α_i
 * @param errors        α_i
 * @param r2            1 - Var_c(α)/Var_c(x̄)
 * @param meanAbsolute  mean |α_i|
 * @param rootMeanSquare sqrt(mean α_i²)
 * @param meanSdf       E_T[m], the sample mean of the discount factor at the estimate
 */
public record CrossSectionFit(List<String> assets, double[] realised, double[] implied, double[] errors, double r2,
        double meanAbsolute, double rootMeanSquare, double meanSdf) {

    public CrossSectionFit {
        assets = List.copyOf(assets);
        realised = realised.clone();
        implied = implied.clone();
        errors = errors.clone();
    }

    /** The cross-sectional fit of {@code model} at θ. */
    public static CrossSectionFit of(MomentModel model, double[] theta) {
        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj meanPayoff = MomentAlgebra.columnMeans(model.payoffs());
        double meanSdf = model.meanDiscountFactor(theta);
        // Auxiliary moments (the factor means of the demeaned SDF) price no asset and are left out.
        int k = model.pricingMomentCount();
        double[] realised = new double[k];
        double[] implied = new double[k];
        double[] alpha = new double[k];
        double absolute = 0.0;
        double squares = 0.0;
        for (int i = 0; i < k; i++) {
            realised[i] = meanPayoff.get(i);
            alpha[i] = g.get(i) / meanSdf;
            implied[i] = realised[i] - alpha[i];
            absolute += Math.abs(alpha[i]);
            squares += alpha[i] * alpha[i];
        }
        double r2 = 1.0 - crossSectionalVariance(alpha) / crossSectionalVariance(realised);
        return new CrossSectionFit(new ArrayList<>(model.momentNames().subList(0, k)), realised, implied, alpha, r2, absolute / k,
                Math.sqrt(squares / k), meanSdf);
    }

    private static double crossSectionalVariance(double[] values) {
        double mean = 0.0;
        for (double value : values) {
            mean += value;
        }
        mean /= values.length;
        double sum = 0.0;
        for (double value : values) {
            sum += (value - mean) * (value - mean);
        }
        return sum / values.length;
    }

    @Override
    public double[] realised() {
        return realised.clone();
    }

    @Override
    public double[] implied() {
        return implied.clone();
    }

    @Override
    public double[] errors() {
        return errors.clone();
    }
}
