package org.orthogon.gmm;

import java.util.Arrays;
import java.util.OptionalDouble;
import org.apache.commons.math3.special.Erf;

/**
 * Upper-tail probabilities of Q = Σ_j λ_j z_j², z_j independent standard normals and λ_j ≥ 0: the
 * limit of T δ² for the Hansen-Jagannathan distance (Jagannathan and Wang 1996), computed by
 * numerical inversion of its characteristic function φ(t) = Π_j (1 - 2iλ_j t)^{-1/2}, with a stated
 * bound on the error instead of the sampling noise of a simulation.
 *
 * <p>Imhof (1961, "Computing the distribution of quadratic forms in normal variables", Biometrika 48,
 * equation 3.2): P(Q > x) = 1/2 + (1/π) ∫_0^∞ sin θ(t) / (t ρ(t)) dt with θ(t) = ½ Σ arctan(2λ_j t) - tx
 * and ρ(t) = Π (1 + 4λ_j² t²)^{1/4} (his u is 2t here). The integral is taken by the midpoint rule with
 * step Δ = 2π/L. Davies (1973, "Numerical inversion of a characteristic function", Biometrika 60) shows
 * that this rule is exact up to the probability mass beyond x + L when 0 ≤ x &lt; L (the sine series
 * of the rule sums to a square wave of period 2L), so L is chosen from a Chernoff bound
 * P(Q > y) ≤ e^{-sy} Π (1 - 2sλ_j)^{-1/2}. The series is cut where a summation-by-parts bound on its
 * remainder, |R| ≤ Δ (m + 2) A_r / (π (r + 2) |sin(πx/L)| τ^{1 + r/2}) with |φ(t)| ≤ A_r t^{-r/2} from
 * the r largest weights and τ the first node left out, is met. Both parts are held below
 * {@link #ERROR_BOUND}/2, so the result is within {@link #ERROR_BOUND} of the exact probability, apart
 * from floating-point rounding.
 *
 * <p>One weight is the chi-square tail, erfc(sqrt(x/2λ)); two weights are the average over the angle
 * of the exponential tail of r² (r² ~ χ²_2 in polar coordinates), a periodic integral on which the
 * trapezoidal rule converges geometrically (Trefethen and Weideman 2014, "The exponentially convergent
 * trapezoidal rule", SIAM Review 56). When the series would need more than {@link #MAX_TERMS} terms, the
 * method declines and the caller falls back to simulation.
 */
final class WeightedChiSquare {
    /** Bound on the absolute error of a probability returned by {@link #upperTail}. */
    static final double ERROR_BOUND = 1e-9;
    /** Largest number of terms (nodes times weights) the series may take before declining. */
    static final long MAX_TERMS = 20_000_000L;
    /** Largest number of angles for two weights before declining. */
    private static final int MAX_ANGLES = 1 << 20;

    private WeightedChiSquare() {
    }

    /**
     * P(Σ_j λ_j z_j² ≥ x) within {@link #ERROR_BOUND}, or empty when the inversion would be too long
     * (weights spread over many orders of magnitude with very few of them).
     *
     * @param weights λ_j ≥ 0 in any order; zeros contribute nothing
     */
    static OptionalDouble upperTail(double x, double[] weights) {
        double[] positive = Arrays.stream(weights).filter(w -> w > 0.0).sorted().toArray();
        int m = positive.length;
        if (m == 0 || x <= 0.0) {
            return OptionalDouble.of(x <= 0.0 ? 1.0 : 0.0);
        }
        double largest = positive[m - 1];
        double[] lambda = new double[m];
        for (int j = 0; j < m; j++) {
            lambda[j] = positive[m - 1 - j] / largest;
        }
        double y = x / largest;
        if (lowerTailBound(y, lambda) < 1e-17) {
            return OptionalDouble.of(1.0);
        }
        if (m == 1) {
            return OptionalDouble.of(Erf.erfc(Math.sqrt(y / 2.0)));
        }
        if (m == 2) {
            return twoWeights(y, lambda[1]);
        }
        return series(y, lambda);
    }

