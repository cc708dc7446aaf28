package org.orthogon.gmm;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;
import org.ejml.interfaces.linsol.LinearSolverDense;

/** Linear-algebra building blocks of the estimators, over EJML. Inputs are never modified. */
final class Matrices {
    /** A symmetric matrix with a reciprocal condition number below this is treated as singular. */
    static final double SINGULAR_RCOND = 1e-13;

    private Matrices() {
    }

    /** A' B A for A (n x m) and B (n x n). */
    static DMatrixRMaj quadraticForm(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj ba = new DMatrixRMaj(b.numRows, a.numCols);
        CommonOps_DDRM.mult(b, a, ba);
        DMatrixRMaj result = new DMatrixRMaj(a.numCols, a.numCols);
        CommonOps_DDRM.multTransA(a, ba, result);
        return symmetrize(result);
    }

    /** x' B x for a column x. */
    static double quadraticValue(DMatrixRMaj x, DMatrixRMaj b) {
        int n = x.getNumElements();
        double sum = 0.0;
        for (int i = 0; i < n; i++) {
            double row = 0.0;
            for (int j = 0; j < n; j++) {
                row += b.unsafe_get(i, j) * x.data[j];
            }
            sum += x.data[i] * row;
        }
        return sum;
    }

    /** (A + A')/2, in place, returned for chaining; removes rounding asymmetry. */
    static DMatrixRMaj symmetrize(DMatrixRMaj a) {
        int n = a.numRows;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                double mean = 0.5 * (a.unsafe_get(i, j) + a.unsafe_get(j, i));
                a.unsafe_set(i, j, mean);
                a.unsafe_set(j, i, mean);
            }
        }
        return a;
    }

    /** Reciprocal condition number σ_min/σ_max of a square matrix, from its singular values. */
    static double reciprocalCondition(DMatrixRMaj a) {
        SingularValueDecomposition_F64<DMatrixRMaj> svd = DecompositionFactory_DDRM.svd(a.numRows, a.numCols,
                false, false, true);
        if (!svd.decompose(a.copy())) {
            return 0.0;
        }
        double max = 0.0;
        double min = Double.POSITIVE_INFINITY;
        for (double value : svd.getSingularValues()) {
            max = Math.max(max, value);
            min = Math.min(min, value);
        }
        return max == 0.0 ? 0.0 : min / max;
    }

    /**
     * Inverse of a symmetric positive-definite matrix by Cholesky; refuses a numerically singular one
     * with a message naming it, because a silently regularised inverse would fake precision.
     */
    static DMatrixRMaj invertSymmetric(DMatrixRMaj a, String what) {
        double rcond = reciprocalCondition(a);
        if (!(rcond > SINGULAR_RCOND)) {
            throw new SingularMatrixException(what, rcond);
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(a.numRows);
        DMatrixRMaj copy = a.copy();
        DMatrixRMaj inverse = new DMatrixRMaj(a.numRows, a.numRows);
        if (!solver.setA(copy)) {
            throw new SingularMatrixException(what + " (not positive definite)", rcond);
        }
        solver.invert(inverse);
        return symmetrize(inverse);
    }

    /** Lower-triangular L with L L' = A, for a symmetric positive-definite A. */
    static DMatrixRMaj choleskyLower(DMatrixRMaj a, String what) {
        CholeskyDecomposition_F64<DMatrixRMaj> cholesky = DecompositionFactory_DDRM.chol(a.numRows, true);
        if (!cholesky.decompose(a.copy())) {
            throw new SingularMatrixException(what + " (not positive definite)", reciprocalCondition(a));
        }
        return cholesky.getT(null);
    }

    /** Thrown when a matrix that must be inverted is numerically singular. */
    static final class SingularMatrixException extends RuntimeException {
        private static final long serialVersionUID = 1L;
        final String what;
        final double reciprocalCondition;

        SingularMatrixException(String what, double reciprocalCondition) {
            super(what + " is numerically singular (reciprocal condition number " + reciprocalCondition + ")");
            this.what = what;
            this.reciprocalCondition = reciprocalCondition;
        }
    }
}
