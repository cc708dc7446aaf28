package org.orthogon.gmm;

/**
 * The Hansen-Jagannathan (1997, Journal of Finance 52) distance δ = sqrt(min_θ g_T(θ)' G^{-1} g_T(θ)),
 * G = (1/T) Σ x_t x_t' the second moments of the payoffs priced: the least-squares distance between the
 * model's SDF and the set of SDFs that price the payoffs exactly, equal to the largest pricing error per
 * unit of payoff second moment.
 *
 * @param value   δ
 * @param pValue  P(Σ_j λ_j χ²_1 ≥ T δ²), simulated (Jagannathan and Wang 1996, Journal of Finance 51);
 *                NaN when there are no overidentifying restrictions
 * @param seed    the seed of the simulation, so that the p-value can be reproduced
 * @param draws   the number of simulated draws
 * @param weights the λ_j, the K - P non-zero eigenvalues of the limit, largest first
 */
public record HjDistance(double value, double pValue, long seed, int draws, double[] weights) {
    public HjDistance {
        weights = weights.clone();
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }
}