    /**
     * P(Q &lt; x) ≤ Π_j P(λ_j z_j² &lt; x) ≤ Π_j sqrt(2x/(π λ_j)), since the density of z is at most
     * 1/sqrt(2π): below 1e-17 the upper tail is 1 in double precision.
     */
    private static double lowerTailBound(double x, double[] lambda) {
        double log = 0.0;
        for (double l : lambda) {
            log += 0.5 * Math.log(Math.min(1.0, 2.0 * x / (Math.PI * l)));
        }
        return Math.exp(log);
    }

    /** (1/π) ∫_0^π exp(-x / (2(cos²φ + λ sin²φ))) dφ by the trapezoidal rule, doubling until it settles. */
    private static OptionalDouble twoWeights(double x, double second) {
        double previous = Double.NaN;
        for (int n = 16; n <= MAX_ANGLES; n *= 2) {
            double sum = 0.0;
            for (int i = 0; i < n; i++) {
                double phi = Math.PI * i / n;
                double c = Math.cos(phi);
                double s = Math.sin(phi);
                sum += Math.exp(-x / (2.0 * (c * c + second * s * s)));
            }
            double estimate = sum / n;
            if (Math.abs(estimate - previous) <= 1e-3 * ERROR_BOUND) {
                return OptionalDouble.of(estimate);
            }
            previous = estimate;
        }
        return OptionalDouble.empty();
    }

    /** The midpoint-rule series of Imhof's integral for three or more weights, largest weight 1. */
    private static OptionalDouble series(double x, double[] lambda) {
        int m = lambda.length;
        double half = ERROR_BOUND / 2.0;
        double period = Math.max(upperQuantileBound(lambda, half) - x, 2.0 * x);
        double step = 2.0 * Math.PI / period;
        double sinHalf = Math.abs(Math.sin(Math.PI * x / period));
        double cut = Double.POSITIVE_INFINITY;
        double logA = 0.0;
        for (int r = 1; r <= m; r++) {
            logA -= 0.5 * Math.log(2.0 * lambda[r - 1]);
            double logBound = Math.log(step * (m + 2) / (Math.PI * (r + 2) * sinHalf * half)) + logA;
            cut = Math.min(cut, Math.exp(logBound / (1.0 + r / 2.0)));
        }
        double nodes = Math.max(0.0, Math.ceil(cut / step - 1.5)) + 1.0;
        if (!(nodes * m <= MAX_TERMS)) {
            return OptionalDouble.empty();
        }
        int count = (int) nodes;
        double[] twoLambda = new double[m];
        double[] fourLambdaSquared = new double[m];
        for (int j = 0; j < m; j++) {
            twoLambda[j] = 2.0 * lambda[j];
            fourLambdaSquared[j] = twoLambda[j] * twoLambda[j];
        }
        double sum = 0.0;
        for (int k = 0; k < count; k++) {
            double t = (k + 0.5) * step;
            double angle = 0.0;
            double logRho = 0.0;
            double tt = t * t;
            for (int j = 0; j < m; j++) {
                angle += Math.atan(twoLambda[j] * t);
                logRho += Math.log1p(fourLambdaSquared[j] * tt);
            }
            sum += Math.sin(0.5 * angle - t * x) * Math.exp(-0.25 * logRho) / (k + 0.5);
        }
        double p = 0.5 + sum / Math.PI;
        return OptionalDouble.of(Math.min(1.0, Math.max(0.0, p)));
    }

    /**
     * A y with P(Q > y) ≤ ε by the Chernoff bound: y(s) = (ln(1/ε) - ½ Σ ln(1 - 2sλ_j)) / s, the smallest
     * over a grid of s in (0, 1/2) (the largest weight is 1).
     */
    private static double upperQuantileBound(double[] lambda, double epsilon) {
        double best = Double.POSITIVE_INFINITY;
        for (double fraction : new double[] {0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.99}) {
            double s = fraction / 2.0;
            double log = 0.0;
            for (double l : lambda) {
                log -= 0.5 * Math.log1p(-2.0 * s * l);
            }
            best = Math.min(best, (-Math.log(epsilon) + log) / s);
        }
        return best;
    }
}
