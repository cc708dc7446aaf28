package org.orthogon.robust;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunDerivative;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentAlgebra;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.RowJacobians;

/**
 * Weak-identification-robust statistics of a hypothesised parameter value θ, pure functions of the moments:
 * <ul>
 *   <li>the S statistic of Stock and Wright (2000, "GMM with weak identification", Econometrica 68,
 *       1055-1096): S(θ) = T g(θ)' Ŝ(θ)^{-1} g(θ), Ŝ(θ) the long-run covariance of f_t(θ) estimated at θ with
 *       the run's own kernel, bandwidth rule (an automatic bandwidth re-selected at θ), prewhitening,
 *       centering and small-sample factor. At the true θ it is χ²_K in the limit whether or not θ is
 *       identified;</li>
 *   <li>the K statistic of Kleibergen (2005, "Testing parameters in GMM without assuming that they are
 *       identified", Econometrica 73, 1103-1123): with D̃_j = q̄_j - V̂_{q_j f} Ŝ^{-1} g the Jacobian column
 *       made uncorrelated with g (q_t = ∂f_t/∂θ_j, q̄_j its mean, V̂_{q_j f} the cross long-run covariance by
 *       {@link LongRunDerivative} at the bandwidth selected for Ŝ),
 *       K(θ) = T g'Ŝ^{-1}D̃ (D̃'Ŝ^{-1}D̃)^{-1} D̃'Ŝ^{-1}g, χ²_P in the limit at the true θ. Because
 *       ∂S/∂θ_j = 2T D̃_j'Ŝ^{-1}g when the bandwidth is held fixed, K is a score statistic of S: it is zero
 *       wherever S is flat, at its minimum but also at a maximum or an inflection point.</li>
 * </ul>
 * For one parameter θ_i tested with the others α set to their S-minimising values (the concentrated sets),
 * the nuisance directions are partialled out of the score a = D̃'Ŝ^{-1}g with M = D̃'Ŝ^{-1}D̃:
 * K_i = T (a_i - M_{iα}M_{αα}^{-1}a_α)² [M^{-1}]_{ii}, χ²_1 in the limit when α is well identified
 * (Kleibergen 2005, section 3; from memory). At an exact minimum over α, a_α = 0 and K_i = T a_i² [M^{-1}]_{ii}.
 */
public final class RobustStatistics {
    /** Scaled reciprocal condition number of Ŝ(θ) below which S(θ) is reported as not defined. */
    static final double SINGULAR_RCOND = 1e-12;

    private RobustStatistics() {
    }

    /**
     * S and K at one θ, or {@link #undefined(String)} where they cannot be computed (the SDF is not defined
     * there, a moment is not finite, or Ŝ(θ) is numerically singular).
     *
     * @param s       S(θ)
     * @param k       K(θ) for all P parameters jointly (NaN when not asked for)
     * @param score   a = D̃'Ŝ^{-1}g (P values; empty when K was not asked for)
     * @param info    M = D̃'Ŝ^{-1}D̃ (P x P; null when K was not asked for)
     * @param problem why the point is not defined, or null
     */
    public record Point(double s, double k, double[] score, DMatrixRMaj info, int observations, String problem) {
        public Point {
            score = score.clone();
            info = info == null ? null : info.copy();
        }

        public boolean defined() {
            return problem == null;
        }

        @Override
        public double[] score() {
            return score.clone();
        }

        /**
         * K for parameter i alone with the others partialled out: T (a_i - M_{iα}M_{αα}^{-1}a_α)² [M^{-1}]_{ii};
         * for P = 1 it is K itself. NaN when M is singular or K was not computed.
         */
        public double kFor(int i) {
            if (!defined() || info == null) {
                return Double.NaN;
            }
            int p = score.length;
            if (p == 1) {
                return k;
            }
            DMatrixRMaj inverse = new DMatrixRMaj(p, p);
            if (!CommonOps_DDRM.invert(info.copy(), inverse)) {
                return Double.NaN;
            }
            // a_i - M_{iα}M_{αα}^{-1}a_α = [M^{-1}a]_i / [M^{-1}]_{ii} (partitioned inverse).
            double adjusted = 0.0;
            for (int j = 0; j < p; j++) {
                adjusted += inverse.get(i, j) * score[j];
            }
            double mii = inverse.get(i, i);
            if (!(mii > 0)) {
                return Double.NaN;
            }
            adjusted /= mii;
            return observations * adjusted * adjusted * mii;
        }
    }

    /** A point where the statistics are not defined, with the reason. */
    static Point undefined(String problem) {
        return new Point(Double.NaN, Double.NaN, new double[0], null, 0, problem);
    }

    /** S(θ) alone (cheaper: no derivatives). */
    public static Point s(MomentModel model, double[] theta, LongRunOptions options, boolean smallSample) {
        return evaluate(model, theta, options, smallSample, false);
    }

