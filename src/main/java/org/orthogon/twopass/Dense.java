package org.orthogon.twopass;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.orthogon.gmm.EstimationException;

/** The few dense-matrix steps the two-pass regressions need, over EJML. Inputs are never modified. */
final class Dense {
    /** A symmetric matrix whose scaled reciprocal condition falls below this is treated as singular. */
    private static final double SINGULAR_RCOND = 1e-13;

    private Dense() {
    }

    static DMatrixRMaj of(double[][] rows) {
        return new DMatrixRMaj(rows);
    }

    /** The column means of a T x n matrix, as an n x 1 column. */
    static DMatrixRMaj columnMeans(DMatrixRMaj x) {
        DMatrixRMaj mean = new DMatrixRMaj(x.numCols, 1);
        for (int t = 0; t < x.numRows; t++) {
            for (int j = 0; j < x.numCols; j++) {
                mean.data[j] += x.unsafe_get(t, j);
            }
        }
        CommonOps_DDRM.divide(mean, x.numRows);
        return mean;
    }

    /** x minus its column means. */
    static DMatrixRMaj demeaned(DMatrixRMaj x) {
        DMatrixRMaj mean = columnMeans(x);
        DMatrixRMaj out = x.copy();
        for (int t = 0; t < x.numRows; t++) {
            for (int j = 0; j < x.numCols; j++) {
                out.unsafe_set(t, j, x.unsafe_get(t, j) - mean.data[j]);
            }
        }
        return out;
    }

    /** (1/T) X'X of a T x n matrix whose columns are already demeaned: the covariance with divisor T. */
    static DMatrixRMaj crossProduct(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numCols, b.numCols);
        CommonOps_DDRM.multTransA(a, b, out);
        CommonOps_DDRM.divide(out, a.numRows);
        return out;
    }

    static DMatrixRMaj multiply(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numRows, b.numCols);
        CommonOps_DDRM.mult(a, b, out);
        return out;
    }

    static DMatrixRMaj multiplyTransA(DMatrixRMaj a, DMatrixRMaj b) {
        DMatrixRMaj out = new DMatrixRMaj(a.numCols, b.numCols);
        CommonOps_DDRM.multTransA(a, b, out);
        return out;
    }

    /** a' B a for a column a. */
    static double quadratic(DMatrixRMaj a, DMatrixRMaj b) {
        return CommonOps_DDRM.dot(a, multiply(b, a));
    }

    /**
     * The inverse of a symmetric positive-definite matrix by Cholesky, after scaling it to a unit diagonal
     * so that the singularity check does not depend on units.
     *
     * @throws EstimationException naming {@code what} when the matrix is singular or not positive definite
     */
    static DMatrixRMaj inverseSymmetric(DMatrixRMaj a, String what) {
        int n = a.numRows;
        double[] scale = new double[n];
        for (int i = 0; i < n; i++) {
            double d = a.get(i, i);
            if (!(d > 0.0) || !Double.isFinite(d)) {
                throw singular(what, 0.0);
            }
            scale[i] = 1.0 / Math.sqrt(d);
        }
        DMatrixRMaj scaled = new DMatrixRMaj(n, n);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                scaled.set(i, j, a.get(i, j) * scale[i] * scale[j]);
            }
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.symmPosDef(n);
        if (!solver.setA(scaled)) {
            throw singular(what, 0.0);
        }
        double quality = solver.quality();
        if (!(quality > SINGULAR_RCOND)) {
            throw singular(what, quality);
        }
        DMatrixRMaj inverse = new DMatrixRMaj(n, n);
        solver.invert(inverse);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                inverse.set(i, j, inverse.get(i, j) * scale[i] * scale[j]);
            }
        }
        return symmetrize(inverse);
    }

    static DMatrixRMaj symmetrize(DMatrixRMaj a) {
        for (int i = 0; i < a.numRows; i++) {
            for (int j = i + 1; j < a.numCols; j++) {
                double mean = 0.5 * (a.get(i, j) + a.get(j, i));
                a.set(i, j, mean);
                a.set(j, i, mean);
            }
        }
        return a;
    }

    private static EstimationException singular(String what, double quality) {
        return new EstimationException(what + " is singular or not positive definite",
                List.of("quality of its Cholesky factor " + quality),
                "drop test assets or factors that are (nearly) linear combinations of others, or use a longer sample");
    }

    /** The diagonal square roots of a covariance matrix. */
    static double[] standardErrors(DMatrixRMaj covariance) {
        double[] out = new double[covariance.numRows];
        for (int i = 0; i < out.length; i++) {
            out[i] = Math.sqrt(Math.max(covariance.get(i, i), 0.0));
        }
        return out;
    }

    static double[] column(DMatrixRMaj a) {
        return a.data.clone();
    }
}
