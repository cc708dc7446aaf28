package org.orthogon.gmm;

import java.util.Locale;

/**
 * The Hansen-Jagannathan (1997, Journal of Finance 52) distance δ = sqrt(min_θ g_T(θ)' G^{-1} g_T(θ)),
 * G = (1/T) Σ x_t x_t' the second moments of the payoffs priced: the least-squares distance between the
 * model's SDF and the set of SDFs that price the payoffs exactly, equal to the largest pricing error per
 * unit of payoff second moment.
 *
 * @param value   δ
 * @param pValue  P(Σ_j λ_j χ²_1 ≥ T δ²) under the limit of Jagannathan and Wang (1996, Journal of
 *                Finance 51); NaN when there are no overidentifying restrictions
 * @param seed    the seed of the simulation, used when {@code method} is {@link PValueMethod#SIMULATED}
 * @param draws   the number of simulated draws, likewise
 * @param weights the λ_j, the K - P non-zero eigenvalues of the limit, largest first
 * @param method  how the p-value was computed
 */
public record HjDistance(double value, double pValue, long seed, int draws, double[] weights, PValueMethod method) {
    public HjDistance {
        weights = weights.clone();
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** How the p-value of the distance was obtained. */
    public enum PValueMethod {
        /** Numerical inversion of the limit's characteristic function (Imhof 1961), error below 1e-9. */
        IMHOF("imhof"),
        /** The share of simulated draws of the limit at least as large as T δ², with a reported seed. */
        SIMULATED("simulated");

        private final String id;

        PValueMethod(String id) {
            this.id = id;
        }

        /** The spelling in the results JSON ("imhof", "simulated"). */
        public String id() {
            return id;
        }
    }

    /** Where the p-value comes from, as a phrase for reports. */
    public String pValueSource() {
        return method == PValueMethod.IMHOF
                ? "Imhof (1961) inversion of its weighted chi-square limit"
                : String.format(Locale.ROOT, "its simulated weighted chi-square limit (seed %d, %d draws)", seed, draws);
    }
}
