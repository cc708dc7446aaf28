package org.orthogon.twopass;

/**
 * One test asset's time-series intercept.
 *
 * @param asset    the test asset
 * @param estimate α_i, in decimals per period
 * @param stdError the ordinary least-squares standard error sqrt(s_i² (1 + μ'Ω^{-1}μ)/T),
 *                 s_i² = RSS_i/(T - K - 1)
 * @param tStat    estimate / stdError
 * @param pValue   two-sided, Student t with T - K - 1 degrees of freedom
 */
public record Alpha(String asset, double estimate, double stdError, double tStat, double pValue) {
}
