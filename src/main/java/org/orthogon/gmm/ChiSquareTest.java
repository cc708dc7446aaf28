package org.orthogon.gmm;

import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.math3.special.Gamma;

/**
 * A statistic compared with a chi-square distribution.
 *
 * @param kind      what was tested, e.g. "hansen-j" or "pricing-errors-joint"
 * @param statistic the value of the statistic
 * @param df        degrees of freedom
 * @param pValue    upper-tail probability P(χ²_df ≥ statistic)
 */
public record ChiSquareTest(String kind, double statistic, int df, double pValue) {

    /** Builds the test and its upper-tail p-value; df must be positive. */
    public static ChiSquareTest of(String kind, double statistic, int df) {
        return new ChiSquareTest(kind, statistic, df, upperTail(statistic, df));
    }

    /**
     * P(χ²_df ≥ x) = Q(df/2, x/2), the regularized upper incomplete gamma function (Abramowitz and
     * Stegun 1964, 26.4.19), taken directly rather than as 1 - CDF so that small p-values keep
     * their relative precision.
     */
    public static double upperTail(double x, int df) {
        if (df <= 0) {
            return Double.NaN;
        }
        if (!(x > 0)) {
            return 1.0;
        }
        return Gamma.regularizedGammaQ(df / 2.0, x / 2.0, 1e-15, 100_000);
    }

    /** The critical value c with P(χ²_df ≥ c) = alpha. */
    public static double criticalValue(double alpha, int df) {
        return new ChiSquaredDistribution(null, df, 1e-14).inverseCumulativeProbability(1.0 - alpha);
    }
}
