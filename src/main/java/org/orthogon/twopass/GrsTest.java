package org.orthogon.twopass;

/**
 * The Gibbons, Ross and Shanken (1989) test that every alpha of the time-series regressions is zero.
 *
 * @param statistic (T/N)((T-N-K)/(T-K-1)) α'Σ^{-1}α / (1 + μ'Ω^{-1}μ)
 * @param df1       N
 * @param df2       T - N - K
 * @param pValue    P(F(N, T-N-K) ≥ statistic), exact under normal, serially independent errors
 */
public record GrsTest(double statistic, int df1, int df2, double pValue) {
}
