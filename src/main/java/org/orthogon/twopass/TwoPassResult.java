package org.orthogon.twopass;

/**
 * Both passes on one sample: the time-series regressions with the GRS test, and the cross-sectional
 * regressions by ordinary and by generalised least squares.
 */
public record TwoPassResult(TimeSeriesFit timeSeries, CrossSectionEstimate ols, CrossSectionEstimate gls) {

    /**
     * Runs the time-series regressions, then both cross sections on their betas.
     *
     * @param intercept true to estimate a zero-beta rate γ_0 beside the premia (the usual choice, since
     *                  a model need not price the level of excess returns)
     */
    public static TwoPassResult of(FactorSample sample, boolean intercept) {
        TimeSeriesFit ts = TimeSeriesRegressions.estimate(sample);
        return new TwoPassResult(ts, CrossSectionalRegression.estimate(sample, ts, Weighting.OLS, intercept),
                CrossSectionalRegression.estimate(sample, ts, Weighting.GLS, intercept));
    }
}
