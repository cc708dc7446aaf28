package org.orthogon.twopass;

/** The weight of the second-pass regressions of returns on betas. */
public enum Weighting {
    /** Ordinary least squares, W = I. */
    OLS("ols"),
    /**
     * Generalised least squares with W = V_R^{-1}, the inverse covariance matrix of the returns. Because
     * the betas are columns of the regressors, V_R = β Ω β' + Σ gives the same estimates as the residual
     * weight Σ^{-1} (the regression projects onto a space that contains β); V_R^{-1} also makes the R² the
     * one of Kan, Robotti and Shanken (2013).
     */
    GLS("gls");

    private final String id;

    Weighting(String id) {
        this.id = id;
    }

    public String id() {
        return id;
    }
}
