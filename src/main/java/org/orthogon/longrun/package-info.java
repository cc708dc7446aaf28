/**
 * Long-run covariance S of GMM moment contributions: kernels, bandwidth rules, VAR(1)
 * prewhitening. EJML only; no I/O. Conventions: Γ_j divided by T, b the
 * number in k(j/b), centered moments by default (docs/methods.md).
 *
 * <p>References: W. K. Newey and K. D. West (1987), Econometrica 55(3), 703-708;
 * D. W. K. Andrews (1991), Econometrica 59(3), 817-858; D. W. K. Andrews and J. C. Monahan (1992),
 * Econometrica 60(4), 953-966; W. K. Newey and K. D. West (1994), Review of Economic Studies
 * 61(4), 631-653. Every reference value in the tests comes from R's sandwich package, via
 * src/test/resources/reference/longrun_reference.R.
 */
package org.orthogon.longrun;
