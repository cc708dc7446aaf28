package org.orthogon.gmm;

/**
 * One estimated parameter with its standard error, t-statistic against zero, and two-sided normal
 * p-value.
 */
public record ParameterEstimate(String name, double estimate, double stdError, double tStat, double pValue) {
}
