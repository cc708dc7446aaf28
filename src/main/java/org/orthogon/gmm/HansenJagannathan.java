package org.orthogon.gmm;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.orthogon.longrun.CrossProducts;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * The Hansen-Jagannathan (1997, "Assessing specification errors in stochastic discount factor models",
 * Journal of Finance 52) distance and its sampling distribution.
 *
 * <p>δ² = min_θ g_T(θ)' G^{-1} g_T(θ), G = (1/T) Σ_t x_t x_t' from {@link MomentModel#payoffs()}. Under the
 * null that the model prices the payoffs, T δ² converges in distribution to Σ_{j=1}^{K-P} λ_j χ²_1(j),
 * independent chi-squares, where λ are the non-zero eigenvalues of
 * S^{1/2} G^{-1/2} [I - G^{-1/2} D (D'G^{-1}D)^{-1} D' G^{-1/2}] G^{-1/2} S^{1/2}
 * (Jagannathan and Wang 1996, "The conditional CAPM and the cross-section of expected returns", Journal
 * of Finance 51, Theorem 2). With G^{-1/2} symmetric, the middle is M = G^{-1} - G^{-1}D(D'G^{-1}D)^{-1}D'G^{-1},
 * and with S = L L' the matrix L' M L has the same eigenvalues, so no matrix square root is formed.
 */
public final class HansenJagannathan {
    private HansenJagannathan() {
    }

    /**
     * δ, its p-value and the weights λ_j at the minimiser over the bounds. The p-value inverts the
     * weighted chi-square limit numerically (Imhof 1961, {@link WeightedChiSquare}); the simulation with
     * {@code seed} and {@code draws} is the fallback where the inversion declines, and a check in the tests.
     *
     * @param start      where a non-linear search starts (the main estimate)
     * @param longRun    how S is estimated at the HJ minimiser
     * @param seed,draws the simulation of the weighted chi-square limit, when it is used
     * @throws EstimationException when the minimisation over θ does not converge or G, S or D'G^{-1}D
     *                             is singular
     */
    public static HjDistance distance(MomentModel model, double[] start, LongRunOptions longRun,
            ParameterBounds bounds, long seed, int draws) {
        try {
            return distanceChecked(model, start, longRun, bounds, seed, draws);
        } catch (Matrices.SingularMatrixException e) {
            throw GmmEstimator.refusal(e, model);
        }
    }

    private static HjDistance distanceChecked(MomentModel model, double[] start, LongRunOptions longRun,
            ParameterBounds bounds, long seed, int draws) {
        int k = model.momentCount();
        int p = model.parameterCount();
        DMatrixRMaj gInverse = new InitialWeight.SecondMoment().matrix(model);
        WeightedMinimizer.Minimum minimum = WeightedMinimizer.minimize(model, gInverse, start, bounds);
        if (!minimum.converged()) {
            throw new EstimationException("the Hansen-Jagannathan minimisation did not converge", minimum.notes(),
                    "try other start values");
        }
        double[] theta = minimum.theta();
        DMatrixRMaj g = model.meanMoments(theta);
        double squared = Math.max(Matrices.quadraticValue(g, gInverse), 0.0);
        if (k == p) {
            return new HjDistance(Math.sqrt(squared), Double.NaN, seed, draws, new double[0],
                    HjDistance.PValueMethod.IMHOF);
        }
        DMatrixRMaj s = GmmEstimator.longRun(model, theta, longRun).covariance();
        double[] weights = limitWeights(model.meanJacobian(theta), gInverse, s, k - p);
        return withPValue(Math.sqrt(squared), model.observations() * squared, weights, seed, draws);
    }

    /**
     * The distance with the p-value of its statistic T δ² under the weighted chi-square limit: by Imhof's
     * inversion ({@link WeightedChiSquare}), or by simulation with the given seed where the inversion
     * declines; the method used is recorded.
     */
    static HjDistance withPValue(double value, double statistic, double[] weights, long seed, int draws) {
        java.util.OptionalDouble exact = WeightedChiSquare.upperTail(statistic, weights);
        if (exact.isPresent()) {
            return new HjDistance(value, exact.getAsDouble(), seed, draws, weights, HjDistance.PValueMethod.IMHOF);
        }
        return new HjDistance(value, weightedChiSquareUpperTail(statistic, weights, seed, draws), seed, draws, weights,
                HjDistance.PValueMethod.SIMULATED);
    }

    /**
     * The {@code rank} largest eigenvalues of L' M L, S = L L', M = G^{-1} - G^{-1}D(D'G^{-1}D)^{-1}D'G^{-1},
     * largest first; rounding-level negative values are set to 0.
     */
    static double[] limitWeights(DMatrixRMaj jacobian, DMatrixRMaj gInverse, DMatrixRMaj s, int rank) {
        int k = gInverse.numRows;
        DMatrixRMaj gInvD = new DMatrixRMaj(k, jacobian.numCols);
        CommonOps_DDRM.mult(gInverse, jacobian, gInvD);
        DMatrixRMaj bread = Matrices.invertSymmetric(Matrices.quadraticForm(jacobian, gInverse), "D'G^{-1}D");
        DMatrixRMaj m = new DMatrixRMaj(k, k);
        DMatrixRMaj temp = new DMatrixRMaj(k, jacobian.numCols);
        CommonOps_DDRM.mult(gInvD, bread, temp);
        CommonOps_DDRM.multTransB(temp, gInvD, m);
        DMatrixRMaj middle = new DMatrixRMaj(k, k);
        CommonOps_DDRM.subtract(gInverse, m, middle);
        DMatrixRMaj lower = Matrices.choleskyLower(s, "S at the Hansen-Jagannathan estimate");
        // A = L'(ML), symmetric: only its upper triangle is summed
        DMatrixRMaj ml = new DMatrixRMaj(k, k);
        CommonOps_DDRM.mult(middle, lower, ml);
        DMatrixRMaj a = new DMatrixRMaj(k, k);
        CrossProducts.addUpper(lower.data, ml.data, k, k, a.data);
        CrossProducts.symmetricFromUpper(a.data, k, 1.0);
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(k, false, true);
        if (!eig.decompose(a)) {
            throw new IllegalStateException("eigen-decomposition of the Hansen-Jagannathan limit failed");
        }
        double[] values = new double[k];
        for (int i = 0; i < k; i++) {
            values[i] = eig.getEigenvalue(i).real;
        }
        Arrays.sort(values);
        double[] out = new double[rank];
        for (int r = 0; r < rank; r++) {
            out[r] = Math.max(values[k - 1 - r], 0.0);
        }
        return out;
    }

    /**
     * P(Σ_j λ_j z_j² ≥ x), z_j independent standard normals, estimated as the share of {@code draws}
     * simulated sums that reach x. The generator is {@link SplittableRandom} with the given seed
     * (SplitMix64, Steele, Lea and Flood 2014, OOPSLA), whose sequence is specified, with the JDK's
     * default Gaussian method since Java 17 (McFarland's ziggurat), so a seed gives the same p-value run
     * after run. Standard error of the
     * estimate: sqrt(p(1-p)/draws).
     */
    public static double weightedChiSquareUpperTail(double x, double[] weights, long seed, int draws) {
        SplittableRandom random = new SplittableRandom(seed);
        int reached = 0;
        for (int d = 0; d < draws; d++) {
            double sum = 0.0;
            for (double w : weights) {
                double z = random.nextGaussian();
                sum += w * z * z;
            }
            if (sum >= x) {
                reached++;
            }
        }
        return reached / (double) draws;
    }
}
