/**
 * Two-pass tests of linear factor models: the time-series regressions of each test asset's excess
 * return on the factors, with the alphas and the Gibbons, Ross and Shanken (1989) test that they are all
 * zero; and the cross-sectional regressions of mean returns on the full-sample betas in the manner of
 * Fama and MacBeth (1973), ordinary and generalised least squares, with three standard errors for the
 * risk premia (Fama-MacBeth, Shanken 1992, and the misspecification-robust ones of Kan, Robotti and
 * Shanken 2013), the cross-sectional R² with its standard error, and the tests of equal R² of two models.
 *
 * <p>Pure numerics over EJML on a {@link org.orthogon.twopass.FactorSample}; results are immutable
 * records. No files, no printing.
 */
package org.orthogon.twopass;
