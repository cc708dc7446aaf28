package org.orthogon.gmm;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.decomposition.CholeskyDecomposition_F64;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
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
     * Reciprocal condition number of a symmetric matrix after scaling it to a unit diagonal,
     * C = Λ^{-1/2} A Λ^{-1/2} with Λ = diag(A). The scaling removes the units of the moments (or
     * parameters) from the measure, so a moment expressed in percent instead of decimals does not look
     * nearer to singular (van der Sluis 1969, Numerische Mathematik 14: this scaling is within a factor
     * n of the best diagonal one for Cholesky). A non-positive diagonal entry gives 0.
     */
    static double scaledReciprocalCondition(DMatrixRMaj a) {
        double[] scale = unitDiagonalScale(a);
        return scale == null ? 0.0 : symmetricReciprocalCondition(scaled(a, scale));
    }

    /**
     * σ_min/σ_max of a symmetric matrix from its eigenvalues (|λ| are its singular values), about half
     * the work of a singular value decomposition.
     */
    static double symmetricReciprocalCondition(DMatrixRMaj a) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(a.numRows, false, true);
        if (!eig.decompose(a.copy())) {
            return 0.0;
        }
        double max = 0.0;
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < a.numRows; i++) {
            double value = Math.abs(eig.getEigenvalue(i).real);
            max = Math.max(max, value);
            min = Math.min(min, value);
        }
        return max == 0.0 ? 0.0 : min / max;
    }

    /**
     * Inverse of a symmetric positive-definite matrix by Cholesky of its unit-diagonal scaling
     * C = Λ^{-1/2} A Λ^{-1/2}, A^{-1} = Λ^{-1/2} C^{-1} Λ^{-1/2}; refuses a numerically singular one
     * (scaled reciprocal condition number at most {@link #SINGULAR_RCOND}) with a message naming it,
     * because a silently regularised inverse would fake precision. The test uses the scaled condition
     * number so that rescaling a moment by a constant never changes the verdict.
     *
     * <p>The condition number is needed only near the threshold, so it is first bounded from the
     * inverse itself: λ_max(C) ≤ ||C||_∞ and 1/λ_min(C) = λ_max(C^{-1}) ≤ trace(C^{-1}), hence
     * rcond(C) ≥ 1/(||C||_∞ trace(C^{-1})) (Golub and Van Loan 2013, "Matrix Computations", sections
     * 2.3 and 8.1). When that bound clears the threshold by a factor 100, which leaves room for the
     * rounding in C^{-1}, the matrix is accepted without an eigen-decomposition; otherwise the exact
     * value decides, as it always did.
     */
    static DMatrixRMaj invertSymmetric(DMatrixRMaj a, String what) {
        double[] scale = unitDiagonalScale(a);
        if (scale == null) {
            throw new SingularMatrixException(what + " (a diagonal entry is not positive)", 0.0);
        }
        DMatrixRMaj c = scaled(a, scale);
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(a.numRows);
        DMatrixRMaj inverse = new DMatrixRMaj(a.numRows, a.numRows);
        boolean factored = solver.setA(c.copy());
        if (factored) {
            solver.invert(inverse);
        }
        if (!factored || !(conditionLowerBound(c, inverse) > 100.0 * SINGULAR_RCOND)) {
            double rcond = symmetricReciprocalCondition(c);
            if (!(rcond > SINGULAR_RCOND)) {
                throw new SingularMatrixException(what, rcond);
            }
            if (!factored) {
                throw new SingularMatrixException(what + " (not positive definite)", rcond);
            }
        }
        scaleInPlace(inverse, scale);
        return symmetrize(inverse);
    }

    /** diag(scale) A diag(scale), in place. */
    private static void scaleInPlace(DMatrixRMaj a, double[] scale) {
        int n = a.numCols;
        double[] data = a.data;
        for (int i = 0; i < a.numRows; i++) {
            for (int j = 0; j < n; j++) {
                data[i * n + j] = scale[i] * data[i * n + j] * scale[j];
            }
        }
    }

    /** 1/(||C||_∞ trace(C^{-1})), a lower bound on λ_min/λ_max of a symmetric positive-definite C; 0 if not finite. */
    private static double conditionLowerBound(DMatrixRMaj c, DMatrixRMaj inverse) {
        int n = c.numRows;
        double rowSum = 0.0;
        double trace = 0.0;
        for (int i = 0; i < n; i++) {
            double sum = 0.0;
            for (int j = 0; j < n; j++) {
                sum += Math.abs(c.unsafe_get(i, j));
            }
            rowSum = Math.max(rowSum, sum);
            trace += inverse.unsafe_get(i, i);
        }
        double bound = 1.0 / (rowSum * trace);
        return Double.isFinite(bound) && trace > 0.0 ? bound : 0.0;
    }

    /** 1/sqrt(a_ii) for each i, or null when a diagonal entry is not a positive finite number. */
    private static double[] unitDiagonalScale(DMatrixRMaj a) {
        double[] scale = new double[a.numRows];
        for (int i = 0; i < a.numRows; i++) {
            double d = a.unsafe_get(i, i);
            if (!(d > 0.0) || !Double.isFinite(d)) {
                return null;
            }
            scale[i] = 1.0 / Math.sqrt(d);
        }
        return scale;
    }

    /** diag(scale) A diag(scale), a new matrix. */
    private static DMatrixRMaj scaled(DMatrixRMaj a, double[] scale) {
        DMatrixRMaj out = new DMatrixRMaj(a.numRows, a.numCols);
        for (int i = 0; i < a.numRows; i++) {
            for (int j = 0; j < a.numCols; j++) {
                out.unsafe_set(i, j, scale[i] * a.unsafe_get(i, j) * scale[j]);
            }
        }
        return out;
    }

    /**
     * x solving A x = b for a square A by LU with partial pivoting on the equilibrated matrix
     * Ã = diag(r) A diag(c), rows then columns scaled to unit largest magnitude (as LAPACK's dgeequ), so
     * that the units of moments and parameters neither trigger a false "singular" nor cost accuracy;
     * x = diag(c) Ã^{-1} diag(r) b. Refuses an Ã whose reciprocal condition number is below
     * {@link #SINGULAR_RCOND}.
     */
    static DMatrixRMaj solveSquare(DMatrixRMaj a, DMatrixRMaj b, String what) {
        int n = a.numRows;
        double[] rows = new double[n];
        double[] cols = new double[n];
        DMatrixRMaj e = equilibrated(a, rows, cols);
        if (e == null) {
            throw new SingularMatrixException(what + " (a zero row or column)", 0.0);
        }
        double rcond = reciprocalCondition(e);
        if (!(rcond > SINGULAR_RCOND)) {
            throw new SingularMatrixException(what, rcond);
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.lu(n);
        if (!solver.setA(e.copy())) {
            throw new SingularMatrixException(what, rcond);
        }
        DMatrixRMaj rhs = b.copy();
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < rhs.numCols; j++) {
                rhs.unsafe_set(i, j, rows[i] * rhs.unsafe_get(i, j));
            }
        }
        DMatrixRMaj x = new DMatrixRMaj(n, b.numCols);
        solver.solve(rhs, x);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < x.numCols; j++) {
                x.unsafe_set(i, j, cols[i] * x.unsafe_get(i, j));
            }
        }
        return x;
    }

    /** Reciprocal condition number of A after row and column equilibration (see {@link #solveSquare}). */
    static double equilibratedReciprocalCondition(DMatrixRMaj a) {
        DMatrixRMaj e = equilibrated(a, new double[a.numRows], new double[a.numCols]);
        return e == null ? 0.0 : reciprocalCondition(e);
    }

    /** diag(rows) A diag(cols) with unit largest magnitude per row, then per column; null for a zero row or column. */
    private static DMatrixRMaj equilibrated(DMatrixRMaj a, double[] rows, double[] cols) {
        DMatrixRMaj e = a.copy();
        for (int i = 0; i < a.numRows; i++) {
            double max = 0.0;
            for (int j = 0; j < a.numCols; j++) {
                max = Math.max(max, Math.abs(e.unsafe_get(i, j)));
            }
            if (!(max > 0.0) || !Double.isFinite(max)) {
                return null;
            }
            rows[i] = 1.0 / max;
            for (int j = 0; j < a.numCols; j++) {
                e.unsafe_set(i, j, e.unsafe_get(i, j) * rows[i]);
            }
        }
        for (int j = 0; j < a.numCols; j++) {
            double max = 0.0;
            for (int i = 0; i < a.numRows; i++) {
                max = Math.max(max, Math.abs(e.unsafe_get(i, j)));
            }
            if (!(max > 0.0)) {
                return null;
            }
            cols[j] = 1.0 / max;
            for (int i = 0; i < a.numRows; i++) {
                e.unsafe_set(i, j, e.unsafe_get(i, j) * cols[j]);
            }
        }
        return e;
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
