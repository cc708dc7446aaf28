package org.orthogon.gmm;

/**
 * A symmetric Wald interval θ̂ ± z_{(1+level)/2} se(θ̂) from the asymptotic normality of GMM estimates
 * (Hansen 1982, Theorem 3.1).
 */
public record ConfidenceInterval(String name, double estimate, double lower, double upper, double level) {

    /** True when the interval contains {@code value}. */
    public boolean covers(double value) {
        return lower <= value && value <= upper;
    }
}
