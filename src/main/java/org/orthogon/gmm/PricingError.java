package org.orthogon.gmm;

/**
 * The sample pricing error of one moment (one test asset, or one asset times one instrument) at the
 * estimate, with its standard error and t-statistic.
 */
public record PricingError(String asset, double error, double stdError, double tStat) {
}