    /** S(θ) and K(θ). */
    public static Point sAndK(MomentModel model, double[] theta, LongRunOptions options, boolean smallSample) {
        return evaluate(model, theta, options, smallSample, true);
    }

    private static Point evaluate(MomentModel model, double[] theta, LongRunOptions options, boolean smallSample,
            boolean withK) {
        DMatrixRMaj f;
        try {
            f = model.contributions(theta);
        } catch (IllegalArgumentException e) {
            return undefined(e.getMessage());
        }
        for (double v : f.data) {
            if (!Double.isFinite(v)) {
                return undefined("a moment is not finite at this value");
            }
        }
        int t = f.numRows;
        int k = f.numCols;
        int p = theta.length;
        LongRunEstimate estimate;
        try {
            estimate = LongRunCovariance.estimate(f, options);
        } catch (IllegalArgumentException e) {
            return undefined("the long-run covariance cannot be estimated here: " + e.getMessage());
        }
        DMatrixRMaj s = estimate.covariance();
        double factor = smallSample ? LongRunCovariance.smallSampleFactor(t, p) : 1.0;
        CommonOps_DDRM.scale(factor, s);
        if (scaledReciprocalCondition(s) < SINGULAR_RCOND) {
            return undefined("the long-run covariance of the moments is numerically singular here");
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.chol(k);
        if (!solver.setA(s.copy())) {
            return undefined("the long-run covariance of the moments is not positive definite here");
        }
        DMatrixRMaj g = MomentAlgebra.columnMeans(f);
        DMatrixRMaj sInvG = new DMatrixRMaj(k, 1);
        solver.solve(g, sInvG);
        double statistic = t * CommonOps_DDRM.dot(g, sInvG);
        if (!withK) {
            return new Point(statistic, Double.NaN, new double[0], null, t, null);
        }
        DMatrixRMaj rows;
        try {
            rows = RowJacobians.of(model, theta);
        } catch (IllegalArgumentException e) {
            return undefined(e.getMessage());
        }
        LongRunDerivative at;
        try {
            at = LongRunDerivative.at(f, options, estimate.bandwidth());
        } catch (IllegalArgumentException e) {
            return undefined("the long-run covariance cannot be estimated here: " + e.getMessage());
        }
        DMatrixRMaj tilde = new DMatrixRMaj(k, p);
        DMatrixRMaj projected = new DMatrixRMaj(k, 1);
        for (int j = 0; j < p; j++) {
            DMatrixRMaj q = RowJacobians.parameter(rows, k, p, j);
            DMatrixRMaj cross = at.crossCovariance(q);
            CommonOps_DDRM.scale(factor, cross);
            CommonOps_DDRM.mult(cross, sInvG, projected);
            DMatrixRMaj mean = MomentAlgebra.columnMeans(q);
            for (int i = 0; i < k; i++) {
                tilde.set(i, j, mean.get(i) - projected.get(i));
            }
        }
        DMatrixRMaj sInvTilde = new DMatrixRMaj(k, p);
        solver.solve(tilde, sInvTilde);
        DMatrixRMaj info = new DMatrixRMaj(p, p);
        CommonOps_DDRM.multTransA(tilde, sInvTilde, info);
        DMatrixRMaj score = new DMatrixRMaj(p, 1);
        CommonOps_DDRM.multTransA(sInvTilde, g, score);
        DMatrixRMaj inverse = new DMatrixRMaj(p, p);
        double kStatistic = Double.NaN;
        if (CommonOps_DDRM.invert(info.copy(), inverse)) {
            DMatrixRMaj solved = new DMatrixRMaj(p, 1);
            CommonOps_DDRM.mult(inverse, score, solved);
            kStatistic = t * CommonOps_DDRM.dot(score, solved);
        }
        return new Point(statistic, kStatistic, score.data, info, t, null);
    }

    /** σ_min/σ_max-type reciprocal condition of S after scaling it to a unit diagonal. */
    static double scaledReciprocalCondition(DMatrixRMaj s) {
        int k = s.numRows;
        DMatrixRMaj scaled = new DMatrixRMaj(k, k);
        for (int i = 0; i < k; i++) {
            double di = s.get(i, i);
            if (!(di > 0)) {
                return 0.0;
            }
            for (int j = 0; j < k; j++) {
                double dj = s.get(j, j);
                scaled.set(i, j, s.get(i, j) / Math.sqrt(di * dj));
            }
        }
        var eig = org.ejml.dense.row.factory.DecompositionFactory_DDRM.eig(k, false, true);
        if (!eig.decompose(scaled)) {
            return 0.0;
        }
        double min = Double.POSITIVE_INFINITY;
        double max = 0.0;
        for (int i = 0; i < k; i++) {
            double v = eig.getEigenvalue(i).real;
            min = Math.min(min, v);
            max = Math.max(max, v);
        }
        return max > 0 ? min / max : 0.0;
    }
}
