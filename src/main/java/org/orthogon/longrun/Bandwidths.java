package org.orthogon.longrun;

import java.util.List;

/**
 * Automatic bandwidth rules. Both take a row-major series u (n x K) and per-column weights; the
 * fine print (AR(1) by OLS with an intercept, residual variance RSS/(n - 1); divisor T after
 * prewhitening) was chosen to agree with R's sandwich package.
 */
final class Bandwidths {

    private Bandwidths() {}

    /** An AR(1) coefficient this close to a unit root makes the plug-in formula blow up, so say so. */
    private static final double NEAR_UNIT_ROOT = 0.97;

    /**
     * Andrews (1991), section 6, eq. (6.4), AR(1) plug-in: per column a, fit u_{a,t} = c + ρ_a u_{a,t-1} + e
     * by OLS on (1, u_{t-1}), σ_a² = RSS/(n - 1) (the residual mean square), then
     * α(1) = Σ w_a 4ρ²σ⁴/((1-ρ)⁶(1+ρ)²) / Σ w_a σ⁴/(1-ρ)⁴,
     * α(2) = Σ w_a 4ρ²σ⁴/(1-ρ)⁸ / Σ w_a σ⁴/(1-ρ)⁴, and
     * b = c (α(q) n)^{1/(2q+1)} with the kernel's {@link Kernel#andrews() constants}: 1.1447 (α(1) n)^{1/3}
     * (Bartlett), 2.6614 (α(2) n)^{1/5} (Parzen), 1.7462 (α(2) n)^{1/5} (Tukey-Hanning), 1.3221 (α(2) n)^{1/5}
     * (quadratic spectral), 0.6611 (α(2) n)^{1/5} (truncated).
     * n is the number of rows of u (T - 1 after prewhitening).
     */
    static double andrews(double[] u, int n, int k, Kernel kernel, double[] weights, List<String> warnings) {
        if (n < 3) {
            throw new LongRunException("Andrews bandwidth needs at least 3 observations to fit an AR(1), got "
                    + n);
        }
        double denom = 0.0;
        double num1 = 0.0;
        double num2 = 0.0;
        for (int a = 0; a < k; a++) {
            double xm = 0.0;
            double ym = 0.0;
            for (int t = 1; t < n; t++) {
                xm += u[(t - 1) * k + a];
                ym += u[t * k + a];
            }
            xm /= n - 1;
            ym /= n - 1;
            double sxy = 0.0;
            double sxx = 0.0;
            for (int t = 1; t < n; t++) {
                double x = u[(t - 1) * k + a] - xm;
                sxy += x * (u[t * k + a] - ym);
                sxx += x * x;
            }
            if (sxx == 0.0) {
                throw new LongRunException("Andrews bandwidth: moment column " + a
                        + " (0-based) is constant, so its AR(1) coefficient is undefined");
            }
            double rho = sxy / sxx;
            double rss = 0.0;
            for (int t = 1; t < n; t++) {
                double e = (u[t * k + a] - ym) - rho * (u[(t - 1) * k + a] - xm);
                rss += e * e;
            }
            double s2 = rss / (n - 1);
            double s4 = s2 * s2;
            if (Math.abs(rho) >= NEAR_UNIT_ROOT) {
                warnings.add("Andrews bandwidth: AR(1) coefficient " + rho + " in moment column " + a
                        + " is near one; the chosen bandwidth is unreliable");
            }
            double w = weights[a];
            double om = 1.0 - rho;
            denom += w * s4 / Math.pow(om, 4);
            num1 += w * 4.0 * rho * rho * s4 / (Math.pow(om, 6) * (1.0 + rho) * (1.0 + rho));
            num2 += w * 4.0 * rho * rho * s4 / Math.pow(om, 8);
        }
        double alpha1 = num1 / denom;
        double alpha2 = num2 / denom;
        Kernel.AutomaticConstants constants = kernel.andrews().orElse(null);
        if (constants == null) {
            return 0.0;
        }
        double alpha = switch (constants.q()) {
            case 1 -> alpha1;
            case 2 -> alpha2;
            default -> throw new IllegalStateException("kernel " + kernel.id() + ": the AR(1) plug-in of Andrews (1991)"
                    + " gives α(q) for q = 1 and 2 only, not " + constants.q());
        };
        double b = constants.constant() * Math.pow(alpha * n, constants.exponent());
        if (!Double.isFinite(b)) {
            throw new LongRunException("Andrews bandwidth is not finite (" + b + "): alpha(1)=" + alpha1
                    + ", alpha(2)=" + alpha2);
        }
        return b;
    }

    /**
     * Newey and West (1994), "Automatic Lag Selection in Covariance Matrix Estimation", Review of
     * Economic Studies 61(4), 631-653: with h_t = w'u_t and σ_j = (1/n) Σ_t h_t h_{t-j},
     * s⁽⁰⁾ = σ_0 + 2 Σ_{j=1..m} σ_j, s⁽q⁾ = 2 Σ_{j=1..m} j^q σ_j and
     * b = c_k ((s⁽q⁾/s⁽⁰⁾)²)^{1/(2q+1)} T^{1/(2q+1)}; Bartlett q = 1, c = 1.1447; Parzen q = 2,
     * c = 2.6614; quadratic spectral q = 2, c = 1.3221 (the kernel's {@link Kernel#neweyWest() constants}).
     * The truncation lag is
     * m = floor(4 (T/100)^{2/9}) for Bartlett, exponent 4/25 for Parzen and 2/25 for QS; after
     * prewhitening the leading 4 becomes 3. T is the original sample size even when u holds the
     * T - 1 prewhitened residuals.
     *
     * @throws IllegalArgumentException for kernels the rule has no constants for
     */
    static double neweyWest(double[] u, int n, int k, Kernel kernel, double[] weights, int originalT,
            boolean prewhitened) {
        if (!kernel.usesBandwidth()) {
            return 0.0;
        }
        Kernel.AutomaticConstants constants = kernel.neweyWest().orElseThrow(() -> new IllegalArgumentException(
                "the Newey-West (1994) bandwidth rule has no constants for kernel " + kernel.id()
                        + "; use the Andrews rule"));
        double rate = constants.rate();
        int q = constants.q();
        double c = constants.constant();
        int m = (int) Math.floor((prewhitened ? 3.0 : 4.0) * Math.pow(originalT / 100.0, rate));
        m = Math.min(m, n - 1);
        double[] h = new double[n];
        for (int t = 0; t < n; t++) {
            double s = 0.0;
            for (int a = 0; a < k; a++) {
                s += weights[a] * u[t * k + a];
            }
            h[t] = s;
        }
        double s0 = 0.0;
        double sq = 0.0;
        for (int j = 0; j <= m; j++) {
            double sigma = 0.0;
            for (int t = j; t < n; t++) {
                sigma += h[t] * h[t - j];
            }
            sigma /= n;
            if (j == 0) {
                s0 += sigma;
            } else {
                s0 += 2.0 * sigma;
                sq += 2.0 * Math.pow(j, q) * sigma;
            }
        }
        double exponent = 1.0 / (2.0 * q + 1.0);
        double b = c * Math.pow((sq / s0) * (sq / s0), exponent) * Math.pow(originalT, exponent);
        if (!Double.isFinite(b)) {
            throw new LongRunException("Newey-West bandwidth is not finite (" + b + "): s0=" + s0 + ", s"
                    + q + "=" + sq);
        }
        return b;
    }
}
