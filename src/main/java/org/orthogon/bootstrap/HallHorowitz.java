package org.orthogon.bootstrap;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * The corrections of Hall and Horowitz (1996, "Bootstrap critical values for tests based on
 * generalized-method-of-moments estimators", Econometrica 64, section 3) that make the bootstrap t and
 * J statistics, computed with the sample's own formulas, share the first-order distribution of the
 * sample statistics.
 *
 * <p>Why they are needed: a resample is built from independent blocks, so its long-run covariance is Σ̃
 * (the covariance of a block sum over L), while the sample's kernel estimator, applied to a resample,
 * estimates S̃ (the kernel's weights on the within-block autocovariances; {@link
 * BlockResampler#worldCovariances}). When Σ̃ ≠ S̃ the bootstrap statistics are studentised by the
 * wrong variance. With D the sample Jacobian at θ̂, W̃ the limit of the bootstrap weight (S̃^{-1} for the
 * efficient estimators, the sample's fixed weight for one-step), H = (D'W̃D)^{-1}:
 * <ul>
 *   <li>t statistics: V̂ = the covariance the bootstrap's own formula estimates ((D'S̃^{-1}D)^{-1}, or the
 *       sandwich H D'W̃ S̃ W̃ D H for one-step), Ṽ = H D'W̃ Σ̃ W̃ D H the covariance of √T(θ* - θ̂) in the
 *       bootstrap world, and t̃* = τ t* with τ_p = (V̂_pp / Ṽ_pp)^{1/2};</li>
 *   <li>J: with R = W̃^{1/2}, the projection P = R D H D' R and Ω = R Σ̃ R, R√T g*(θ*) has the limit
 *       covariance C = (I - P) Ω (I - P) of rank K - P instead of I - P. J̃* = T |N W*^{1/2} g*(θ*)|² with
 *       N = C^{+1/2} + P (the pseudo-inverse square root over the K - P non-zero eigenvalues; P keeps the
 *       vanishing component in place) is chi-square(K - P) in the limit, as J is;</li>
 *   <li>the joint pricing-error test g' V_g^+ g: with A = I - D H D'W̃ the estimated limit covariance of
 *       √T g* is A S̃ A' and the true one A Σ̃ A'. With Q = (A S̃ A')^{+1/2} and Π the projection on its
 *       range, the corrected statistic is |N_g y|², y = V*^{+1/2} √T g* from the replication's own
 *       covariance estimate V*, N_g = (Q A Σ̃ A' Q)^{+1/2} + I - Π.</li>
 * </ul>
 * When Σ̃ = S̃ (blocks of one row, or a kernel that is the block's own Bartlett window) every correction
 * is the identity. Hall and Horowitz derive these factors for non-overlapping blocks and a truncated
 * kernel on moments uncorrelated beyond a known lag; here the same matrices are formed for moving and
 * circular blocks and any kernel, with S̃ computed without prewhitening at the sample's bandwidth.
 *
 * @param tScale    τ, one factor per parameter
 * @param jMap      N of the J statistic (K x K), null when K = P or the estimator is one-step
 * @param jointMap  N_g of the joint pricing-error test (K x K), null when K = P
 * @param rank      K - P
 */
public record HallHorowitz(double[] tScale, DMatrixRMaj jMap, DMatrixRMaj jointMap, int rank) {

    public HallHorowitz {
        tScale = tScale.clone();
        jMap = jMap == null ? null : jMap.copy();
        jointMap = jointMap == null ? null : jointMap.copy();
    }

    @Override
    public double[] tScale() {
        return tScale.clone();
    }

    /** No correction: τ = 1, N = I (blocks of one row). */
    public static HallHorowitz identity(int moments, int parameters) {
        double[] ones = new double[parameters];
        java.util.Arrays.fill(ones, 1.0);
        return new HallHorowitz(ones, null, null, moments - parameters);
    }

    /**
     * The corrections for a bootstrap world with long-run covariances Σ̃ ({@code blockCovariance}) and
     * S̃ ({@code kernelCovariance}).
     *
     * @param jacobian    D at θ̂ (K x P)
     * @param fixedWeight the one-step estimator's weight, or null for the efficient estimators
     */
    public static HallHorowitz of(DMatrixRMaj jacobian, DMatrixRMaj fixedWeight, DMatrixRMaj blockCovariance,
            DMatrixRMaj kernelCovariance) {
        int k = jacobian.numRows;
        int p = jacobian.numCols;
        boolean efficient = fixedWeight == null;
        DMatrixRMaj weight = efficient ? symmetricPower(kernelCovariance, k, -1.0) : fixedWeight.copy();
        DMatrixRMaj wd = mult(weight, jacobian);
        DMatrixRMaj h = new DMatrixRMaj(p, p);
        CommonOps_DDRM.multTransA(jacobian, wd, h);
        if (!CommonOps_DDRM.invert(h)) {
            throw new IllegalArgumentException("D'WD is singular in the bootstrap world");
        }
        // M = H D'W (P x K): √T(θ* - θ̂) ≈ -M √T g*(θ̂)
        DMatrixRMaj m = new DMatrixRMaj(p, k);
        CommonOps_DDRM.multTransB(h, wd, m);
        DMatrixRMaj trueCovariance = sandwich(m, blockCovariance);
        DMatrixRMaj estimated = efficient ? h : sandwich(m, kernelCovariance);
        double[] scale = new double[p];
        for (int i = 0; i < p; i++) {
            scale[i] = Math.sqrt(estimated.get(i, i) / trueCovariance.get(i, i));
        }
        int rank = k - p;
        if (rank == 0) {
            return new HallHorowitz(scale, null, null, 0);
        }
        // A = I - D M
        DMatrixRMaj a = CommonOps_DDRM.identity(k);
        DMatrixRMaj dm = mult(jacobian, m);
        CommonOps_DDRM.subtractEquals(a, dm);
        DMatrixRMaj jMap = null;
        if (efficient) {
            DMatrixRMaj root = symmetricPower(kernelCovariance, k, -0.5);
            DMatrixRMaj rd = mult(root, jacobian);
            DMatrixRMaj projection = mult(mult(rd, h), transpose(rd));
            DMatrixRMaj complement = CommonOps_DDRM.identity(k);
            CommonOps_DDRM.subtractEquals(complement, projection);
            DMatrixRMaj omega = mult(mult(root, blockCovariance), root);
            DMatrixRMaj c = mult(mult(complement, omega), complement);
            jMap = symmetricPower(c, rank, -0.5);
            CommonOps_DDRM.addEquals(jMap, projection);
        }
        DMatrixRMaj estimatedErrors = mult(mult(a, kernelCovariance), transpose(a));
        DMatrixRMaj q = symmetricPower(estimatedErrors, rank, -0.5);
        DMatrixRMaj range = symmetricPower(estimatedErrors, rank, 0.0);
        DMatrixRMaj trueErrors = mult(mult(a, blockCovariance), transpose(a));
        DMatrixRMaj jointMap = symmetricPower(mult(mult(q, trueErrors), q), rank, -0.5);
        DMatrixRMaj outside = CommonOps_DDRM.identity(k);
        CommonOps_DDRM.subtractEquals(outside, range);
        CommonOps_DDRM.addEquals(jointMap, outside);
        return new HallHorowitz(scale, jMap, jointMap, rank);
    }

    /** J̃* = T |N W*^{1/2} g*|² (J* itself when there is no correction). */
    public double overidentification(DMatrixRMaj meanMoments, DMatrixRMaj weight, int observations) {
        DMatrixRMaj root = symmetricPower(weight, weight.numRows, 0.5);
        DMatrixRMaj y = mult(root, meanMoments);
        if (jMap != null) {
            y = mult(jMap, y);
        }
        return observations * CommonOps_DDRM.dot(y, y);
    }

    /**
     * The corrected joint pricing-error statistic |N_g V*^{+1/2} √T g*|², V* = T Var(g*) the replication's
     * own estimate (rank K - P).
     */
    public double jointPricing(DMatrixRMaj meanMoments, DMatrixRMaj errorCovariance, int observations) {
        DMatrixRMaj scaled = errorCovariance.copy();
        CommonOps_DDRM.scale(observations, scaled);
        DMatrixRMaj y = mult(symmetricPower(scaled, rank, -0.5), meanMoments);
        CommonOps_DDRM.scale(Math.sqrt(observations), y);
        if (jointMap != null) {
            y = mult(jointMap, y);
        }
        return CommonOps_DDRM.dot(y, y);
    }

    /**
     * Σ_i λ_i^power v_i v_i' over the {@code rank} largest eigenvalues of the symmetric matrix (power 0:
     * the projection on their eigenvectors). IllegalArgumentException when one of them is not positive.
     */
    static DMatrixRMaj symmetricPower(DMatrixRMaj symmetric, int rank, double power) {
        int k = symmetric.numRows;
        EigenDecomposition_F64<DMatrixRMaj> eigen = DecompositionFactory_DDRM.eig(k, true, true);
        if (!eigen.decompose(symmetric.copy())) {
            throw new IllegalArgumentException("eigen-decomposition failed");
        }
        Integer[] order = new Integer[k];
        for (int i = 0; i < k; i++) {
            order[i] = i;
        }
        java.util.Arrays.sort(order, (x, y) -> Double.compare(eigen.getEigenvalue(y).real,
                eigen.getEigenvalue(x).real));
        DMatrixRMaj out = new DMatrixRMaj(k, k);
        for (int r = 0; r < rank; r++) {
            double lambda = eigen.getEigenvalue(order[r]).real;
            if (!(lambda > 0.0)) {
                throw new IllegalArgumentException("a matrix of the bootstrap correction is not positive definite "
                        + "on its range");
            }
            double factor = power == 0.0 ? 1.0 : Math.pow(lambda, power);
            DMatrixRMaj v = eigen.getEigenVector(order[r]);
            double norm = CommonOps_DDRM.dot(v, v);
            for (int i = 0; i < k; i++) {
                for (int j = 0; j < k; j++) {
                    out.data[i * k + j] += factor * v.data[i] * v.data[j] / norm;
                }
            }
        }
        return out;
    }

    private static DMatrixRMaj sandwich(DMatrixRMaj m, DMatrixRMaj middle) {
        return mult(mult(m, middle), transpose(m));
    }

    private static DMatrixRMaj mult(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numRows, b.numCols);
        CommonOps_DDRM.mult(a, b, out);
        return out;
    }

    private static DMatrixRMaj transpose(DMatrixRMaj a) {
        DMatrixRMaj out = new DMatrixRMaj(a.numCols, a.numRows);
        CommonOps_DDRM.transpose(a, out);
        return out;
    }
}
